import { afterAll, describe, expect, it } from 'vitest';
import { SearchIndex } from '../../../src/lib/search/SearchIndex';
import { bruteForceSearch } from '../../../src/lib/search/bruteForceSearch';
import { closeSearchPool } from '../../../src/lib/search/pool';
import { SCORE_NAMES, type SearchOptions } from '../../../src/lib/search/types';
import { FILTER_CASES, keyOf, noisyQuery, randomLibrary, rng } from './helpers';

afterAll(() => closeSearchPool());

describe('SearchIndex', () => {
  it('equals brute force for every ranking score, over seeded random libraries (property test)', () => {
    for (let seed = 1; seed <= 6; seed++) {
      const entries = randomLibrary(seed, 400);
      const index = SearchIndex.build(entries);
      const r = rng(seed * 97);
      for (let qi = 0; qi < 8; qi++) {
        const q = noisyQuery(r, entries[Math.floor(r() * entries.length)].peaks);
        for (const rankBy of SCORE_NAMES) {
          const options: SearchOptions = { rankBy, limit: 1 + Math.floor(r() * 30) };
          const a = index.search(q, options);
          const b = bruteForceSearch(entries, q, options);
          expect(keyOf(a.hits)).toEqual(keyOf(b.hits));
          expect(a.searched).toBe(b.searched);
        }
      }
    }
  });

  it('applies filters inside the index: filtered search equals brute force with the same filter', () => {
    const entries = randomLibrary(21, 600);
    const index = SearchIndex.build(entries);
    const r = rng(8);
    for (const filters of FILTER_CASES) {
      for (let qi = 0; qi < 4; qi++) {
        const q = noisyQuery(r, entries[Math.floor(r() * entries.length)].peaks);
        for (const rankBy of SCORE_NAMES) {
          const a = index.search(q, { rankBy, limit: 10 }, filters);
          const b = bruteForceSearch(entries, q, { rankBy, limit: 10 }, filters);
          expect(keyOf(a.hits)).toEqual(keyOf(b.hits));
          expect(a.searched).toBe(b.searched);
          expect(a.hits.map((h) => h.riDelta)).toEqual(b.hits.map((h) => h.riDelta));
        }
      }
    }
  });

  it('equals brute force with other weights, a low-mass cutoff, excluded ions and a noise floor', () => {
    const entries = randomLibrary(33, 300);
    const index = SearchIndex.build(entries);
    const r = rng(4);
    const variants: SearchOptions[] = [
      { weights: { mz: 0, intensity: 1 } },
      { lowMassCutoff: 50 },
      { excludeIons: [18, 28, 32, 40, 44, 207, 281] },
      { noiseFloor: 0.05 },
    ];
    for (const v of variants) {
      const q = noisyQuery(r, entries[Math.floor(r() * entries.length)].peaks);
      for (const rankBy of SCORE_NAMES) {
        expect(keyOf(index.search(q, { ...v, rankBy }).hits)).toEqual(keyOf(bruteForceSearch(entries, q, { ...v, rankBy }).hits));
      }
    }
  });

  it('finds a spectrum as the top hit of itself with all four scores 1', () => {
    const entries = randomLibrary(2, 200).filter((e) => e.status === 'released');
    const index = SearchIndex.build(entries);
    const target = entries.find((e) => e.peaks.length > 5) ?? entries[0];
    const res = index.search(target.peaks, { rankBy: 'cosine' });
    const top = res.hits.find((h) => h.spectrumId === target.spectrumId);
    expect(top).toBeDefined();
    expect(res.hits[0].score).toBeCloseTo(1, 6);
    for (const s of SCORE_NAMES) expect(top?.scores[s]).toBeCloseTo(1, 6);
  });

  it('follows the library: upsert, replace, remove and compact stay exact', () => {
    const entries = randomLibrary(9, 300);
    const index = SearchIndex.build(entries.slice(0, 200), { maxPending: 50 });
    let current = new Map(entries.slice(0, 200).map((e) => [e.spectrumId, e]));
    const r = rng(77);
    const check = () => {
      const q = noisyQuery(r, entries[Math.floor(r() * entries.length)].peaks);
      for (const rankBy of SCORE_NAMES) {
        expect(keyOf(index.search(q, { rankBy, limit: 15 }).hits)).toEqual(keyOf(bruteForceSearch(current.values(), q, { rankBy, limit: 15 }).hits));
      }
      expect(index.size).toBe(current.size);
    };
    for (const e of entries.slice(200, 240)) {
      index.upsert(e);
      current.set(e.spectrumId, e);
    }
    check();
    const replaced = { ...entries[5], peaks: entries[250].peaks };
    index.upsert(replaced);
    current.set(replaced.spectrumId, replaced);
    expect(index.remove(entries[6].spectrumId)).toBe(true);
    current.delete(entries[6].spectrumId);
    expect(index.has(entries[6].spectrumId)).toBe(false);
    expect(index.remove(-1)).toBe(false);
    check();
    for (const e of entries.slice(240, 300)) {
      index.upsert(e); // passes maxPending: compacts
      current.set(e.spectrumId, e);
    }
    check();
    const fresh = SearchIndex.build(entries.slice(0, 100));
    fresh.libraryVersion = 42;
    index.replaceWith(fresh);
    current = new Map(entries.slice(0, 100).map((e) => [e.spectrumId, e]));
    expect(index.libraryVersion).toBe(42);
    check();
    expect(index.countByStatus('released')).toBe([...current.values()].filter((e) => e.status === 'released').length);
  });

  it('rejects bad options with the field at fault', () => {
    const index = SearchIndex.build(randomLibrary(1, 20));
    const q: [number, number][] = [[41, 1]];
    expect(() => index.search(q, { rankBy: 'dot' as never })).toThrow(/rankBy/);
    expect(() => index.search(q, { limit: 0 })).toThrow(/limit/);
    expect(() => index.search(q, { limit: 501 })).toThrow(/limit/);
    expect(() => index.search(q, { tolerance: 0.5 })).toThrow(/tolerance/);
    expect(() => index.search(q, {}, { massMax: 6000 })).toThrow(/massMax/);
  });

  it('returns nothing for a query with no usable peak', () => {
    const index = SearchIndex.build(randomLibrary(1, 20));
    expect(index.search([[0, 5], [41, -1]]).hits).toEqual([]);
  });

  it('searchAsync and searchBatch equal search', async () => {
    const entries = randomLibrary(12, 300);
    const index = SearchIndex.build(entries);
    const r = rng(1);
    const queries = Array.from({ length: 40 }, () => noisyQuery(r, entries[Math.floor(r() * entries.length)].peaks));
    const batch = await index.searchBatch(queries, { rankBy: 'composite', limit: 12 }, { status: ['released', 'draft'] });
    for (let i = 0; i < queries.length; i++) {
      const single = index.search(queries[i], { rankBy: 'composite', limit: 12 }, { status: ['released', 'draft'] });
      expect(keyOf(batch[i].hits)).toEqual(keyOf(single.hits));
      expect(keyOf((await index.searchAsync(queries[i], { limit: 12 })).hits)).toEqual(keyOf(index.search(queries[i], { limit: 12 }).hits));
    }
  });
});
