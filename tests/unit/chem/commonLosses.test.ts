import { describe, expect, it } from 'vitest';

import { commonLosses, monoisotopicMass, nominalMass } from '@/lib/chem';

describe('commonLosses', () => {
  const byLoss = new Map(commonLosses.map((l) => [l.loss, l.compositions.map((c) => c.formula)]));

  // common practice, no source: the losses every practitioner reads
  it.each([
    [15, 'CH3'],
    [17, 'HO'],
    [18, 'H2O'],
    [28, 'CO'],
    [28, 'C2H4'],
    [29, 'CHO'],
    [29, 'C2H5'],
    [31, 'CH3O'],
    [35, 'Cl'],
    [37, '[37Cl]'],
    [43, 'C3H7'],
    [43, 'C2H3O'],
    [45, 'CHO2'],
    [45, 'C2H5O'],
    [79, 'Br'],
    [81, '[81Br]'],
  ])('lists %i as %s', (loss, formula) => {
    expect(byLoss.get(loss)).toContain(formula);
  });

  it('gives each composition a mass that agrees with its nominal loss', () => {
    for (const entry of commonLosses) {
      for (const c of entry.compositions) {
        expect(nominalMass(c.formula)).toBe(entry.loss);
        expect(c.mass).toBeCloseTo(monoisotopicMass(c.formula), 10);
      }
    }
  });

  // common practice, no source: losses of 3-14 and 21-25 u are unusual
  it('has no unusual losses', () => {
    expect(commonLosses.some((l) => (l.loss >= 3 && l.loss <= 14) || (l.loss >= 21 && l.loss <= 25))).toBe(false);
  });
});
