import { describe, expect, it } from 'vitest';
import { sharedPeaks } from '../../../src/lib/search/sharedPeaks';

describe('sharedPeaks', () => {
  it('pairs the intensities of common m/z values in m/z order', () => {
    expect(sharedPeaks([[20, 2], [10, 1], [30, 3]], [[30, 6], [10, 4]])).toEqual([
      { mz: 10, a: 1, b: 4 },
      { mz: 30, a: 3, b: 6 },
    ]);
  });
});
