import { describe, expect, it } from 'vitest';
import { pairBins, topPeaks, unitBins } from '../../../../src/components/identify/spectrumBins';

describe('unitBins', () => {
  it('sums into nominal m/z bins and scales the base peak to 100', () => {
    const b = unitBins([[91.05, 50], [90.95, 50], [92.1, 40], [65, 0]]);
    expect([...b.entries()]).toEqual([[91, 100], [92, 40]]);
  });
});

describe('pairBins', () => {
  it('pairs both spectra on the union of their bins, each on its own base-peak scale', () => {
    const p = pairBins([[91, 1000], [92, 500]], [[91, 10], [65, 2]]);
    expect(p.mz).toEqual([65, 91, 92]);
    expect(p.query).toEqual([0, 100, 50]);
    expect(p.reference).toEqual([20, 100, 0]);
    expect(p.difference).toEqual([-20, 0, 50]);
  });
});

describe('topPeaks', () => {
  it('gives the most intense bins first', () => {
    expect(topPeaks([40, 41, 42, 43], [5, 50, 0, 20], 2)).toEqual([41, 43]);
  });
});
