import { describe, expect, it } from 'vitest';

import { ELECTRON_MASS, isotopePattern, monoisotopicMass } from '@/lib/chem';

function relativeAt(pattern: Array<{ mz: number; relative: number }>, nominal: number): number {
  return pattern.filter((p) => Math.round(p.mz) === nominal).reduce((sum, p) => sum + p.relative, 0);
}

describe('isotopePattern', () => {
  // IUPAC CIAAW isotopic compositions: 35Cl 75.8 %, 37Cl 24.2 %; ratios common practice, no source
  it('one Cl gives M+2 about 32 % of M', () => {
    const p = isotopePattern('Cl');
    expect(relativeAt(p, 37) / relativeAt(p, 35)).toBeCloseTo(0.242 / 0.758, 2);
    expect((relativeAt(p, 37) / relativeAt(p, 35)) * 100).toBeCloseTo(32, 0);
  });

  it('Cl2 gives about 100 : 64 : 10', () => {
    const p = isotopePattern('Cl2');
    expect(relativeAt(p, 70)).toBeCloseTo(100, 5);
    expect(Math.abs(relativeAt(p, 72) - 64)).toBeLessThan(1);
    expect(Math.abs(relativeAt(p, 74) - 10)).toBeLessThan(0.5);
  });

  // IUPAC CIAAW isotopic compositions: 79Br 50.7 %, 81Br 49.3 %
  it('one Br gives about 100 : 97', () => {
    const p = isotopePattern('Br');
    expect(relativeAt(p, 79)).toBeCloseTo(100, 5);
    expect(Math.abs(relativeAt(p, 81) - 97)).toBeLessThan(1);
  });

  it('Br2 gives about 51 : 100 : 49', () => {
    const p = isotopePattern('Br2');
    expect(Math.abs(relativeAt(p, 158) - 51)).toBeLessThan(1);
    expect(relativeAt(p, 160)).toBeCloseTo(100, 5);
    expect(Math.abs(relativeAt(p, 162) - 49)).toBeLessThan(1);
  });

  // common practice, no source: chlorobenzene M+1 about 6.6 % (six 13C), M+2 about 32 %
  it('folds carbon into a chlorine cluster at unit resolution', () => {
    const p = isotopePattern('C6H5Cl');
    expect(p[0].mz).toBeCloseTo(monoisotopicMass('C6H5Cl'), 6);
    expect(Math.abs(relativeAt(p, 113) - 6.6)).toBeLessThan(0.3);
    expect(Math.abs(relativeAt(p, 114) - 32.2)).toBeLessThan(0.5);
  });

  it('separates isotopologues of one nominal mass at accurate resolution', () => {
    const accurate = isotopePattern('C6H5Br', { resolution: 'accurate' });
    const unit = isotopePattern('C6H5Br');
    expect(accurate.filter((p) => Math.round(p.mz) === 157).length).toBeGreaterThan(1);
    expect(unit.filter((p) => Math.round(p.mz) === 157).length).toBe(1);
  });

  it('gives radical-cation m/z on request', () => {
    const neutral = isotopePattern('C7H8');
    const ion = isotopePattern('C7H8', { radicalCation: true });
    expect(neutral[0].mz - ion[0].mz).toBeCloseTo(ELECTRON_MASS, 9);
  });

  it('rejects bad options', () => {
    // @ts-expect-error wrong resolution on purpose
    expect(() => isotopePattern('C7H8', { resolution: 'high' })).toThrow(RangeError);
    expect(() => isotopePattern('C7H8', { fwhm: 0 })).toThrow(RangeError);
  });
});
