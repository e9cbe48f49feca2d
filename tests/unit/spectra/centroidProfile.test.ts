import { describe, expect, it } from 'vitest';

import { centroidProfile } from '@/lib/spectra/index';

describe('centroidProfile', () => {
  const x = Array.from({ length: 41 }, (_, i) => 100 + i * 0.05);

  it('finds a Gaussian peak at its centre with its summed intensity', () => {
    const y = x.map((v) => 1000 * Math.exp(-(((v - 101) / 0.1) ** 2)));
    const peaks = centroidProfile({ x, y });
    expect(peaks).toHaveLength(1);
    expect(peaks[0][0]).toBeCloseTo(101, 6);
    expect(peaks[0][1]).toBeCloseTo(y.reduce((a, b) => a + b, 0), 6);
  });

  it('separates two peaks at their common minimum and drops noise below the threshold', () => {
    const y = x.map((v) => 1000 * Math.exp(-(((v - 100.5) / 0.08) ** 2)) + 400 * Math.exp(-(((v - 101.2) / 0.08) ** 2)));
    y[39] += 0.5; // a noise spike, 0.05 % of the highest point
    const peaks = centroidProfile({ x, y });
    expect(peaks.map(([mz]) => Number(mz.toFixed(2)))).toEqual([100.5, 101.2]);
  });

  it('finds a maximum on the first point', () => {
    expect(centroidProfile({ x: [1, 1.1, 1.2], y: [10, 5, 0] })[0]).toEqual([expect.closeTo(1 + 0.1 / 3, 9), 15]);
  });

  it('checks its options', () => {
    expect(() => centroidProfile({ x, y: x }, { minRelativeHeight: 1 })).toThrow(RangeError);
  });
});
