import type { Peak } from './types';

/** Scale intensities so that the base (largest) peak is 1. An empty list stays empty. */
export function normalizeToBase(peaks: readonly Peak[]): Peak[] {
  let base = 0;
  for (const p of peaks) if (p[1] > base) base = p[1];
  if (!(base > 0)) return [];
  return peaks.map(([mz, intensity]) => [mz, intensity / base]);
}
