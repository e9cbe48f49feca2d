import { describe, expect, it } from 'vitest';

import { monoisotopicMass } from '@/lib/chem';

import { FORMULAS, ISOTOPE_MASS, sum } from './massReference';

describe('monoisotopicMass', () => {
  // AME2020 / NIST atomic weights and isotopic compositions (isotope masses in massReference.ts)
  it.each(FORMULAS)('%s equals the sum of the published isotope masses to 1e-6 u', (formula, counts) => {
    expect(Math.abs(monoisotopicMass(formula) - sum(counts, ISOTOPE_MASS))).toBeLessThan(1e-6);
  });

  it('covers at least 30 formulas', () => {
    expect(FORMULAS.length).toBeGreaterThanOrEqual(30);
  });

  // from memory: caffeine 194.080376, glucose 180.063388 (monoisotopic)
  it('matches well-known values', () => {
    expect(monoisotopicMass('C8H10N4O2')).toBeCloseTo(194.080376, 5);
    expect(monoisotopicMass('C6H12O6')).toBeCloseTo(180.063388, 5);
  });

  it('accepts atom counts and uses the label mass for labelled atoms', () => {
    expect(monoisotopicMass({ C: 7, H: 8 })).toBeCloseTo(monoisotopicMass('C7H8'), 10);
    // AME2020 / NIST: 2H 2.01410177812 u
    expect(monoisotopicMass('C7[2H]8') - monoisotopicMass('C7H8')).toBeCloseTo(8 * (2.01410177812 - 1.00782503223), 8);
  });

  it('rejects bad counts', () => {
    expect(() => monoisotopicMass({ C: -1 })).toThrow(RangeError);
  });
});
