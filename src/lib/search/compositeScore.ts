import { sharedPeaks } from './sharedPeaks';
import type { Peak } from './types';

/**
 * The composite score of Stein & Scott 1994 (J. Am. Soc. Mass Spectrom. 5:859),
 * on weighted spectra (m/z^a * I^b):
 *
 *   F_D = (sum_shared wU*wL)^2 / (sum_U wU^2 * sum_L wL^2)   (their dot product, a squared cosine)
 *   F_R = 1/(N_UL - 1) * sum over adjacent shared pairs i-1, i (in m/z order) of
 *         r_i^n, r_i = (wL_i / wL_(i-1)) * (wU_(i-1) / wU_i), n = +1 if r_i <= 1 else -1
 *   composite = (N_U * F_D + N_UL * F_R) / (N_U + N_UL)
 *
 * with N_U the unknown's peak count and N_UL the shared peak count. When fewer
 * than two peaks are shared F_R is undefined and composite = F_D.
 *
 * Departure from the printed paper: it averages the ratio terms over N_UL,
 * although only N_UL - 1 adjacent pairs exist, so identical spectra would
 * score below 1. We average over the N_UL - 1 pairs, so F_R <= 1 and
 * identical spectra score exactly 1.
 */
export function compositeScore(query: readonly Peak[], library: readonly Peak[]): number {
  const parts = compositeParts(query, library);
  return parts.composite;
}

export function compositeParts(
  query: readonly Peak[],
  library: readonly Peak[],
): { fD: number; fR: number | null; nU: number; nUL: number; composite: number } {
  let qq = 0;
  let nU = 0;
  for (const p of query) {
    if (p[1] > 0) nU++;
    qq += p[1] * p[1];
  }
  let ll = 0;
  for (const p of library) ll += p[1] * p[1];
  const shared = sharedPeaks(query, library);
  const nUL = shared.length;
  if (!(qq > 0) || !(ll > 0) || nUL === 0) return { fD: 0, fR: null, nU, nUL, composite: 0 };
  let dot = 0;
  for (const s of shared) dot += s.a * s.b;
  const fD = Math.min(1, (dot * dot) / (qq * ll));
  if (nUL < 2) return { fD, fR: null, nU, nUL, composite: fD };
  let sum = 0;
  for (let i = 1; i < nUL; i++) {
    const r = (shared[i].b / shared[i - 1].b) * (shared[i - 1].a / shared[i].a);
    sum += r <= 1 ? r : 1 / r;
  }
  const fR = sum / (nUL - 1);
  return { fD, fR, nU, nUL, composite: Math.min(1, (nU * fD + nUL * fR) / (nU + nUL)) };
}
