import { IsotopicDistribution } from 'isotopic-distribution';

import { nominalMass, type Peak } from '@/lib/chem';

/**
 * The unit-resolution isotope cluster of a formula computed by isotopic-distribution
 * (npm, an independent reference), placed at nominal masses from the formula's
 * nominal mass, scaled so that the cluster maximum is `height`.
 */
export function referenceCluster(mf: string, height = 100, minRelative = 0.01): Peak[] {
  const peaks = new IsotopicDistribution(mf, { fwhm: 0.3 }).getPeaks({ maxValue: height }) as Array<{
    x: number;
    y: number;
  }>;
  const first = Math.min(...peaks.map((p) => p.x));
  const nominal = nominalMass(mf);
  const sums = new Map<number, number>();
  for (const p of peaks) {
    const mz = nominal + Math.round(p.x - first);
    sums.set(mz, (sums.get(mz) ?? 0) + p.y);
  }
  return [...sums.entries()]
    .filter(([, y]) => y >= (minRelative / 100) * height)
    .sort((a, b) => a[0] - b[0]);
}

function merge(...parts: Peak[][]): Peak[] {
  const sums = new Map<number, number>();
  for (const part of parts) for (const [mz, y] of part) sums.set(mz, (sums.get(mz) ?? 0) + y);
  return [...sums.entries()].sort((a, b) => a[0] - b[0]);
}

/**
 * Toluene: main EI peaks from memory (91 base, 92 about 60 %, 65, 39, ...), the M
 * cluster from isotopic-distribution. For tests only, not library data.
 */
export const toluene: Peak[] = merge(
  referenceCluster('C7H8', 60),
  referenceCluster('C7H7', 100).filter(([mz]) => mz === 91),
  [[89, 4], [90, 2], [65, 12], [63, 5], [51, 5], [39, 15], [27, 3]],
);

/** Chlorobenzene: M cluster (base) from isotopic-distribution, 77 and 51 from memory. */
export const chlorobenzene: Peak[] = merge(referenceCluster('C6H5Cl', 100), [[77, 55], [51, 15], [50, 8]]);

/**
 * Chloroform: weak M cluster (CHCl3) and the CHCl2+ base cluster from
 * isotopic-distribution, CCl+ at 47 from memory.
 */
export const chloroform: Peak[] = merge(
  referenceCluster('CHCl3', 12),
  referenceCluster('CHCl2', 100),
  referenceCluster('CCl', 30),
);

/** Bromobenzene: M cluster (base) from isotopic-distribution, 77, 51, 50 from memory. */
export const bromobenzene: Peak[] = merge(referenceCluster('C6H5Br', 100), [[77, 60], [51, 25], [50, 12]]);

/** Pyridine: M cluster (base) from isotopic-distribution, 52 (M - HCN) and 51 from memory. */
export const pyridine: Peak[] = merge(referenceCluster('C5H5N', 100), [[52, 60], [51, 30], [50, 15], [78, 5]]);
