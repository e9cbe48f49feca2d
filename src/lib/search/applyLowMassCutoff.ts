import type { Peak } from './types';

export function checkLowMassCutoff(cutoff: number): void {
  if (!Number.isFinite(cutoff) || cutoff < 0 || cutoff > 5000) {
    throw new RangeError('lowMassCutoff must be a number in [0, 5000]');
  }
}

/** Drop peaks with m/z below `cutoff`. `undefined` or 0 keeps everything. */
export function applyLowMassCutoff(peaks: readonly Peak[], cutoff?: number): Peak[] {
  if (cutoff === undefined || cutoff === 0) return peaks.slice();
  checkLowMassCutoff(cutoff);
  return peaks.filter((p) => p[0] >= cutoff);
}
