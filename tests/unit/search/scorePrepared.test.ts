import { describe, expect, it } from 'vitest';
import { cosineScore } from '../../../src/lib/search/cosineScore';
import { reverseCosineScore } from '../../../src/lib/search/reverseCosineScore';
import { compositeScore } from '../../../src/lib/search/compositeScore';
import { entropySimilarity } from '../../../src/lib/search/entropySimilarity';
import { prepareQuery } from '../../../src/lib/search/prepare';
import { resolveSearchOptions } from '../../../src/lib/search/options';
import { scoreMerged } from '../../../src/lib/search/scorePrepared';
import { weightPeaks } from '../../../src/lib/search/weightPeaks';
import { rng } from './helpers';

describe('scoreMerged', () => {
  it('gives the four reference scores in one merge', () => {
    const r = rng(5);
    const o = resolveSearchOptions({});
    for (let trial = 0; trial < 100; trial++) {
      const mk = () => Array.from({ length: 1 + Math.floor(r() * 25) }, () => [30 + Math.floor(r() * 60), 1 + r() * 99] as [number, number]);
      const a = mk();
      const b = mk();
      const qa = prepareQuery(a, o);
      const qb = prepareQuery(b, o);
      const out = new Float64Array(4);
      scoreMerged(qa.bins, qa.w, qa.e, qa.n, qa.norm, qb.bins, qb.w, qb.e, 0, qb.n, qb.norm, true, out);
      const binned = (p: [number, number][]) => {
        const m = new Map<number, number>();
        for (const [mz, i] of p) m.set(mz, (m.get(mz) ?? 0) + i);
        return [...m].sort((x, y) => x[0] - y[0]) as [number, number][];
      };
      const wa = weightPeaks(binned(a));
      const wb = weightPeaks(binned(b));
      expect(out[0]).toBeCloseTo(cosineScore(wa, wb), 12);
      expect(out[1]).toBeCloseTo(reverseCosineScore(wa, wb), 12);
      expect(out[2]).toBeCloseTo(compositeScore(wa, wb), 12);
      expect(out[3]).toBeCloseTo(entropySimilarity(binned(a), binned(b)), 12);
    }
  });
});
