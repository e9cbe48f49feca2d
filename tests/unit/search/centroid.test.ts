import { describe, expect, it } from 'vitest';
import { centroid } from '../../../src/lib/search/centroid';

describe('centroid', () => {
  it('leaves centroided unit-mass data as it is, sorted', () => {
    expect(centroid([[43, 100], [41, 20], [57, 5]])).toEqual([[41, 20], [43, 100], [57, 5]]);
  });
  it('turns a profile run into one peak at the weighted mean m/z with the apex height', () => {
    const out = centroid([[49.9, 10], [50, 30], [50.1, 10], [60, 5]]);
    expect(out).toHaveLength(2);
    expect(out[0][0]).toBeCloseTo((49.9 * 10 + 50 * 30 + 50.1 * 10) / 50, 12);
    expect(out[0][1]).toBe(30);
    expect(out[1]).toEqual([60, 5]);
  });
  it('rejects a bad maxGap', () => {
    expect(() => centroid([], { maxGap: -1 })).toThrow(RangeError);
  });
});

describe('centroid on centroided data', () => {
  it('leaves repeated m/z values for binning to sum', () => {
    expect(centroid([[43, 1], [43, 2], [57, 1]])).toEqual([[43, 1], [43, 2], [57, 1]]);
  });
});
