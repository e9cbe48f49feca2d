import { sharedPeaks } from './sharedPeaks';
import type { Peak } from './types';

/**
 * Reverse cosine for mixtures: the cosine over the library spectrum's peaks
 * only; the unknown's peaks that the library spectrum lacks are ignored.
 *   rev = sum_shared(wU * wL) / ( sqrt(sum_shared wU^2) * sqrt(sum_L wL^2) )
 * 0..1; 0 when nothing is shared.
 */
export function reverseCosineScore(query: readonly Peak[], library: readonly Peak[]): number {
  let ll = 0;
  for (const p of library) ll += p[1] * p[1];
  if (!(ll > 0)) return 0;
  let dot = 0;
  let qq = 0;
  for (const s of sharedPeaks(query, library)) {
    dot += s.a * s.b;
    qq += s.a * s.a;
  }
  if (!(qq > 0)) return 0;
  return Math.min(1, dot / Math.sqrt(qq * ll));
}
