// The synthetic demo spectra: deterministic, shaped like EI spectra, with the
// molecular-ion cluster where the formula puts it and isotope clusters that
// follow the halogens. Isotope ratios are checked against common practice
// (no source): Cl about 3:1 for 35/37, Br about 1:1 for 79/81.
import { describe, it, expect } from 'vitest';
import { IsotopicDistribution } from 'isotopic-distribution';
import { DEMO_COMPOUNDS, type DemoCompound } from '../../../seeds/compounds';
import { SYNTHETIC_NOTE, atomsOf, syntheticSpectrum, unitIsotopeCluster } from '../../../seeds/synthetic-spectrum';

const spectrumOf = (c: DemoCompound) => syntheticSpectrum({ formula: c.formula, smiles: c.smiles, cls: c.cls, molecularIon: c.molecularIon !== 'absent' });
const byName = (name: string) => {
  const c = DEMO_COMPOUNDS.find((x) => x.name === name);
  if (!c) throw new Error(`no demo compound ${name}`);
  return c;
};
const at = (peaks: [number, number][], mz: number) => peaks.find((p) => p[0] === mz)?.[1] ?? 0;
/** A peak of at least 0.5 % of the base peak counts as significant. */
const SIGNIFICANT = 5;

describe('syntheticSpectrum', () => {
  it('is deterministic', () => {
    for (const c of DEMO_COMPOUNDS.slice(0, 40)) expect(spectrumOf(c)).toEqual(spectrumOf(c));
    const c = byName('Toluene');
    expect(syntheticSpectrum({ formula: c.formula, smiles: c.smiles, cls: c.cls, seed: 'replicate 2' }).peaks).not.toEqual(spectrumOf(c).peaks);
  });

  it('gives every compound unit-mass peaks in ascending order, base peak 999, 20–80 peaks (fewer only for one-carbon and very small molecules)', () => {
    for (const c of DEMO_COMPOUNDS) {
      const s = spectrumOf(c);
      const mzs = s.peaks.map((p) => p[0]);
      expect(mzs.every((mz, i) => Number.isInteger(mz) && (i === 0 || mz > mzs[i - 1])), c.name).toBe(true);
      expect(Math.max(...s.peaks.map((p) => p[1])), c.name).toBe(999);
      expect(s.peaks.every((p) => Number.isInteger(p[1]) && p[1] >= 1 && p[1] <= 999), c.name).toBe(true);
      expect(at(s.peaks, s.basePeakMz), c.name).toBe(999);
      expect(s.peaks.length, c.name).toBeLessThanOrEqual(80);
      const small = (atomsOf(c.formula).C ?? 0) <= 1 || s.nominalMass < 60;
      expect(s.peaks.length, c.name).toBeGreaterThanOrEqual(small ? 5 : 20);
      expect(Math.min(...mzs)).toBeGreaterThanOrEqual(s.lowMassCutoff);
    }
  });

  it('puts the highest significant cluster at the nominal mass, or leaves the molecular ion out by design', () => {
    const wrong: string[] = [];
    for (const c of DEMO_COMPOUNDS) {
      const s = spectrumOf(c);
      const top = Math.max(...s.peaks.map((p) => p[0]));
      if (!s.molecularIonShown) {
        expect(c.molecularIon, c.name).toBe('absent');
        if (top >= s.nominalMass) wrong.push(`${c.name}: molecular ion left out, yet a peak at ${top} (M = ${s.nominalMass})`);
        continue;
      }
      // The cluster of M spans the offsets the formula's isotope pattern has (reference: isotopic-distribution).
      const xy = new IsotopicDistribution(c.formula).getXY({ sumValue: 100 });
      const span = Math.round(Math.max(...xy.x) - Math.min(...xy.x));
      const highestSignificant = Math.max(...s.peaks.filter((p) => p[1] >= SIGNIFICANT).map((p) => p[0]));
      if (at(s.peaks, s.nominalMass) < SIGNIFICANT && !(atomsOf(c.formula).Br ?? 0)) wrong.push(`${c.name}: no significant peak at M = ${s.nominalMass}`);
      if (at(s.peaks, s.nominalMass) === 0) wrong.push(`${c.name}: nothing at M = ${s.nominalMass}`);
      if (highestSignificant < s.nominalMass || highestSignificant > s.nominalMass + span) wrong.push(`${c.name}: highest significant peak ${highestSignificant}, M = ${s.nominalMass}`);
      if (top > s.nominalMass + span) wrong.push(`${c.name}: a peak at ${top} beyond the molecular-ion cluster`);
    }
    expect(wrong).toEqual([]);
  });

  it('draws the molecular-ion cluster from the isotope pattern: Cl about 3:1, Br about 1:1, Cl2 about 9:6:1', () => {
    const clb = spectrumOf(byName('Chlorobenzene')).peaks;
    expect(at(clb, 114) / at(clb, 112)).toBeGreaterThan(0.28);
    expect(at(clb, 114) / at(clb, 112)).toBeLessThan(0.36);
    const brb = spectrumOf(byName('Bromobenzene')).peaks;
    expect(at(brb, 158) / at(brb, 156)).toBeGreaterThan(0.9);
    expect(at(brb, 158) / at(brb, 156)).toBeLessThan(1.05);
    const dcb = spectrumOf(byName('1,4-Dichlorobenzene')).peaks;
    expect(at(dcb, 148) / at(dcb, 146)).toBeGreaterThan(0.55);
    expect(at(dcb, 148) / at(dcb, 146)).toBeLessThan(0.75);
    expect(at(dcb, 150) / at(dcb, 146)).toBeGreaterThan(0.07);
    expect(at(dcb, 150) / at(dcb, 146)).toBeLessThan(0.15);
  });

  it('gives fragments that keep Cl or Br their own cluster (CCl3+ at 117/119/121, CHBr2+ at 171/173/175)', () => {
    const ccl4 = spectrumOf(byName('Carbon tetrachloride'));
    expect(ccl4.molecularIonShown).toBe(false);
    expect(ccl4.basePeakMz === 117 || ccl4.basePeakMz === 119).toBe(true);
    expect(at(ccl4.peaks, 119) / at(ccl4.peaks, 117)).toBeGreaterThan(0.85);
    expect(at(ccl4.peaks, 119) / at(ccl4.peaks, 117)).toBeLessThan(1.1);
    expect(at(ccl4.peaks, 121) / at(ccl4.peaks, 117)).toBeGreaterThan(0.25);
    const chbr3 = spectrumOf(byName('Bromoform')).peaks;
    expect(at(chbr3, 173) / at(chbr3, 171)).toBeGreaterThan(1.7);
    expect(at(chbr3, 173) / at(chbr3, 175)).toBeGreaterThan(1.7);
  });

  it('shows the familiar ions of each class', () => {
    expect(spectrumOf(byName('Toluene')).basePeakMz).toBe(91);
    expect([43, 57]).toContain(spectrumOf(byName('Hexadecane')).basePeakMz);
    expect(spectrumOf(byName('Methyl hexadecanoate')).basePeakMz).toBe(74);
    expect(spectrumOf(byName('Butylamine')).basePeakMz).toBe(30);
    expect(spectrumOf(byName('Naphthalene')).basePeakMz).toBe(128);
    expect(spectrumOf(byName('Hexamethyldisiloxane')).basePeakMz).toBe(147);
    const tms = spectrumOf(byName('Glycerol, 3TMS derivative')).peaks;
    expect(at(tms, 73)).toBeGreaterThan(100);
    const phenyl = spectrumOf(byName('Chlorobenzene')).peaks;
    expect(at(phenyl, 77)).toBeGreaterThan(100);
    expect(at(phenyl, 51)).toBeGreaterThan(30);
  });

  it('bins the isotope pattern of a formula to unit mass (CCl4: 4 Cl, offsets 0–8)', () => {
    const cluster = unitIsotopeCluster({ C: 1, Cl: 4 });
    expect(cluster.map((c) => c.offset).filter((o) => o % 2 === 0)).toEqual([0, 2, 4, 6, 8]);
    expect(cluster.reduce((s, c) => s + c.fraction, 0)).toBeCloseTo(1, 3);
  });

  it('refuses a SMILES that does not describe the formula', () => {
    expect(() => syntheticSpectrum({ formula: 'C6H6', smiles: 'Cc1ccccc1', cls: 'aromatic' })).toThrow(RangeError);
  });

  it('says that it is synthetic demo data, not for identification', () => {
    expect(SYNTHETIC_NOTE).toMatch(/synthetic/i);
    expect(SYNTHETIC_NOTE).toMatch(/not for identification/);
  });
});
