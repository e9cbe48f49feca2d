import type { Peak } from '../../src/lib/search/types';

/** The packed layout of encodePeaks, without its checks, so NaN and Infinity can be stored too. */
export function packUnchecked(peaks: readonly Peak[]): Buffer {
  const n = peaks.length;
  const b = Buffer.alloc(8 + 12 * n);
  b.write('IPK1', 0, 'ascii');
  b.writeUInt32LE(n, 4);
  peaks.forEach(([mz, y], i) => {
    b.writeDoubleLE(mz, 8 + 8 * i);
    b.writeFloatLE(y, 8 + 8 * n + 4 * i);
  });
  return b;
}
