import { evaluateClusterStart } from './evaluateClusterStart';
import type { HalogenFit, Peak } from './types';
import { toUnitSpectrum, type UnitSpectrum } from './toUnitSpectrum';

export interface FindIsotopeClustersOptions {
  /**
   * Peaks below this relative intensity (base peak = 100) are ignored.
   * @default 0.5
   */
  minRelative?: number;
  /**
   * Largest halogen fit (residual sum of squares) accepted for an isotope cluster.
   * @default 0.02
   */
  maxFit?: number;
  /**
   * Report clusters with at least this many members (1 reports every lone peak).
   * @default 2
   */
  minMembers?: number;
  /**
   * Largest number of Cl + Br atoms considered.
   * @default 6
   */
  maxHalogens?: number;
}

export interface IsotopeCluster {
  /** nominal m/z of the lightest member */
  mz: number;
  /** nominal m/z and relative intensity (base peak = 100) of each member */
  members: Array<{ mz: number; relative: number }>;
  /** estimated Cl and Br atoms with the fit */
  halogens: HalogenFit & { alternatives: HalogenFit[] };
}

/**
 * Splits a spectrum into isotope clusters. Peaks closer than 3 u form runs; each
 * run is read from the top down, and a cluster starts at the lowest m/z whose
 * peaks above it are all explainable as its isotope peaks (see
 * `evaluateClusterStart`). Clusters are returned from the highest m/z down.
 * @param peaks - the spectrum (`[mz, intensity]`) or a unit spectrum
 * @param options - see {@link FindIsotopeClustersOptions}
 */
export function findIsotopeClusters(
  peaks: readonly Peak[] | UnitSpectrum,
  options: FindIsotopeClustersOptions = {},
): IsotopeCluster[] {
  const { minRelative = 0.5, maxFit = 0.02, minMembers = 2, maxHalogens = 6 } = options;
  if (!(minRelative >= 0 && minRelative < 100)) throw new RangeError('minRelative must be >= 0 and < 100');
  if (!Number.isInteger(minMembers) || minMembers < 1) throw new RangeError('minMembers must be an integer >= 1');
  const unit = Array.isArray(peaks) ? toUnitSpectrum(peaks as Peak[]) : (peaks as UnitSpectrum);
  const significant = unit.masses.filter((mz) => (unit.intensities.get(mz) ?? 0) >= minRelative);

  // runs of peaks no more than 2 u apart
  const runs: number[][] = [];
  for (const mz of significant) {
    const run = runs.at(-1);
    if (run && mz - run.at(-1)! <= 2) run.push(mz);
    else runs.push([mz]);
  }

  const clusters: IsotopeCluster[] = [];
  for (const run of runs.reverse()) {
    let remaining = [...run];
    let upperLimit = Infinity;
    while (remaining.length > 0) {
      const top = remaining.at(-1)!;
      let chosen = evaluateClusterStart(unit, top, { minRelative, maxFit, upperLimit, maxHalogens });
      for (const mz of remaining) {
        if (mz >= top || top - mz > 2 * maxHalogens) continue;
        const evaluation = evaluateClusterStart(unit, mz, { minRelative, maxFit, upperLimit, maxHalogens });
        if (evaluation.acceptable) {
          chosen = evaluation;
          break; // remaining is ascending: the first acceptable is the lowest
        }
      }
      if (chosen.halogens && chosen.members.length >= minMembers) {
        const { Cl, Br, fit, alternatives } = chosen.halogens;
        clusters.push({ mz: chosen.mz, members: chosen.members, halogens: { Cl, Br, fit, alternatives } });
      }
      upperLimit = chosen.mz;
      remaining = remaining.filter((mz) => mz < chosen.mz);
    }
  }
  return clusters;
}
