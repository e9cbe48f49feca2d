import { describe, expect, it } from 'vitest';

import { ihdFromFormula } from '@/lib/chem';

describe('ihdFromFormula', () => {
  // common practice, no source: IHD = C - (H + X)/2 + N/2 + 1; values from memory
  it.each([
    ['C7H8', 4, 'toluene'],
    ['C10H8', 7, 'naphthalene'],
    ['C6H10', 2, 'cyclohexene'],
    ['C3H4', 2, 'propyne'],
    ['C3H6O', 1, 'acetone'],
    ['C5H5N', 4, 'pyridine'],
    ['C2H3N', 2, 'acetonitrile'],
    ['CH3Br', 0, 'bromomethane'],
    ['CHCl3', 0, 'chloroform'],
    ['C6H5Cl', 4, 'chlorobenzene'],
    ['C8H10N4O2', 6, 'caffeine'],
  ])('%s has IHD %i (%s)', (formula, ihd) => {
    const result = ihdFromFormula(formula);
    expect(result.ihd).toBe(ihd);
    expect(result.valid).toBe(true);
    expect(result.flags).toEqual([]);
  });

  // common practice, no source: Si counts like C, P like N
  it('treats Si like C and P like N, and says so', () => {
    const d4 = ihdFromFormula('C8H24O4Si4');
    expect(d4.ihd).toBe(1);
    expect(d4.valencesAssumed).toMatchObject({ Si: 4, O: 2, C: 4, H: 1 });
    expect(ihdFromFormula('C3H9P').ihd).toBe(0);
    expect(ihdFromFormula('C3H9P').valencesAssumed.P).toBe(3);
  });

  it('flags half-integer and negative values of neutral formulas', () => {
    const half = ihdFromFormula('C7H7');
    expect(half.ihd).toBe(4.5);
    expect(half.valid).toBe(false);
    expect(half.flags[0]).toMatch(/not an integer/);
    const negative = ihdFromFormula('CH6');
    expect(negative.ihd).toBe(-1);
    expect(negative.valid).toBe(false);
    expect(negative.flags[0]).toMatch(/negative/);
  });

  // common practice, no source: even-electron ions such as tropylium C7H7+ give half-integers
  it('expects half-integers for even-electron ions', () => {
    expect(ihdFromFormula('C7H7', { species: 'evenElectronIon' })).toMatchObject({ ihd: 4.5, valid: true });
    expect(ihdFromFormula('C7H8', { species: 'evenElectronIon' }).valid).toBe(false);
  });

  it('asks for a valence it does not know, and takes one given', () => {
    const unknown = ihdFromFormula('C10H10Fe');
    expect(unknown.ihd).toBeNull();
    expect(unknown.flags[0]).toMatch(/Fe/);
    expect(ihdFromFormula('C2H6O2S', { valences: { S: 6 } }).ihd).toBe(2);
  });

  it('rejects bad options', () => {
    // @ts-expect-error wrong species on purpose
    expect(() => ihdFromFormula('C7H8', { species: 'anion' })).toThrow(RangeError);
    expect(() => ihdFromFormula('C7H8', { valences: { C: 0 } })).toThrow(RangeError);
  });
});
