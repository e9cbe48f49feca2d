// Unit-mass bins of two spectra on a common scale (base peak = 100 each), for
// the head-to-tail overlay and the difference view.

export type PeakPair = [number, number];

/** Sum intensities into unit-mass bins (nearest integer m/z), base peak = 100. */
export function unitBins(peaks: readonly PeakPair[]): Map<number, number> {
  const bins = new Map<number, number>();
  for (const [mz, intensity] of peaks) {
    if (!(intensity > 0) || !Number.isFinite(mz)) continue;
    const key = Math.round(mz);
    bins.set(key, (bins.get(key) ?? 0) + intensity);
  }
  const max = Math.max(0, ...bins.values());
  if (max > 0) for (const [k, v] of bins) bins.set(k, (v / max) * 100);
  return bins;
}

export interface PairedBins {
  /** every bin present in either spectrum, ascending */
  mz: number[];
  query: number[];
  reference: number[];
  /** query minus reference, per bin */
  difference: number[];
}

/** The union of both spectra's bins with each side's relative intensity (0 where absent). */
export function pairBins(query: readonly PeakPair[], reference: readonly PeakPair[]): PairedBins {
  const q = unitBins(query);
  const r = unitBins(reference);
  const mz = [...new Set([...q.keys(), ...r.keys()])].sort((a, b) => a - b);
  const qs = mz.map((m) => q.get(m) ?? 0);
  const rs = mz.map((m) => r.get(m) ?? 0);
  return { mz, query: qs, reference: rs, difference: qs.map((v, i) => v - rs[i]) };
}

/** The `n` most intense bins, by intensity, for labels. */
export function topPeaks(mz: readonly number[], intensity: readonly number[], n: number): number[] {
  return mz
    .map((m, i) => [m, intensity[i]] as const)
    .filter(([, y]) => y > 0)
    .sort((a, b) => b[1] - a[1])
    .slice(0, n)
    .map(([m]) => m);
}
