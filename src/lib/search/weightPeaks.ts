import type { Peak, PeakWeights } from './types';

export const DEFAULT_WEIGHTS: Readonly<PeakWeights> = Object.freeze({ mz: 3, intensity: 0.6 });

export function checkWeights(weights: PeakWeights): void {
  if (!weights || typeof weights !== 'object') throw new RangeError('weights must be { mz, intensity }');
  if (!Number.isFinite(weights.mz) || weights.mz < 0 || weights.mz > 6) throw new RangeError('weights.mz must be a number in [0, 6]');
  if (!Number.isFinite(weights.intensity) || weights.intensity <= 0 || weights.intensity > 3) {
    throw new RangeError('weights.intensity must be a number in (0, 3]');
  }
}

/**
 * Weight each peak as m/z^a * I^b (defaults a = 3, b = 0.6, the values
 * usually cited from Stein & Scott 1994), returning [mz, weight].
 */
export function weightPeaks(peaks: readonly Peak[], weights: PeakWeights = DEFAULT_WEIGHTS): Peak[] {
  checkWeights(weights);
  return peaks.map(([mz, intensity]) => [mz, mz ** weights.mz * intensity ** weights.intensity]);
}
