/**
 * Plain cosine of two spectra on unit m/z bins (intensities summed per bin,
 * no weighting): the near-duplicate check of the importer, not the search score.
 * @returns 0..1; 0 when either spectrum has no intensity.
 */
export function unitCosine(a: readonly (readonly [number, number])[], b: readonly (readonly [number, number])[]): number {
  const binsA = bin(a);
  const binsB = bin(b);
  let dot = 0;
  for (const [mz, ia] of binsA) {
    const ib = binsB.get(mz);
    if (ib !== undefined) dot += ia * ib;
  }
  const na = norm(binsA);
  const nb = norm(binsB);
  return na === 0 || nb === 0 ? 0 : Math.min(1, dot / (na * nb));
}

function bin(peaks: readonly (readonly [number, number])[]): Map<number, number> {
  const m = new Map<number, number>();
  for (const [mz, i] of peaks) {
    if (!(i > 0)) continue;
    const k = Math.round(mz);
    m.set(k, (m.get(k) ?? 0) + i);
  }
  return m;
}

function norm(m: Map<number, number>): number {
  let s = 0;
  for (const v of m.values()) s += v * v;
  return Math.sqrt(s);
}
