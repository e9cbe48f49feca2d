import { describe, expect, it } from 'vitest';

import { interpretSpectrum, type Peak } from '@/lib/chem';

import { chlorobenzene, pyridine, referenceCluster } from './referenceSpectra';

describe('interpretSpectrum', () => {
  it('answers in the /api/interpret shape (API.md)', () => {
    const result = interpretSpectrum(chlorobenzene);
    expect(Object.keys(result).sort()).toEqual(
      [
        'candidateFormulas',
        'fragments',
        'halogenEstimate',
        'isotopeClusters',
        'losses',
        'molecularIon',
        'nitrogenRule',
      ].sort(),
    );
    expect(result.molecularIon).toMatchObject({ mz: 112 });
    expect(result.molecularIon!.confidence).toBeGreaterThanOrEqual(0);
    expect(result.molecularIon!.confidence).toBeLessThanOrEqual(1);
    expect(result.halogenEstimate).toMatchObject({ Cl: 1, Br: 0 });
    expect(Array.isArray(result.halogenEstimate!.alternatives)).toBe(true);
    for (const loss of result.losses) expect(Object.keys(loss).sort()).toEqual(['composition', 'fromMz', 'loss', 'toMz']);
    for (const c of result.candidateFormulas) expect(Object.keys(c).sort()).toEqual(['formula', 'ihd', 'isotopeFit']);
  });

  // isotopic-distribution cluster; common practice, no source: 112 -> 77 is the loss of Cl
  it('reads chlorobenzene: Cl1, loss of Cl, C6H5Cl among the candidates', () => {
    const result = interpretSpectrum(chlorobenzene);
    expect(result.losses).toContainEqual({ fromMz: 112, toMz: 77, loss: 35, composition: 'Cl' });
    expect(result.fragments.map((f) => f.mz)).toContain(77);
    expect(result.candidateFormulas.map((c) => c.formula)).toContain('C6H5Cl');
    expect(result.nitrogenRule).toMatchObject({ nominalMass: 112, nitrogen: 'even or zero' });
  });

  // common practice, no source: pyridine 79 -> 52 is the loss of HCN
  it('reads pyridine: odd mass, odd N, loss of HCN, C5H5N first', () => {
    const result = interpretSpectrum(pyridine);
    expect(result.molecularIon?.mz).toBe(79);
    expect(result.nitrogenRule?.nitrogen).toBe('odd');
    expect(result.losses).toContainEqual({ fromMz: 79, toMz: 52, loss: 27, composition: 'CHN or C2H3' });
    expect(result.candidateFormulas[0].formula).toBe('C5H5N');
    for (const c of result.candidateFormulas) expect(Number.isInteger(c.ihd) && c.ihd >= 0).toBe(true);
  });

  it('takes intensities on any scale', () => {
    const scaled = chlorobenzene.map(([mz, y]) => [mz, y * 1234.5] as Peak);
    expect(interpretSpectrum(scaled).molecularIon?.mz).toBe(112);
  });

  it('keeps close halogen alternatives in play for the candidates', () => {
    const result = interpretSpectrum(referenceCluster('C6H2Br4'));
    expect(result.halogenEstimate).toMatchObject({ Cl: 0, Br: 4 });
  });

  it('rejects empty peaks and negative m/z', () => {
    expect(() => interpretSpectrum([])).toThrow(RangeError);
    expect(() => interpretSpectrum([[-1, 10]])).toThrow(/m\/z must be a positive number/);
    expect(() => interpretSpectrum([[50, -1]])).toThrow(/intensity/);
  });
});
