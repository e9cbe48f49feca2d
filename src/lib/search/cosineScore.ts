import { sharedPeaks } from './sharedPeaks';
import type { Peak } from './types';

/**
 * Cosine of two weighted spectra (binned, weighted peaks, see weightPeaks):
 *   cos = sum_shared(wU * wL) / ( sqrt(sum_U wU^2) * sqrt(sum_L wL^2) )
 * 0..1; 0 when either is empty or nothing is shared.
 */
export function cosineScore(query: readonly Peak[], library: readonly Peak[]): number {
  let qq = 0;
  for (const p of query) qq += p[1] * p[1];
  let ll = 0;
  for (const p of library) ll += p[1] * p[1];
  if (!(qq > 0) || !(ll > 0)) return 0;
  let dot = 0;
  for (const s of sharedPeaks(query, library)) dot += s.a * s.b;
  return Math.min(1, dot / Math.sqrt(qq * ll));
}
