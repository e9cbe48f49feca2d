import { describe, expect, it } from 'vitest';

import { estimateHalogens } from '@/lib/chem';

import { referenceCluster } from './referenceSpectra';

const compositions: Array<[number, number]> = [];
for (let cl = 0; cl <= 4; cl++) for (let br = 0; cl + br <= 4; br++) compositions.push([cl, br]);

describe('estimateHalogens', () => {
  // synthetic clusters from isotopic-distribution (IUPAC CIAAW isotopic compositions)
  it.each(compositions)('recovers Cl%i Br%i from a benzene-ring cluster', (cl, br) => {
    const mf = `C6H${6 - cl - br}${cl ? `Cl${cl}` : ''}${br ? `Br${br}` : ''}`;
    const peaks = referenceCluster(mf);
    const estimate = estimateHalogens(peaks, peaks[0][0]);
    expect({ Cl: estimate.Cl, Br: estimate.Br }).toEqual({ Cl: cl, Br: br });
    expect(estimate.fit).toBeLessThan(1e-3);
  });

  it.each(compositions)('recovers Cl%i Br%i on an aliphatic C10 frame', (cl, br) => {
    const mf = `C10H${22 - cl - br}${cl ? `Cl${cl}` : ''}${br ? `Br${br}` : ''}`;
    const peaks = referenceCluster(mf);
    const estimate = estimateHalogens(peaks, peaks[0][0]);
    expect({ Cl: estimate.Cl, Br: estimate.Br }).toEqual({ Cl: cl, Br: br });
  });

  // IUPAC CIAAW isotopic compositions; "Br4 and Cl2Br3 differ by a few percent" (issue 4)
  it('lists the close runner-up for Br4', () => {
    const peaks = referenceCluster('C6H2Br4');
    const estimate = estimateHalogens(peaks, peaks[0][0]);
    expect(estimate.Br).toBe(4);
    expect(estimate.alternatives.map((a) => `Cl${a.Cl}Br${a.Br}`)).toContain('Cl2Br3');
  });

  it('fits a perfect pattern with about 0 and a wrong one with more', () => {
    const peaks = referenceCluster('C6H5Cl');
    const estimate = estimateHalogens(peaks, 112);
    expect(estimate.fit).toBeLessThan(1e-6);
    expect(estimateHalogens(referenceCluster('C6H5Br'), 156).fit).toBeLessThan(1e-6);
  });

  // IUPAC CIAAW isotopic compositions: 34S 4.25 %, 30Si 3.1 %: not chlorine
  it('does not read 34S or 30Si as chlorine', () => {
    const thiophene = referenceCluster('C4H4S');
    expect(estimateHalogens(thiophene, 84)).toMatchObject({ Cl: 0, Br: 0 });
    const d4 = referenceCluster('C8H24O4Si4');
    expect(estimateHalogens(d4, 296, { rest: { C: 8, H: 24, O: 4, Si: 4 } })).toMatchObject({ Cl: 0, Br: 0 });
    expect(estimateHalogens(d4, 296)).toMatchObject({ Cl: 0, Br: 0 });
  });

  it('uses a given carbon count', () => {
    const peaks = referenceCluster('C6H5Cl');
    expect(estimateHalogens(peaks, 112, { carbons: 6 }).carbonsAssumed).toBe(6);
  });

  it('rejects a missing M peak and bad options', () => {
    const peaks = referenceCluster('C6H5Cl');
    expect(() => estimateHalogens(peaks, 111)).toThrow(/no peak/);
    expect(() => estimateHalogens(peaks, 112, { maxHalogens: -1 })).toThrow(RangeError);
    expect(() => estimateHalogens(peaks, Number.NaN)).toThrow(RangeError);
  });
});
