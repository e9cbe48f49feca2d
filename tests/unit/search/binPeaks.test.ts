import { describe, expect, it } from 'vitest';
import { binOf, binPeaks } from '../../../src/lib/search/binPeaks';

describe('binPeaks', () => {
  it('rounds to the nearest integer at unit mass and sums a bin', () => {
    expect(binPeaks([[43.018, 10], [42.98, 5], [57.4, 1], [57.6, 2]])).toEqual([[43, 15], [57, 1], [58, 2]]);
  });
  it('uses a configurable tolerance for accurate-mass data', () => {
    expect(binPeaks([[43.018, 10], [43.054, 5]], { tolerance: 0.01 })).toEqual([[43.02, 10], [43.050000000000004, 5]]);
    expect(binOf(43.054, 0.01)).toBe(4305);
  });
  it('rejects a bad tolerance', () => {
    expect(() => binPeaks([], { tolerance: 0 })).toThrow(/tolerance/);
  });
});
