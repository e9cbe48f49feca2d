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

/**
 * What the entropy preprocessing of Li et al. 2021 derives from a spectrum's
 * intensities (entries from..to-1): their sum, and when the spectrum's
 * entropy is below 3 the exponent `pow` and the sum of the raised intensities
 * `sumW` (pow 0: no reweighting; sum 0: every weight is 0). A peak's weight is
 * then entropyWeightAt(intensity, params), as entropyWeightsInto writes it.
 */
export interface EntropyParams {
  sum: number;
  pow: number;
  sumW: number;
}

let scratch = new Float64Array(256);

export function entropyParams(intensities: ArrayLike<number>, from = 0, to = intensities.length): EntropyParams {
  const n = to - from;
  let sum = 0;
  for (let i = from; i < to; i++) sum += intensities[i];
  if (!(sum > 0)) return { sum: 0, pow: 0, sumW: 0 };
  if (scratch.length < n) scratch = new Float64Array(Math.max(n, 2 * scratch.length));
  // The first n entries of a reused buffer (no allocation per spectrum).
  const p = scratch;
  for (let i = 0; i < n; i++) p[i] = intensities[from + i] / sum;
  const s = spectralEntropy(p, n);
  if (!(s < 3)) return { sum, pow: 0, sumW: 0 };
  const pow = 0.25 + 0.25 * s;
  let sumW = 0;
  for (let i = 0; i < n; i++) sumW += p[i] ** pow;
  return { sum, pow, sumW };
}

/** One peak's entropy weight from its intensity and its spectrum's entropyParams (the parts as numbers, for hot loops). */
export function entropyWeightAt(intensity: number, sum: number, pow: number, sumW: number): number {
  if (!(sum > 0)) return 0;
  const p = intensity / sum;
  return pow > 0 ? p ** pow / sumW : p;
}

/**
 * The entropy preprocessing of Li et al. 2021 (Nat. Methods 18:1524): scale
 * intensities to sum 1; if the spectrum's entropy S is below 3, raise each
 * intensity to w = 0.25 + 0.25 * S and scale to sum 1 again. No m/z weighting.
 * Writes into `out` (may be the same array as `intensities`).
 */
export function entropyWeightsInto(intensities: ArrayLike<number>, out: { [i: number]: number; length: number }): void {
  const { sum, pow, sumW } = entropyParams(intensities);
  for (let i = 0, n = intensities.length; i < n; i++) out[i] = entropyWeightAt(intensities[i], sum, pow, sumW);
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
