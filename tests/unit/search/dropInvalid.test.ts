import { describe, expect, it } from 'vitest';
import { dropInvalid } from '../../../src/lib/search/dropInvalid';

describe('dropInvalid', () => {
  it('drops non-finite and non-positive values', () => {
    const peaks = [[41, 10], [0, 5], [-3, 5], [43, 0], [44, -1], [NaN, 1], [45, Infinity], [46, 2]] as [number, number][];
    expect(dropInvalid(peaks)).toEqual([[41, 10], [46, 2]]);
  });
});
