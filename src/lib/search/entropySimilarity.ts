import { entropyWeights, spectralEntropy } from './entropyWeights';
import type { Peak } from './types';

/**
 * Spectral entropy similarity of Li et al. 2021 (Nat. Methods 18:1524), on
 * binned, unweighted spectra (its own preprocessing, see entropyWeights; no
 * m/z weighting):
 *
 *   similarity = 1 - (2 * S_AB - S_A - S_B) / ln 4
 *
 * with S the Shannon entropy (natural log) and AB the merged spectrum
 * (A + B) / 2 of the two sum-normalized, entropy-weighted spectra. 0..1.
 */
export function entropySimilarity(a: readonly Peak[], b: readonly Peak[]): number {
  const wa = entropyWeights(a.filter((p) => p[1] > 0));
  const wb = entropyWeights(b.filter((p) => p[1] > 0));
  if (wa.length === 0 || wb.length === 0) return 0;
  const merged = new Map<number, number>();
  for (const [mz, i] of wa) merged.set(mz, (merged.get(mz) ?? 0) + i / 2);
  for (const [mz, i] of wb) merged.set(mz, (merged.get(mz) ?? 0) + i / 2);
  const sA = spectralEntropy(wa.map((p) => p[1]));
  const sB = spectralEntropy(wb.map((p) => p[1]));
  const sAB = spectralEntropy([...merged.values()]);
  const sim = 1 - (2 * sAB - sA - sB) / Math.log(4);
  return Math.min(1, Math.max(0, sim));
}

/**
 * The same similarity as a sum over shared peaks only (Li & Fiehn 2023, the
 * form that lets an index compute it from the shared peaks):
 *   similarity = sum_shared [ (a+b) ln(a+b) - a ln a - b ln b ] / ln 4
 * `a`, `b` are entropy-weighted intensities summing to 1 per spectrum.
 */
export function entropySharedTerm(a: number, b: number): number {
  return (a + b) * Math.log(a + b) - a * Math.log(a) - b * Math.log(b);
}
