// The importer's own small computations checked against libraries this
// project did not write: the near-duplicate cosine against ml-distance, the
// masses behind mw_mismatch against mf-parser.
import { describe, it, expect } from 'vitest';
import { similarity } from 'ml-distance';
import { MF } from 'mf-parser';
import { unitCosine, deriveChemistry, compoundNameKey } from '../../../src/lib/curation';
import { rng, randomPeaks } from './helpers';

describe('unitCosine', () => {
  it('equals ml-distance cosine on unit-binned vectors', () => {
    const next = rng(11);
    for (let k = 0; k < 50; k++) {
      const a = randomPeaks(next, 20);
      const b = randomPeaks(next, 20);
      const dense = (p: [number, number][]) => {
        const v = new Array(320).fill(0);
        for (const [mz, i] of p) v[Math.round(mz)] += i;
        return v;
      };
      // ml-distance's similarity.cosine is the plain dot product over the norms (its documentation)
      expect(unitCosine(a, b)).toBeCloseTo(similarity.cosine(dense(a), dense(b)), 12);
    }
  });
  it('bins fractional m/z and ignores the intensity scale', () => {
    expect(unitCosine([[78.04, 999], [77.1, 250]], [[78, 100], [77, 25.03]])).toBeGreaterThan(0.9999);
    expect(unitCosine([[78, 1]], [[79, 1]])).toBe(0);
  });
});

describe('deriveChemistry', () => {
  it('masses agree with mf-parser', () => {
    for (const mf of ['C6H6', 'C7H7Cl', 'C6H5Br', 'C8H10O2', 'C3H9N', 'C2H3Cl3']) {
      const ours = deriveChemistry({ formula: mf, ionizationEnergy: 70 });
      const info = new MF(mf).getInfo() as { monoisotopicMass: number; mass: number };
      expect(ours.monoisotopicMass!).toBeCloseTo(info.monoisotopicMass, 4);
      // average masses: conventional weights vs mf-parser's, within 0.01
      expect(Math.abs(ours.averageMass! - info.mass)).toBeLessThan(0.01);
      expect(ours.warnings).toEqual([]);
    }
  });
  it('flags an MW that is neither the nominal nor the average mass', () => {
    // chlorobenzene: nominal 112, average about 112.56 (common practice, no source)
    expect(deriveChemistry({ formula: 'C6H5Cl', mw: 112.56, ionizationEnergy: 70 }).warnings).toEqual([]);
    expect(deriveChemistry({ formula: 'C6H5Cl', mw: 112, ionizationEnergy: 70 }).warnings).toEqual([]);
    expect(deriveChemistry({ formula: 'C6H5Cl', mw: 114, ionizationEnergy: 70 }).warnings.map((w) => w.code)).toEqual(['mw_mismatch']);
  });
});

describe('compoundNameKey', () => {
  it('treats case, blank runs and compatibility forms as the same name', () => {
    expect(compoundNameKey('  Methyl  Benzoate ')).toBe('methyl benzoate');
    expect(compoundNameKey('ﬂuorene')).toBe(compoundNameKey('Fluorene'));
  });
});
