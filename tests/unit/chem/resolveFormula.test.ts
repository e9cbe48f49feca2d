import { describe, expect, it } from 'vitest';

import { FormulaError, parseFormula, resolveFormula } from '@/lib/chem';

describe('resolveFormula', () => {
  it('reads text, atom counts and parsed formulas alike', () => {
    expect(resolveFormula('C6H5Br').hill).toBe('C6H5Br');
    expect(resolveFormula({ Br: 1, C: 6, H: 5 }).hill).toBe('C6H5Br');
    const parsed = parseFormula('C7H8');
    expect(resolveFormula(parsed)).toBe(parsed);
  });
  it('rejects bad input', () => {
    expect(() => resolveFormula({ C: -1 })).toThrow(RangeError);
    expect(() => resolveFormula({ c: 1 })).toThrow(RangeError);
    expect(() => resolveFormula({})).toThrow(RangeError);
    expect(() => resolveFormula({ Xx: 1 })).toThrow(FormulaError);
  });
});
