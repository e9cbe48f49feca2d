import { describe, expect, it } from 'vitest';

import { decodePeaks, encodePeaks } from '@/lib/spectra/index';

describe('encodePeaks / decodePeaks', () => {
  const peaks: [number, number][] = [[39.0234, 120], [77.03913, 250.5], [78.04695, 999], [1234.5678901234, 0.125]];

  it('packs 8 + 12 n bytes and reads back Float64 m/z and Float32 intensities', () => {
    const buffer = encodePeaks(peaks);
    expect(buffer.length).toBe(8 + 12 * peaks.length);
    expect(buffer.subarray(0, 4).toString('ascii')).toBe('IPK1');
    expect(buffer.readUInt32LE(4)).toBe(peaks.length);
    const back = decodePeaks(buffer);
    back.forEach(([mz, intensity], i) => {
      expect(mz).toBe(peaks[i][0]);
      expect(intensity).toBe(Math.fround(peaks[i][1]));
    });
  });

  it('decodes a Buffer at an unaligned offset of a larger one', () => {
    const packed = encodePeaks(peaks);
    const pool = Buffer.alloc(packed.length + 3);
    packed.copy(pool, 3);
    const unaligned = pool.subarray(3);
    expect(unaligned.byteOffset % 8).not.toBe(0);
    expect(decodePeaks(unaligned)).toEqual(decodePeaks(packed));
  });

  it('packs an empty list', () => {
    expect(decodePeaks(encodePeaks([]))).toEqual([]);
  });

  it('rejects bad input', () => {
    expect(() => encodePeaks([[Number.NaN, 1]])).toThrow(RangeError);
    expect(() => encodePeaks([[1, 1e39]])).toThrow(RangeError);
    expect(() => decodePeaks(Buffer.from('nope nope'))).toThrow(/unknown format/);
    expect(() => decodePeaks(encodePeaks(peaks).subarray(0, 20))).toThrow(/do not hold/);
  });
});
