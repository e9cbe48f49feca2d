import type { Peak } from './types';

export function checkNoiseFloor(noiseFloor: number): void {
  if (!Number.isFinite(noiseFloor) || noiseFloor < 0 || noiseFloor >= 1) {
    throw new RangeError('noiseFloor must be a number in [0, 1)');
  }
}

/**
 * Drop peaks below `noiseFloor` times the base peak. Expects intensities
 * normalized to the base peak (see normalizeToBase). 0 keeps everything.
 */
export function applyNoiseFloor(peaks: readonly Peak[], noiseFloor = 0): Peak[] {
  checkNoiseFloor(noiseFloor);
  if (noiseFloor === 0) return peaks.slice();
  return peaks.filter((p) => p[1] >= noiseFloor);
}
