import { PACKED_PEAKS_MAGIC } from './encodePeaks';
import type { Peak } from './types';

/**
 * Unpack peaks written by encodePeaks. The bytes are copied first: a Buffer
 * from the database driver may sit at an unaligned offset of a larger pool,
 * where a Float64Array view is not allowed.
 * @param buffer - the packed bytes (Buffer or Uint8Array).
 * @returns [m/z, intensity] pairs.
 */
export function decodePeaks(buffer: Uint8Array): Peak[] {
  if (!(buffer instanceof Uint8Array)) throw new RangeError('buffer must be a Buffer or Uint8Array');
  if (buffer.length < 8) throw new RangeError('packed peaks: fewer than 8 bytes');
  const bytes = new Uint8Array(buffer.length);
  bytes.set(buffer);
  const view = new DataView(bytes.buffer);
  const magic = String.fromCharCode(bytes[0], bytes[1], bytes[2], bytes[3]);
  if (magic !== PACKED_PEAKS_MAGIC) throw new RangeError(`packed peaks: unknown format "${magic}"`);
  const n = view.getUint32(4, true);
  if (bytes.length !== 8 + 12 * n) {
    throw new RangeError(`packed peaks: ${bytes.length} bytes do not hold ${n} peaks`);
  }
  const mz = new Float64Array(bytes.buffer, 8, n);
  const intensity = new Float32Array(bytes.buffer, 8 + 8 * n, n);
  const peaks: Peak[] = new Array(n);
  for (let i = 0; i < n; i++) peaks[i] = [mz[i], intensity[i]];
  return peaks;
}
