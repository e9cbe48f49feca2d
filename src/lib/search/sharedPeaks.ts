import type { Peak } from './types';

/** Pairs of intensities at the m/z values present in both lists (binned input), in m/z order. */
export function sharedPeaks(a: readonly Peak[], b: readonly Peak[]): { mz: number; a: number; b: number }[] {
  const bByMz = new Map<number, number>();
  for (const [mz, intensity] of b) bByMz.set(mz, (bByMz.get(mz) ?? 0) + intensity);
  const out: { mz: number; a: number; b: number }[] = [];
  const seen = new Set<number>();
  for (const [mz, intensity] of a) {
    if (seen.has(mz)) continue;
    seen.add(mz);
    const other = bByMz.get(mz);
    if (other !== undefined && other > 0 && intensity > 0) out.push({ mz, a: intensity, b: other });
  }
  return out.sort((x, y) => x.mz - y.mz);
}
