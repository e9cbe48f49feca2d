import { describe, expect, it } from 'vitest';
import { prepareQuery, stageStored, storeSpectrum } from '../../../src/lib/search/prepare';
import { resolveSearchOptions } from '../../../src/lib/search/options';

describe('prepare', () => {
  it('stores bins and base-relative intensities as 32-bit floats', () => {
    const s = storeSpectrum([[43.2, 500], [41, 250], [0, 9], [57, NaN]]);
    expect(Array.from(s.bins)).toEqual([41, 43]);
    expect(Array.from(s.rel)).toEqual([0.5, 1]);
  });
  it('stages unit-norm weights and entropy intensities summing to 1', () => {
    const p = stageStored(storeSpectrum([[41, 250], [43, 1000], [57, 100]]), 1, { mz: 3, intensity: 0.6 });
    let ss = 0;
    let se = 0;
    for (let i = 0; i < p.n; i++) {
      ss += p.w[i] * p.w[i];
      se += p.e[i];
    }
    expect(ss).toBeCloseTo(1, 6);
    expect(se).toBeCloseTo(1, 6);
  });
  it('applies the cutoff and excluded ions to the query', () => {
    const q = prepareQuery([[18, 100], [28, 50], [43, 10], [44, 5], [57, 8]], resolveSearchOptions({ lowMassCutoff: 20, excludeIons: [44] }));
    expect(Array.from(q.bins)).toEqual([28, 43, 57]);
  });
});
