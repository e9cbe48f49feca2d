import { describe, expect, it } from 'vitest';
import { checkHitFormula, closeToTop, formulaCounts } from '../../../../src/components/identify/hitChecks';

const hit = (rank: number, score: number, formula: string | null = null, nominalMass: number | null = null) => ({ rank, score, formula, nominalMass });

describe('closeToTop', () => {
  it('flags every hit within the margin of the top score when there are two or more', () => {
    const hits = [hit(1, 0.91), hit(2, 0.895), hit(3, 0.89), hit(4, 0.85)];
    expect([...closeToTop(hits, 0.02)].sort()).toEqual([1, 2, 3]);
  });

  it('flags nothing when the top hit stands alone', () => {
    expect(closeToTop([hit(1, 0.95), hit(2, 0.9)], 0.02).size).toBe(0);
    expect(closeToTop([hit(1, 0.95)], 0.02).size).toBe(0);
  });

  it('uses 0.02 as the default margin', () => {
    expect(closeToTop([hit(1, 0.9), hit(2, 0.881)]).size).toBe(2);
    expect(closeToTop([hit(1, 0.9), hit(2, 0.879)]).size).toBe(0);
  });
});

describe('formulaCounts', () => {
  it('counts atoms of plain and bracketed formulas', () => {
    expect(formulaCounts('C6H5Cl')).toEqual({ C: 6, H: 5, Cl: 1 });
    expect(formulaCounts('C2H4(OH)2')).toEqual({ C: 2, H: 6, O: 2 });
    expect(formulaCounts('CHBr3')).toEqual({ C: 1, H: 1, Br: 3 });
  });
  it('gives null for what it cannot read', () => {
    expect(formulaCounts(null)).toBeNull();
    expect(formulaCounts('C6H5-')).toBeNull();
  });
});

describe('checkHitFormula', () => {
  const interp = (mz: number, Cl = 0, Br = 0, fit = 0.001, confidence = 0.9) => ({
    molecularIon: { mz, confidence },
    halogenEstimate: { Cl, Br, fit, alternatives: [] },
  });

  it('finds no contradiction when the formula fits M and the halogen pattern', () => {
    expect(checkHitFormula(hit(1, 0.9, 'C6H5Cl', 112), interp(112, 1, 0))).toEqual([]);
  });

  it('flags a formula whose nominal mass differs from the molecular-ion candidate', () => {
    const c = checkHitFormula(hit(1, 0.9, 'C7H8', 92), interp(106));
    expect(c[0].kind).toBe('contradiction');
    expect(c[0].message).toContain('92');
  });

  it('flags a halogen count the isotope cluster rules out', () => {
    // C6H5Br has M = 156 (79Br); a cluster read as Cl1 Br0 contradicts it.
    const c = checkHitFormula(hit(1, 0.9, 'C6H5Br', 156), interp(156, 1, 0));
    expect(c.map((x) => x.kind)).toEqual(['contradiction']);
  });

  it('accepts a halogen count listed among the close alternatives', () => {
    const i = { molecularIon: { mz: 156, confidence: 0.9 }, halogenEstimate: { Cl: 1, Br: 0, fit: 0.01, alternatives: [{ Cl: 0, Br: 1, fit: 0.012 }] } };
    expect(checkHitFormula(hit(1, 0.9, 'C6H5Br', 156), i)).toEqual([]);
  });

  it('adds a note when the molecular-ion candidate itself is uncertain', () => {
    const c = checkHitFormula(hit(1, 0.9, 'C7H8', 92), interp(106, 0, 0, 0.001, 0.3));
    expect(c.map((x) => x.kind)).toEqual(['contradiction', 'note']);
  });

  it('says nothing without an interpretation or a molecular ion', () => {
    expect(checkHitFormula(hit(1, 0.9, 'C7H8', 92), null)).toEqual([]);
    expect(checkHitFormula(hit(1, 0.9, 'C7H8', 92), { molecularIon: null, halogenEstimate: null })).toEqual([]);
  });
});
