import { binOf } from './binPeaks';
import type { Peak } from './types';

/** Air (N2, O2, Ar, CO2), water and column-bleed (siloxane) ions. */
export const AIR_WATER_BLEED_IONS: readonly number[] = Object.freeze([18, 28, 32, 40, 44, 207, 281]);

export function checkExcludeIons(ions: readonly number[]): void {
  if (!Array.isArray(ions)) throw new RangeError('excludeIons must be an array of m/z values');
  for (const ion of ions) {
    if (typeof ion !== 'number' || !Number.isFinite(ion) || ion <= 0 || ion > 5000) {
      throw new RangeError('excludeIons must hold m/z values in (0, 5000]');
    }
  }
}

/**
 * Drop the bins of the listed ions. Works on binned peaks: a peak is dropped
 * when it falls into the same bin (at `tolerance`) as one of the ions.
 */
export function excludeIons(peaks: readonly Peak[], ions: readonly number[] = [], tolerance = 1): Peak[] {
  checkExcludeIons(ions);
  if (ions.length === 0) return peaks.slice();
  const excluded = new Set(ions.map((ion) => binOf(ion, tolerance)));
  return peaks.filter((p) => !excluded.has(binOf(p[0], tolerance)));
}
