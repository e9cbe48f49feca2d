import { describe, expect, it } from 'vitest';

import { molecularFromEmpirical } from '@/lib/chem';

describe('molecularFromEmpirical', () => {
  // worked by hand: 180 / 30 = 6 (glucose); 58 / 29 = 2 (butane)
  it('gives C6H12O6 from CH2O and 180', () => {
    expect(molecularFromEmpirical('CH2O', 180)).toMatchObject({ formula: 'C6H12O6', multiplier: 6 });
  });
  it('gives C4H10 from C2H5 and 58', () => {
    expect(molecularFromEmpirical('C2H5', 58)).toMatchObject({ formula: 'C4H10', multiplier: 2 });
  });
  // AME2020 / NIST isotope masses: C6H12O6 180.063388
  it('works with accurate masses', () => {
    const result = molecularFromEmpirical('CH2O', 180.0634, { massType: 'monoisotopic' });
    expect(result.formula).toBe('C6H12O6');
    expect(Math.abs(result.error)).toBeLessThan(0.001);
  });
  it('rejects a mass that is no whole multiple', () => {
    expect(() => molecularFromEmpirical('CH2O', 165)).toThrow(/not a whole multiple/);
    expect(() => molecularFromEmpirical('CH2O', 180.2, { massType: 'monoisotopic' })).toThrow(RangeError);
    expect(() => molecularFromEmpirical('CH2O', -5)).toThrow(RangeError);
  });
});
