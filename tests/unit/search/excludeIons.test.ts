import { describe, expect, it } from 'vitest';
import { AIR_WATER_BLEED_IONS, excludeIons } from '../../../src/lib/search/excludeIons';

describe('excludeIons', () => {
  it('has the air, water and bleed preset', () => {
    // Common practice, no source: H2O 18, N2 28, O2 32, Ar 40, CO2 44, siloxane bleed 207 and 281.
    expect([...AIR_WATER_BLEED_IONS]).toEqual([18, 28, 32, 40, 44, 207, 281]);
  });
  it('drops the listed bins', () => {
    expect(excludeIons([[18, 5], [43, 1], [44, 2], [207, 3]], AIR_WATER_BLEED_IONS)).toEqual([[43, 1]]);
  });
  it('rejects a bad ion', () => {
    expect(() => excludeIons([], [0])).toThrow(/excludeIons/);
  });
});
