import { describe, expect, it } from 'vitest';

import { normalizeFormula } from '@/lib/spectra/index';

describe('normalizeFormula', () => {
  it.each([
    ['C 6 H 6', 'C6H6'],
    ['C6 H5 Cl', 'C6H5Cl'],
    ['C 7 H 5 Cl 1 O', 'C7H5ClO'],
    ['C 1 H 4', 'CH4'],
    [' C 12 H 22 O 11 ', 'C12H22O11'],
    ['C3H6O', 'C3H6O'],
  ])('%j -> %s', (input, expected) => {
    expect(normalizeFormula(input)).toBe(expected);
  });

  it('only removes blanks from text that is not a plain formula', () => {
    expect(normalizeFormula('C 6 H 5 Br . H Cl')).toBe('C6H5Br.HCl');
  });

  it('gives null for an empty or missing value', () => {
    expect(normalizeFormula('  ')).toBeNull();
    expect(normalizeFormula('?')).toBeNull();
  });
});
