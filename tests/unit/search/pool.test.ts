import { afterAll, describe, expect, it } from 'vitest';
import { SearchIndex } from '../../../src/lib/search/SearchIndex';
import { closeSearchPool, getSearchPool, locateSearchWorker } from '../../../src/lib/search/pool';
import { runSearchTask } from '../../../src/lib/search/runSearchTask';
import { resolveSearchOptions } from '../../../src/lib/search/options';
import { SCORE_NAMES } from '../../../src/lib/search/types';
import { noisyQuery, randomLibrary, rng } from './helpers';

afterAll(() => closeSearchPool());

describe('search worker pool', () => {
  it('finds the worker (the TypeScript source under vitest, unless a bundle or SEARCH_WORKER_FILE is given)', () => {
    const loc = locateSearchWorker();
    expect(loc).not.toBeNull();
    expect(['typescript', 'bundle', 'env']).toContain(loc?.source);
  });

  it('returns the in-thread results for a batch, through shared memory', async () => {
    const entries = randomLibrary(44, 500);
    const index = SearchIndex.build(entries);
    const pool = getSearchPool();
    expect(pool).not.toBeNull();
    const r = rng(9);
    const queries = Array.from({ length: 20 }, () => noisyQuery(r, entries[Math.floor(r() * entries.length)].peaks));
    for (const rankBy of SCORE_NAMES) {
      const options = resolveSearchOptions({ rankBy, limit: 25 });
      const task = { kind: 'search' as const, seg: index.segment, allow: null, penalty: 0, options, queries, lo: 0, hi: index.segment.n };
      const fromPool = await pool!.run(task);
      const inThread = runSearchTask(task);
      expect(fromPool.map((h) => Array.from(h.docs))).toEqual(inThread.map((h) => Array.from(h.docs)));
      expect(fromPool.map((h) => Array.from(h.scores))).toEqual(inThread.map((h) => Array.from(h.scores)));
    }
  });

  it('sees removals made after the segment was shared (live flags in shared memory)', async () => {
    const entries = randomLibrary(45, 200).map((e) => ({ ...e, status: 'released' as const }));
    const index = SearchIndex.build(entries);
    const target = entries[17];
    const before = await index.searchBatch([target.peaks, target.peaks], { rankBy: 'cosine' });
    expect(before[0].hits.some((h) => h.spectrumId === target.spectrumId)).toBe(true);
    index.remove(target.spectrumId);
    const after = await index.searchBatch([target.peaks, target.peaks], { rankBy: 'cosine' });
    expect(after[0].hits.some((h) => h.spectrumId === target.spectrumId)).toBe(false);
  });
});
