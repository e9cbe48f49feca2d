import { describe, expect, it } from 'vitest';
import { buildSegment, segmentBytes } from '../../../src/lib/search/segment';

describe('buildSegment', () => {
  it('orders docs by record id, keeps postings sorted by doc, lives in shared memory', () => {
    const seg = buildSegment(
      { count: 3, offsets: [0, 2, 3, 5], bins: [41, 43, 43, 41, 57], rel: Float32Array.from([1, 0.5, 1, 0.2, 1]), recordIds: [9, 2, 5], spectrumIds: [1, 2, 3] },
      1,
      { mz: 3, intensity: 0.6 },
    );
    expect(Array.from(seg.recordId)).toEqual([2, 5, 9]);
    const b = 43;
    expect(Array.from(seg.pDoc.subarray(seg.pStart[b], seg.pStart[b + 1]))).toEqual([0, 2]);
    expect(seg.pW.buffer).toBeInstanceOf(SharedArrayBuffer);
    expect(seg.live.buffer).toBeInstanceOf(SharedArrayBuffer);
    expect(segmentBytes(seg)).toBeGreaterThan(0);
  });
});
