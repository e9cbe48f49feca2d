import { describe, expect, it } from 'vitest';

import { candidateFormulas, ihdFromFormula, nitrogenRule, nominalMass } from '@/lib/chem';

import { referenceCluster } from './referenceSpectra';

describe('candidateFormulas', () => {
  // common practice, no source: pyridine C5H5N, nominal mass 79
  it('lists C5H5N for nominal mass 79 without halogens, and it passes the nitrogen rule', () => {
    const candidates = candidateFormulas(79, { halogenEstimate: { Cl: 0, Br: 0 }, limit: 1000 });
    const pyridine = candidates.find((c) => c.formula === 'C5H5N');
    expect(pyridine).toBeDefined();
    expect(pyridine!.ihd).toBe(4);
    expect(nitrogenRule(79).nitrogen).toBe('odd');
    expect(pyridine!.elements.N! % 2).toBe(1);
  });

  it('returns only formulas of the mass with a whole IHD >= 0 that obey the nitrogen rule', () => {
    for (const mass of [79, 92, 112, 156, 194]) {
      for (const c of candidateFormulas(mass, { limit: 1000 })) {
        expect(nominalMass(c.formula)).toBe(mass);
        const ihd = ihdFromFormula(c.formula);
        expect(ihd.valid).toBe(true);
        expect(ihd.ihd).toBe(c.ihd);
        expect(Number.isInteger(c.ihd) && c.ihd >= 0).toBe(true);
        expect((c.elements.N ?? 0) % 2).toBe(mass % 2);
      }
    }
  });

  // isotopic-distribution as the reference for the observed cluster
  it('ranks pyridine first against its own isotope cluster', () => {
    const observedCluster = referenceCluster('C5H5N').map(([, y]) => y);
    const [best] = candidateFormulas(79, { halogenEstimate: { Cl: 0, Br: 0 }, observedCluster });
    expect(best.formula).toBe('C5H5N');
    expect(best.isotopeFit).toBeLessThan(1e-4);
  });

  it('keeps the halogen estimate', () => {
    const observedCluster = referenceCluster('C6H5Cl').map(([, y]) => y);
    const candidates = candidateFormulas(112, { halogenEstimate: { Cl: 1, Br: 0 }, observedCluster });
    expect(candidates.every((c) => c.elements.Cl === 1 && !c.elements.Br)).toBe(true);
    expect(candidates[0].formula).toBe('C6H5Cl');
  });

  it('respects element limits', () => {
    const candidates = candidateFormulas(92, { limits: { C: [0, 10], H: [0, 20] } });
    expect(candidates.map((c) => c.formula)).toEqual(['C7H8']);
  });

  it('rejects bad arguments', () => {
    expect(() => candidateFormulas(0)).toThrow(RangeError);
    expect(() => candidateFormulas(79.5)).toThrow(RangeError);
    expect(() => candidateFormulas(79, { limits: { Xx: [0, 1] } })).toThrow(/Xx/);
    expect(() => candidateFormulas(79, { limits: { C: [3, 1] } })).toThrow(RangeError);
    expect(() => candidateFormulas(79, { observedCluster: [] })).toThrow(RangeError);
  });
});
