import { describe, expect, it } from 'vitest';

import { commonFragmentIons, ELECTRON_MASS, monoisotopicMass, nominalMass } from '@/lib/chem';

describe('commonFragmentIons', () => {
  const byMz = new Map(commonFragmentIons.map((f) => [f.mz, f.ions.map((i) => i.formula)]));

  // common practice, no source: fragment ions recognized on sight
  it.each([
    [29, 'C2H5'],
    [43, 'C2H3O'],
    [43, 'C3H7'],
    [57, 'C4H9'],
    [77, 'C6H5'],
    [91, 'C7H7'],
    [105, 'C7H5O'],
  ])('lists m/z %i as %s', (mz, formula) => {
    expect(byMz.get(mz)).toContain(formula);
  });

  it('gives each ion its cation m/z', () => {
    for (const entry of commonFragmentIons) {
      for (const ion of entry.ions) {
        expect(nominalMass(ion.formula)).toBe(entry.mz);
        expect(ion.mz).toBeCloseTo(monoisotopicMass(ion.formula) - ELECTRON_MASS, 10);
      }
    }
  });
});
