import type { Peak } from './types';

export interface NormalizePeaksForHashOptions {
  /**
   * Decimal places kept of the intensity relative to the base peak (base peak = 1).
   * @default 3
   */
  decimals?: number;
}

/**
 * The canonical form of a spectrum for its content hash: m/z rounded to the
 * nearest integer (unit bins) with the intensities in a bin added, scaled so
 * that the base peak is 1, rounded to `decimals` places; bins that round to
 * zero are dropped. The same spectrum written by another program (scaled to
 * 999 or 100, reordered, with fractional m/z) gives the same list.
 * @param peaks - [m/z, intensity] pairs; non-positive intensities are ignored.
 * @param options - precision.
 * @returns [integer m/z, relative intensity] pairs, m/z ascending.
 */
export function normalizePeaksForHash(peaks: Peak[], options: NormalizePeaksForHashOptions = {}): Peak[] {
  const { decimals = 3 } = options;
  if (!Number.isInteger(decimals) || decimals < 0 || decimals > 12) {
    throw new RangeError('decimals must be an integer from 0 to 12');
  }
  if (!Array.isArray(peaks)) throw new RangeError('peaks must be an array of [mz, intensity]');
  const bins = new Map<number, number>();
  for (const [mz, intensity] of peaks) {
    if (!Number.isFinite(mz) || !Number.isFinite(intensity)) {
      throw new RangeError('peaks must hold finite numbers');
    }
    if (intensity <= 0) continue;
    const bin = Math.round(mz);
    bins.set(bin, (bins.get(bin) ?? 0) + intensity);
  }
  let base = 0;
  for (const value of bins.values()) if (value > base) base = value;
  if (base === 0) return [];
  const scale = 10 ** decimals;
  const result: Peak[] = [];
  for (const [bin, value] of [...bins.entries()].sort((a, b) => a[0] - b[0])) {
    const relative = Math.round((value / base) * scale) / scale;
    if (relative > 0) result.push([bin, relative]);
  }
  return result;
}
