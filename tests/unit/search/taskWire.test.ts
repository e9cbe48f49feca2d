import { describe, expect, it } from 'vitest';
import type { SearchTask, TaskHits } from '../../../src/lib/search/runSearchTask';
import { fromWire, packHits, toWire, unpackHits } from '../../../src/lib/search/taskWire';
import type { Peak } from '../../../src/lib/search/types';
import { rng } from './helpers';

const task = (queries: Peak[][]) => ({ kind: 'search', seg: null, allow: null, penalty: 0, options: null, queries, lo: 0, hi: 10 }) as unknown as SearchTask;

describe('a pool task on the wire', () => {
  it('packs numeric queries flat and gives them back peak for peak', () => {
    const r = rng(11);
    const queries: Peak[][] = [[], [[41, 12.5]], Array.from({ length: 80 }, () => [30 + r() * 600, r() * 999] as Peak), []];
    const w = toWire(task(queries));
    expect(w.queries).toBeNull();
    expect(w.packed?.ends).toEqual(Uint32Array.from([0, 1, 81, 81]));
    const back = fromWire(w);
    expect(back.queries).toEqual(queries);
    expect({ ...back, queries: null }).toEqual({ ...task(queries), queries: null });
  });

  it('sends queries with anything but numbers as they are, for the search to reject them the same way', () => {
    const odd: Peak[][] = [[[41, '12'] as unknown as Peak], [[43, 1]]];
    const w = toWire(task(odd));
    expect(w.packed).toBeNull();
    expect(fromWire(w).queries).toEqual(odd);
  });

  it('packs the hits of every query and unpacks them as views', () => {
    const parts: TaskHits[] = [0, 3, 1, 0, 5].map((n, i) => ({
      docs: Int32Array.from({ length: n }, (_, j) => 10 * i + j),
      rank: Float64Array.from({ length: n }, (_, j) => 1 - j / 10),
      scores: Float64Array.from({ length: 4 * n }, (_, j) => i + j / 100),
    }));
    const back = unpackHits(packHits(parts));
    expect(back.map((p) => [Array.from(p.docs), Array.from(p.rank), Array.from(p.scores)])).toEqual(parts.map((p) => [Array.from(p.docs), Array.from(p.rank), Array.from(p.scores)]));
  });
});
