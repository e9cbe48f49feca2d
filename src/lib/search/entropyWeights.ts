import type { Peak } from './types';

/** Shannon entropy (natural log) of intensities that sum to 1 (the first `n` of them). */
export function spectralEntropy(probabilities: ArrayLike<number>, n = probabilities.length): number {
  let s = 0;
  for (let i = 0; i < n; i++) {
    const p = probabilities[i];
    if (p > 0) s -= p * Math.log(p);
  }
  return s;
}

let scratch = new Float64Array(256);

/**
 * The entropy preprocessing of Li et al. 2021 (Nat. Methods 18:1524): scale
 * intensities to sum 1; if the spectrum's entropy S is below 3, raise each
 * intensity to w = 0.25 + 0.25 * S and scale to sum 1 again. No m/z weighting.
 * Writes into `out` (may be the same array as `intensities`).
 */
export function entropyWeightsInto(intensities: ArrayLike<number>, out: { [i: number]: number; length: number }): void {
  const n = intensities.length;
  let sum = 0;
  for (let i = 0; i < n; i++) sum += intensities[i];
  if (!(sum > 0)) {
    for (let i = 0; i < n; i++) out[i] = 0;
    return;
  }
  if (scratch.length < n) scratch = new Float64Array(Math.max(n, 2 * scratch.length));
  // The first n entries of a reused buffer (no allocation per spectrum on the search path).
  const p = scratch;
  for (let i = 0; i < n; i++) p[i] = intensities[i] / sum;
  const s = spectralEntropy(p, n);
  if (s < 3) {
    const w = 0.25 + 0.25 * s;
    let sumW = 0;
    for (let i = 0; i < n; i++) {
      p[i] = p[i] ** w;
      sumW += p[i];
    }
    for (let i = 0; i < n; i++) p[i] /= sumW;
  }
  for (let i = 0; i < n; i++) out[i] = p[i];
}

/** Peak-list form of entropyWeightsInto: returns [mz, weighted intensity] summing to 1. */
export function entropyWeights(peaks: readonly Peak[]): Peak[] {
  const out = new Float64Array(peaks.length);
  entropyWeightsInto(
    peaks.map((p) => p[1]),
    out,
  );
  return peaks.map((p, i) => [p[0], out[i]]);
}
