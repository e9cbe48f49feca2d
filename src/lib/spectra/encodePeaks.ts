import type { Peak } from './types';

/**
 * Layout of a packed peak list (little endian throughout):
 *
 * | offset | size | content |
 * | --- | --- | --- |
 * | 0 | 4 | magic "IPK1" (ASCII) |
 * | 4 | 4 | n, the number of peaks (uint32) |
 * | 8 | 8 n | m/z, Float64 each |
 * | 8 + 8 n | 4 n | intensity, Float32 each |
 *
 * m/z is Float64 so that accurate-mass values keep their digits; intensity
 * is Float32 (about 7 significant digits, more than any detector gives).
 */
export const PACKED_PEAKS_MAGIC = 'IPK1';

/**
 * Pack peaks into a Buffer for a database BLOB (layout in PACKED_PEAKS_MAGIC's comment).
 * @param peaks - [m/z, intensity] pairs, finite numbers.
 * @returns the packed bytes.
 */
export function encodePeaks(peaks: Peak[]): Buffer {
  if (!Array.isArray(peaks)) throw new RangeError('peaks must be an array of [mz, intensity]');
  const n = peaks.length;
  const buffer = Buffer.alloc(8 + 12 * n);
  buffer.write(PACKED_PEAKS_MAGIC, 0, 'ascii');
  buffer.writeUInt32LE(n, 4);
  for (let i = 0; i < n; i++) {
    const peak = peaks[i];
    if (!Array.isArray(peak) || !Number.isFinite(peak[0]) || !Number.isFinite(peak[1])) {
      throw new RangeError(`peaks[${i}] must be [mz, intensity] with finite numbers`);
    }
    if (Math.abs(peak[1]) > 3.4e38) throw new RangeError(`peaks[${i}] intensity does not fit in a Float32`);
    buffer.writeDoubleLE(peak[0], 8 + 8 * i);
    buffer.writeFloatLE(peak[1], 8 + 8 * n + 4 * i);
  }
  return buffer;
}
