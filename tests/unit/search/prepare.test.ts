import { describe, expect, it } from 'vitest';
import { prepareQuery, prepareQueryStaged, stageStored, storeSpectrum } from '../../../src/lib/search/prepare';
import type { Peak } from '../../../src/lib/search/types';
import { rng } from './helpers';
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
  it('prepares a query in one pass to the bits of the stage-by-stage definition', () => {
    const r = rng(41);
    const junk: unknown[] = [[NaN, 5], [57, -1], [0, 3], ['58', 4], [59, '1'], null, 7, [Infinity, 2], [60, 0]];
    let onePass = 0;
    for (let t = 0; t < 600; t++) {
      const tolerance = [1, 1, 0.5, 0.1, 2, 0.3][t % 6];
      const n = Math.floor(r() * 120);
      const peaks: Peak[] = [];
      for (let i = 0; i < n; i++) {
        // Unit-mass peaks, some split across neighbouring m/z in one bin, some repeated.
        const mz = 30 + Math.floor(r() * 600) + (r() < 0.2 ? Math.floor(r() * 5) / 10 : 0);
        peaks.push([mz, r() < 0.1 ? r() * 1e-6 : Math.floor(r() * 10000) / 7]);
        if (r() < 0.05) peaks.push([mz, r() * 50]);
        if (r() < 0.03) peaks.push(junk[Math.floor(r() * junk.length)] as Peak);
      }
      if (t % 3 === 0) peaks.sort((a, b) => (Array.isArray(a) && Array.isArray(b) ? Number(a[0]) - Number(b[0]) : 0));
      // Every tenth a profile scan (points 0.1 apart), which goes through the stages.
      if (t % 10 === 9) for (let i = 0; i < 40; i++) peaks.push([100 + i / 10, 1000 * Math.exp(-((i - 20) ** 2) / 30)]);
      // (Other bin widths than the index's are the stages' business, so they are set past the options' check.)
      const o = { ...resolveSearchOptions({ excludeIons: t % 4 === 0 ? [57] : [], lowMassCutoff: t % 5 === 0 ? 40 : 0 }), tolerance };
      const got = prepareQuery(peaks, o);
      const want = prepareQueryStaged(peaks, o);
      expect([got.n, got.norm, Array.from(got.bins), Array.from(got.w), Array.from(got.e)]).toEqual([want.n, want.norm, Array.from(want.bins), Array.from(want.w), Array.from(want.e)]);
      if (t % 10 !== 9) onePass++;
    }
    expect(onePass).toBeGreaterThan(500);
    expect(prepareQuery([], resolveSearchOptions({})).n).toBe(0);
    expect(() => prepareQuery([[41, 1]], { ...resolveSearchOptions({}), tolerance: 0 })).toThrow(RangeError);
  });
});
