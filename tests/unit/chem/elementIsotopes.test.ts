import { describe, expect, it } from 'vitest';

import { elementIsotopes } from '@/lib/chem';

describe('elementIsotopes', () => {
  // IUPAC CIAAW isotopic compositions (from memory): 35Cl 0.758, 37Cl 0.242; 79Br 0.507, 81Br 0.493
  it('gives the natural compositions of Cl and Br', () => {
    const cl = elementIsotopes('Cl');
    expect(cl.map((i) => i.nominal)).toEqual([35, 37]);
    expect(cl[0].abundance).toBeCloseTo(0.758, 3);
    const br = elementIsotopes('Br');
    expect(br[0].abundance).toBeCloseTo(0.507, 3);
    expect(br[1].abundance).toBeCloseTo(0.493, 3);
  });
  // AME2020 / NIST: 13C 13.00335483507 u
  it('gives isotope masses', () => {
    expect(elementIsotopes('C')[1].mass).toBeCloseTo(13.00335483507, 9);
  });
  it('rejects unknown symbols', () => {
    expect(() => elementIsotopes('Xx')).toThrow(RangeError);
    expect(() => elementIsotopes('cl')).toThrow(RangeError);
  });
});
