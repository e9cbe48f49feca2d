import type { Peak } from './types';

/** Largest m/z accepted for unit-mass work. */
export const MAX_UNIT_MZ = 100_000;

export interface UnitSpectrum {
  /** relative intensity (base peak = 100) per nominal m/z */
  intensities: Map<number, number>;
  /** nominal m/z values present, ascending */
  masses: number[];
  /** intensity-weighted mean of the input m/z values merged into each nominal m/z */
  exactMz: Map<number, number>;
}

/**
 * Checks a peak list and merges it to unit mass (summing intensities of peaks
 * that round to the same integer m/z), scaled to base peak = 100.
 * @param peaks - `[mz, intensity]` pairs on any intensity scale
 * @throws {RangeError} for an empty list, a non-positive or non-finite m/z, a
 *   negative or non-finite intensity, or all intensities zero
 */
export function toUnitSpectrum(peaks: readonly Peak[]): UnitSpectrum {
  if (!Array.isArray(peaks) || peaks.length === 0) throw new RangeError('peaks must be a non-empty array');
  const sums = new Map<number, number>();
  const weighted = new Map<number, number>();
  for (const [index, peak] of peaks.entries()) {
    if (!Array.isArray(peak) || peak.length < 2) throw new RangeError(`peaks[${index}] must be [mz, intensity]`);
    const [mz, intensity] = peak;
    if (typeof mz !== 'number' || !Number.isFinite(mz) || mz <= 0) {
      throw new RangeError(`peaks[${index}]: m/z must be a positive number, got ${String(mz)}`);
    }
    // Beyond any mass spectrometer's range: a damaged number, and unit-mass
    // arrays over it would exhaust memory.
    if (mz > MAX_UNIT_MZ) {
      throw new RangeError(`peaks[${index}]: m/z ${mz} is above ${MAX_UNIT_MZ}`);
    }
    if (typeof intensity !== 'number' || !Number.isFinite(intensity) || intensity < 0) {
      throw new RangeError(`peaks[${index}]: intensity must be a number >= 0, got ${String(intensity)}`);
    }
    const nominal = Math.round(mz);
    sums.set(nominal, (sums.get(nominal) ?? 0) + intensity);
    weighted.set(nominal, (weighted.get(nominal) ?? 0) + intensity * mz);
  }
  const max = Math.max(...sums.values());
  if (!(max > 0)) throw new RangeError('peaks must have at least one intensity above zero');
  const intensities = new Map<number, number>();
  const exactMz = new Map<number, number>();
  for (const [nominal, sum] of sums) {
    if (sum === 0) continue;
    intensities.set(nominal, (sum / max) * 100);
    exactMz.set(nominal, weighted.get(nominal)! / sum);
  }
  const masses = [...intensities.keys()].sort((a, b) => a - b);
  return { intensities, masses, exactMz };
}
