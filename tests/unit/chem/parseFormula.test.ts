import { describe, expect, it } from 'vitest';

import { FormulaError, parseFormula } from '@/lib/chem';

describe('parseFormula', () => {
  // Hill system (Hill 1900, J. Am. Chem. Soc. 22:478): C, H, then alphabetical; no C: all alphabetical
  it.each([
    ['CH3CH2OH', 'C2H6O'],
    ['BrC6H5', 'C6H5Br'],
    ['Cl4C', 'CCl4'],
    ['HCl', 'ClH'],
    ['H2O', 'H2O'],
    ['NaCl', 'ClNa'],
    ['C6H5(CH3)', 'C7H8'],
    ['H3PO4', 'H3O4P'],
    ['C8H10N4O2', 'C8H10N4O2'],
    ['OSC2H6', 'C2H6OS'],
  ])('writes %s as %s', (input, hill) => {
    expect(parseFormula(input).hill).toBe(hill);
  });

  it('counts atoms per element', () => {
    expect(parseFormula('CH3COOH').elements).toEqual({ C: 2, H: 4, O: 2 });
  });

  it('keeps isotopic labels and merges them into their element', () => {
    const parsed = parseFormula('C6D5CD3'.replace(/D/g, '[2H]'));
    expect(parsed.elements).toEqual({ C: 7, H: 8 });
    expect(parsed.labelledIsotopes).toEqual({ '2H': 8 });
    expect(parsed.hill).toBe('C7[2H]8');
  });

  it('reads a charge', () => {
    expect(parseFormula('C7H7(+)').charge).toBe(1);
  });

  it.each([
    ['Xx9', 'unknown_element', /unknown element "Xx"/],
    ['C6(H2', 'unbalanced_brackets', /unbalanced/],
    ['C6H5)', 'unbalanced_brackets', /unbalanced/],
    ['C6H5[', 'unbalanced_brackets', /unbalanced/],
    ['', 'empty', /empty/],
    ['   ', 'empty', /empty/],
    ['12', 'empty', /no atoms/],
    ['C-2H5', 'negative_count', /negative/],
    ['C1-3H4', 'unsupported', /range/],
    ['c6h6', 'syntax', /cannot read/],
  ])('rejects %j with a FormulaError (%s)', (input, code, message) => {
    let error: unknown;
    try {
      parseFormula(input);
    } catch (e) {
      error = e;
    }
    expect(error).toBeInstanceOf(FormulaError);
    expect((error as FormulaError).code).toBe(code);
    expect((error as FormulaError).message).toMatch(message);
  });
});
