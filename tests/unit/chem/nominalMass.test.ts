import { describe, expect, it } from 'vitest';

import { monoisotopicMass, nominalMass } from '@/lib/chem';

import { FORMULAS, MASS_NUMBER, sum } from './massReference';

describe('nominalMass', () => {
  // AME2020 / NIST: mass numbers of the most abundant isotopes
  it.each(FORMULAS)('%s is the sum of the integer masses', (formula, counts) => {
    expect(nominalMass(formula)).toBe(sum(counts, MASS_NUMBER));
  });

  // common practice, no source: the nominal mass is not the rounded monoisotopic mass
  it('differs from the rounded monoisotopic mass for C40H82 and C12Br10', () => {
    expect(nominalMass('C40H82')).toBe(562);
    expect(Math.round(monoisotopicMass('C40H82'))).toBe(563);
    expect(nominalMass('C12Br10')).toBe(934);
    expect(Math.round(monoisotopicMass('C12Br10'))).toBe(933);
  });
});
