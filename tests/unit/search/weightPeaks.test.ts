import { describe, expect, it } from 'vitest';
import { DEFAULT_WEIGHTS, weightPeaks } from '../../../src/lib/search/weightPeaks';

describe('weightPeaks', () => {
  it('weights as m/z^3 * I^0.6 by default', () => {
    // Stein & Scott 1994, J. Am. Soc. Mass Spectrom. 5:859: the weighting exponents as usually cited (from memory).
    expect(DEFAULT_WEIGHTS).toEqual({ mz: 3, intensity: 0.6 });
    const [[mz, w]] = weightPeaks([[10, 32]]);
    expect(mz).toBe(10);
    expect(w).toBeCloseTo(1000 * 8, 9); // 32^0.6 = 2^3 = 8
  });
  it('takes other exponents and rejects bad ones', () => {
    expect(weightPeaks([[10, 4]], { mz: 0, intensity: 1 })).toEqual([[10, 4]]);
    expect(() => weightPeaks([], { mz: -1, intensity: 1 })).toThrow(/weights.mz/);
  });
});
