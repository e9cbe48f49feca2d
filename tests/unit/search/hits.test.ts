import { describe, expect, it } from 'vitest';
import type { EntryMeta } from '../../../src/lib/search/filters';
import { hitsInOrder, toHits, type Candidate } from '../../../src/lib/search/hits';
import { rng } from './helpers';

// Docs are in (record id, spectrum id) order, as in a segment.
const meta = (d: number): EntryMeta => ({
  spectrumId: 100 + d,
  recordId: 10 + Math.floor(d / 2),
  version: 1,
  name: `compound ${d}`,
  formula: null,
  nominalMass: null,
  ihd: null,
  elements: [],
  tags: [],
  status: 'released',
  ri: d % 3 === 0 ? [{ phase: 'nonpolar', value: 1000 + d }] : [],
});

function kernelResult(n: number, seed: number) {
  const r = rng(seed);
  // Coarse scores, so that many tie; in kernel order: score descending, then doc.
  const rows = Array.from({ length: n }, () => ({ d: Math.floor(r() * 500), s: Math.floor(r() * 10) / 10 }));
  const seen = new Set<number>();
  const uniq = rows.filter((x) => !seen.has(x.d) && seen.add(x.d));
  uniq.sort((a, b) => b.s - a.s || a.d - b.d);
  const docs = Int32Array.from(uniq.map((x) => x.d));
  const rank = Float64Array.from(uniq.map((x) => x.s));
  const scores = Float64Array.from(uniq.flatMap((x) => [x.s, x.s / 2, x.s / 3, x.s / 4]));
  return { docs, rank, scores };
}

function viaCandidates(docs: Int32Array, rank: Float64Array, scores: Float64Array, limit: number, filters?: Parameters<typeof toHits>[2]) {
  const cands: Candidate[] = Array.from(docs, (d, i) => ({ score: rank[i], recordId: meta(d).recordId, spectrumId: meta(d).spectrumId, scores, at: 4 * i, doc: d, meta: null }));
  return toHits(cands, limit, filters, meta);
}

describe('hitsInOrder (the batch path without candidate objects)', () => {
  it('gives the hits toHits gives, ties and RI deltas included', () => {
    for (const [n, limit] of [[0, 5], [1, 5], [40, 10], [200, 50], [200, 500]]) {
      const { docs, rank, scores } = kernelResult(n, n + limit);
      const filters = { ri: { phase: 'nonpolar', value: 1010 } } as Parameters<typeof toHits>[2];
      expect(hitsInOrder(docs, rank, scores, limit, filters, meta)).toEqual(viaCandidates(docs, rank, scores, limit, filters));
      expect(hitsInOrder(docs, rank, scores, limit, undefined, meta)).toEqual(viaCandidates(docs, rank, scores, limit));
    }
  });

  it('declines arrays out of hit order, so that the caller sorts them', () => {
    const { docs, rank, scores } = kernelResult(100, 7);
    const i = rank.findIndex((s, j) => j > 0 && s < rank[j - 1]);
    // A lower score ahead of a higher one.
    const r2 = rank.slice();
    [r2[i - 1], r2[i]] = [r2[i], r2[i - 1]];
    expect(hitsInOrder(docs, r2, scores, 10, undefined, meta)).toBeNull();
    // A tie with the higher doc first.
    const t = rank.findIndex((s, j) => j > 0 && s === rank[j - 1]);
    const d2 = docs.slice();
    [d2[t - 1], d2[t]] = [d2[t], d2[t - 1]];
    expect(hitsInOrder(d2, rank, scores, 10, undefined, meta)).toBeNull();
  });
});
