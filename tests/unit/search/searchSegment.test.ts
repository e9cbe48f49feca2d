import { execFileSync } from 'node:child_process';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { SearchIndex } from '../../../src/lib/search/SearchIndex';
import { resolveIndexOptions, resolveSearchOptions } from '../../../src/lib/search/options';
import { buildSegment } from '../../../src/lib/search/segment';
import { prepareQuery } from '../../../src/lib/search/prepare';
import { bruteForceSegment, searchSegment, type KernelParams } from '../../../src/lib/search/searchSegment';
import { SCORE_NAMES } from '../../../src/lib/search/types';
import { entropyWeightsInto } from '../../../src/lib/search/entropyWeights';
import { scoreMerged } from '../../../src/lib/search/scorePrepared';
import { setSearchKernel, type SearchKernel } from '../../../src/lib/search/wasmKernel';
import { noisyQuery, randomLibrary, rng, sameFromBothKernels } from './helpers';
import { docPeaks, noisyReplicate, syntheticColumns } from '../../../bench/synthetic';

/** A synthetic library whose every third spectrum is steepened so its entropy falls below 3: its entropy weights are then raised to a power. */
function reweightedLibrary(count: number, seed: number) {
  const cols = syntheticColumns(count, seed);
  for (let d = 0; d < cols.count; d += 3) for (let j = cols.offsets[d]; j < cols.offsets[d + 1]; j++) cols.rel[j] = cols.rel[j] ** 6;
  return cols;
}

const asKeys = (r: { docs: Int32Array; rank: Float64Array }) => Array.from(r.docs, (d, i) => `${d}:${r.rank[i]}`);

describe.each(['wasm', 'js'] as SearchKernel[])('searchSegment (%s kernels)', (kernel) => {
  beforeAll(() => setSearchKernel(kernel));
  afterAll(() => setSearchKernel('wasm'));

  it('pruning never changes the top-k: pruned = unpruned = brute force (seeded libraries and queries)', () => {
    for (let seed = 1; seed <= 5; seed++) {
      const entries = randomLibrary(seed + 100, 800).map((e) => ({ ...e, status: 'released' as const }));
      const seg = SearchIndex.build(entries).segment;
      const r = rng(seed);
      for (let qi = 0; qi < 10; qi++) {
        const peaks = noisyQuery(r, entries[Math.floor(r() * entries.length)].peaks);
        for (const rankBy of SCORE_NAMES) {
          const o = resolveSearchOptions({ rankBy, limit: 1 + Math.floor(r() * 60) });
          const q = prepareQuery(peaks, o);
          const params: KernelParams = { k: o.limit, rankBy, allow: seg.live, penalty: 0, lo: 0, hi: seg.n, generic: null };
          const pruned = searchSegment(seg, q, params);
          const full = searchSegment(seg, q, { ...params, noPruning: true });
          const brute = bruteForceSegment(seg, q, params);
          expect(asKeys(pruned)).toEqual(asKeys(brute));
          expect(asKeys(full)).toEqual(asKeys(brute));
          expect(Array.from(pruned.scores)).toEqual(Array.from(brute.scores));
        }
      }
    }
  });

  it('reads fewer postings with pruning on m/z^3-weighted cosine', () => {
    const entries = randomLibrary(7, 2000).map((e) => ({ ...e, status: 'released' as const }));
    const seg = SearchIndex.build(entries).segment;
    const o = resolveSearchOptions({ rankBy: 'cosine', limit: 5 });
    const q = prepareQuery(entries[3].peaks, o);
    const params: KernelParams = { k: 5, rankBy: 'cosine', allow: seg.live, penalty: 0, lo: 0, hi: seg.n, generic: null };
    expect(searchSegment(seg, q, params).postings).toBeLessThan(searchSegment(seg, q, { ...params, noPruning: true }).postings);
  });

  it('gives the same top-k when the docs are split into ranges and merged', () => {
    const entries = randomLibrary(3, 500).map((e) => ({ ...e, status: 'released' as const }));
    const seg = SearchIndex.build(entries).segment;
    const o = resolveSearchOptions({ rankBy: 'composite', limit: 20 });
    const q = prepareQuery(noisyQuery(rng(2), entries[10].peaks), o);
    const base: KernelParams = { k: 20, rankBy: 'composite', allow: seg.live, penalty: 0, lo: 0, hi: seg.n, generic: null };
    const whole = searchSegment(seg, q, base);
    const parts = [searchSegment(seg, q, { ...base, hi: 200 }), searchSegment(seg, q, { ...base, lo: 200 })];
    const merged = parts
      .flatMap((p) => Array.from(p.docs, (d, i) => ({ d, s: p.rank[i] })))
      .sort((a, b) => b.s - a.s || a.d - b.d)
      .slice(0, 20)
      .map((x) => `${x.d}:${x.s}`);
    expect(merged).toEqual(asKeys(whole));
  });

  it('cosine MaxScore equals brute force on a skewed EI-like library, with duplicates, penalties and ranges', () => {
    // The benchmark's generator: peaks skewed to low m/z, so low-mass queries
    // see most docs (the sweep path) and high-mass ones few (the touched list).
    const cols = skewedLibrary(6000, 4242);
    const seg = SearchIndex.fromColumns(cols).segment;
    const r = rng(77);
    const level = { noise: 0.2, dropBelow: 0.02, dropP: 0.3, background: 3 };
    let sweeps = 0;
    for (let qi = 0; qi < 40; qi++) {
      const peaks = noisyReplicate(docPeaks(cols, Math.floor(r() * cols.count)), r, level);
      const k = [1, 10, 100, 300][qi % 4];
      const o = resolveSearchOptions({ rankBy: 'cosine', limit: k });
      const q = prepareQuery(peaks, o);
      const allow = new Uint8Array(seg.n);
      for (let d = 0; d < seg.n; d++) allow[d] = qi % 3 === 0 ? 1 : [0, 1, 1, 2][Math.floor(r() * 4)];
      const lo = qi % 5 === 0 ? 1000 : 0;
      const hi = qi % 7 === 0 ? 4500 : seg.n;
      const params: KernelParams = { k, rankBy: 'cosine', allow, penalty: 0.05, lo, hi, generic: null };
      const pruned = searchSegment(seg, q, params);
      const brute = bruteForceSegment(seg, q, params);
      expect(asKeys(pruned)).toEqual(asKeys(brute));
      expect(Array.from(pruned.scores)).toEqual(Array.from(brute.scores));
      if (pruned.postings > 0 && q.bins[q.n - 1] < 200) sweeps++;
    }
    expect(sweeps).toBeGreaterThan(0);
  });
});

/** A skewed EI-like library (the benchmark's generator) with some exact duplicates, so ties must fall back to doc order. */
function skewedLibrary(count: number, seed: number) {
  const cols = syntheticColumns(count, seed);
  for (let d = 0; d < count; d += 97) {
    const src = (d * 7) % count;
    const n = Math.min(cols.offsets[d + 1] - cols.offsets[d], cols.offsets[src + 1] - cols.offsets[src]);
    for (let i = 0; i < n; i++) {
      cols.bins[cols.offsets[d] + i] = cols.bins[cols.offsets[src] + i];
      cols.rel[cols.offsets[d] + i] = cols.rel[cols.offsets[src] + i];
    }
    for (let i = n; i < cols.offsets[d + 1] - cols.offsets[d]; i++) {
      cols.bins[cols.offsets[d] + i] = 700 + i;
      cols.rel[cols.offsets[d] + i] = 1e-3;
    }
  }
  return cols;
}

describe('the compiled cosine kernel', () => {
  afterAll(() => setSearchKernel('wasm'));

  it('keeps the segment in a shared WebAssembly memory', () => {
    const seg = SearchIndex.fromColumns(syntheticColumns(50, 1)).segment;
    expect(seg.memory).not.toBeNull();
    expect(seg.pDoc.buffer).toBe(seg.fW.buffer);
    expect(seg.pDoc.buffer).toBeInstanceOf(SharedArrayBuffer);
  });

  it('returns what the JavaScript kernel returns: the same hits to the bit, postings read and docs rescored', () => {
    const cols = skewedLibrary(8000, 9090);
    const seg = SearchIndex.fromColumns(cols).segment;
    const r = rng(31);
    const level = { noise: 0.2, dropBelow: 0.02, dropP: 0.3, background: 3 };
    for (let qi = 0; qi < 60; qi++) {
      const peaks = noisyReplicate(docPeaks(cols, Math.floor(r() * cols.count)), r, level);
      const k = [1, 5, 50, 100, 500][qi % 5];
      const q = prepareQuery(peaks, resolveSearchOptions({ rankBy: 'cosine', limit: k }));
      let allow = seg.live;
      if (qi % 3 !== 0) {
        allow = new Uint8Array(seg.n);
        for (let d = 0; d < seg.n; d++) allow[d] = [0, 1, 1, 2][Math.floor(r() * 4)];
      }
      const params: KernelParams = {
        k,
        rankBy: 'cosine',
        allow,
        penalty: qi % 3 === 0 ? 0 : 0.05,
        lo: qi % 5 === 0 ? 1500 : 0,
        hi: qi % 7 === 0 ? 6000 : seg.n,
        generic: null,
        noPruning: qi % 11 === 0,
      };
      sameFromBothKernels(seg, q, params);
    }
  });

  it('returns what the JavaScript kernel returns with bins past 65,535 (32-bit bin numbers)', () => {
    const base = syntheticColumns(3000, 77);
    const bins = Int32Array.from(base.bins);
    // Every 50th spectrum gets a heavy peak far out, so the segment stores 32-bit bins.
    for (let d = 0; d < base.count; d += 50) bins[base.offsets[d + 1] - 1] = 70_000 + (d % 7);
    const cols = { ...base, bins };
    const seg = SearchIndex.fromColumns(cols).segment;
    expect(seg.fBin).toBeInstanceOf(Int32Array);
    const r = rng(5);
    const level = { noise: 0.2, dropBelow: 0.02, dropP: 0.3, background: 3 };
    for (let qi = 0; qi < 20; qi++) {
      const peaks = noisyReplicate(docPeaks(cols, qi % 2 === 0 ? 50 * Math.floor(r() * 60) : Math.floor(r() * cols.count)), r, level);
      const q = prepareQuery(peaks, resolveSearchOptions({ rankBy: 'cosine', limit: 20 }));
      const params: KernelParams = { k: 20, rankBy: 'cosine', allow: seg.live, penalty: 0, lo: 0, hi: seg.n, generic: null };
      expect(asKeys(sameFromBothKernels(seg, q, params))).toEqual(asKeys(bruteForceSegment(seg, q, params)));
    }
  });

  it('computes the one-pass scores (composite, reverse cosine, entropy) as the JavaScript loops do: the same hits to the bit', () => {
    const cols = skewedLibrary(5000, 6060);
    const seg = SearchIndex.fromColumns(cols).segment;
    const r = rng(12);
    const level = { noise: 0.2, dropBelow: 0.02, dropP: 0.3, background: 3 };
    for (let qi = 0; qi < 30; qi++) {
      const rankBy = (['composite', 'reverseCosine', 'entropy'] as const)[qi % 3];
      const k = [1, 20, 100][qi % 3];
      const q = prepareQuery(noisyReplicate(docPeaks(cols, Math.floor(r() * cols.count)), r, level), resolveSearchOptions({ rankBy, limit: k }));
      let allow = seg.live;
      if (qi % 4 === 1) {
        allow = new Uint8Array(seg.n);
        for (let d = 0; d < seg.n; d++) allow[d] = [0, 1, 1, 2][Math.floor(r() * 4)];
      }
      const params: KernelParams = { k, rankBy, allow, penalty: 0.05, lo: qi % 5 === 0 ? 700 : 0, hi: qi % 7 === 0 ? 4100 : seg.n, generic: null };
      setSearchKernel('js');
      const js = searchSegment(seg, q, params);
      setSearchKernel('wasm');
      const wasm = searchSegment(seg, q, params);
      expect(asKeys(wasm)).toEqual(asKeys(js));
      expect(Array.from(wasm.scores)).toEqual(Array.from(js.scores));
      expect(asKeys(wasm)).toEqual(asKeys(bruteForceSegment(seg, q, params)));
      // (The entropy's logarithm is the module's own: its one-pass sums, and so the docs rescored, may differ in rare cases.)
      if (rankBy !== 'entropy') expect([wasm.postings, wasm.evaluated]).toEqual([js.postings, js.evaluated]);
    }
  });

  it("scores the hits as scoreMerged does: all four scores to the bit, reweighted entropy and penalties included", () => {
    const cols = reweightedLibrary(4000, 4242);
    const seg = SearchIndex.fromColumns(cols).segment;
    const r = rng(31);
    const level = { noise: 0.2, dropBelow: 0.02, dropP: 0.3, background: 3 };
    let reweighted = 0;
    for (let qi = 0; qi < 24; qi++) {
      const rankBy = SCORE_NAMES[qi % 4];
      const k = [1, 30, 100][qi % 3];
      const q = prepareQuery(noisyReplicate(docPeaks(cols, Math.floor(r() * cols.count)), r, level), resolveSearchOptions({ rankBy, limit: k }));
      let allow = seg.live;
      if (qi % 5 === 2) {
        allow = new Uint8Array(seg.n);
        for (let d = 0; d < seg.n; d++) allow[d] = [0, 1, 2][Math.floor(r() * 3)];
      }
      const params: KernelParams = { k, rankBy, allow, penalty: 0.1, lo: 0, hi: seg.n, generic: null };
      // (sameFromBothKernels holds the four scores of every hit to the JavaScript ones; the brute force scores with scoreMerged.)
      const wasm = rankBy === 'entropy' ? searchSegment(seg, q, params) : sameFromBothKernels(seg, q, params);
      const brute = bruteForceSegment(seg, q, params);
      expect(Array.from(wasm.docs)).toEqual(Array.from(brute.docs));
      expect(Array.from(wasm.scores)).toEqual(Array.from(brute.scores));
      for (const d of wasm.docs) if (seg.ePow[d] > 0) reweighted++;
    }
    expect(reweighted).toBeGreaterThan(0);
  });

  it("the first refresh picks from the first bin's heaviest postings: the same hits, postings and rescorings in both kernels, and brute force's hits", () => {
    // (Small lists, so a small library has them: bins of 64 postings or more keep their 32 heaviest.)
    const cols = skewedLibrary(6000, 7171);
    const io = resolveIndexOptions();
    const seg = buildSegment(cols, io.tolerance, io.weights, { postings: 32, minPostings: 64 });
    const r = rng(44);
    const level = { noise: 0.2, dropBelow: 0.02, dropP: 0.3, background: 3 };
    let listed = 0;
    for (let qi = 0; qi < 60; qi++) {
      const k = [1, 10, 30, 40][qi % 4];
      const q = prepareQuery(noisyReplicate(docPeaks(cols, Math.floor(r() * cols.count)), r, level), resolveSearchOptions({ rankBy: 'cosine', limit: k }));
      let allow = seg.live;
      if (qi % 3 === 1) {
        allow = new Uint8Array(seg.n);
        for (let d = 0; d < seg.n; d++) allow[d] = [0, 1, 1, 2][Math.floor(r() * 4)];
      }
      const params: KernelParams = { k, rankBy: 'cosine', allow, penalty: 0.05, lo: qi % 5 === 0 ? 900 : 0, hi: qi % 7 === 0 ? 4500 : seg.n, generic: null };
      const both = sameFromBothKernels(seg, q, params);
      expect(asKeys(both)).toEqual(asKeys(bruteForceSegment(seg, q, params)));
      // (Whether this query's first bin keeps its heaviest: the path is taken when k of them are in range and admitted.)
      let best = -1;
      let bin = -1;
      for (let i = 0; i < q.n; i++) {
        const b = q.bins[i];
        if (b < 0 || b >= seg.nBins || seg.pStart[b] === seg.pStart[b + 1]) continue;
        const u = (q.w[i] / q.norm) * seg.binMaxW[b];
        if (u > best) {
          best = u;
          bin = b;
        }
      }
      if (bin >= 0 && seg.pTopStart[bin + 1] > seg.pTopStart[bin]) listed++;
    }
    expect(listed).toBeGreaterThan(20);
  });

  it('keeps each long bin\'s heaviest postings, weight descending then doc', () => {
    const cols = skewedLibrary(3000, 99);
    const io = resolveIndexOptions();
    const seg = buildSegment(cols, io.tolerance, io.weights, { postings: 16, minPostings: 40 });
    let checked = 0;
    for (let b = 0; b < seg.nBins; b++) {
      const from = seg.pStart[b];
      const to = seg.pStart[b + 1];
      const kept = Array.from(seg.pTop.subarray(seg.pTopStart[b], seg.pTopStart[b + 1]));
      if (to - from < 40) {
        expect(kept).toEqual([]);
        continue;
      }
      const all = Array.from({ length: to - from }, (_, i) => from + i).sort((x, y) => seg.pW[y] - seg.pW[x] || x - y);
      expect(kept).toEqual(all.slice(0, 16));
      checked++;
    }
    expect(checked).toBeGreaterThan(10);
  });

  it('is what wasm/kernels.ts compiles to (scripts/build-wasm.mjs --check)', () => {
    expect(() => execFileSync(process.execPath, ['scripts/build-wasm.mjs', '--check'], { stdio: 'pipe' })).not.toThrow();
  }, 60_000);
});

describe('entropy weights of a stored spectrum from its parameters', () => {
  it('score a hit to the same bits as weighting every peak first (entropyWeightsInto into float32), by merge or by lookup', () => {
    const cols = reweightedLibrary(3000, 515);
    const seg = SearchIndex.fromColumns(cols).segment;
    const r = rng(8);
    const level = { noise: 0.2, dropBelow: 0.02, dropP: 0.3, background: 3 };
    const a = new Float64Array(4);
    const b = new Float64Array(4);
    let reweighted = 0;
    for (let qi = 0; qi < 20; qi++) {
      const q = prepareQuery(noisyReplicate(docPeaks(cols, Math.floor(r() * cols.count)), r, level), resolveSearchOptions({ rankBy: 'entropy' }));
      const qIdx = new Int32Array(seg.nBins).fill(-1);
      for (let i = 0; i < q.n; i++) if (q.bins[i] < seg.nBins) qIdx[q.bins[i]] = i;
      for (let t = 0; t < 150; t++) {
        const d = Math.floor(r() * seg.n);
        const s = seg.docStart[d];
        const e = seg.docStart[d + 1];
        const fE = new Float32Array(e - s);
        entropyWeightsInto(seg.fRel.subarray(s, e), fE);
        scoreMerged(q.bins, q.w, q.e, q.n, q.norm, seg.fBin.subarray(s, e), seg.fW.subarray(s, e), fE, 0, e - s, seg.docNorm[d], true, a);
        scoreMerged(q.bins, q.w, q.e, q.n, q.norm, seg.fBin, seg.fW, seg.fRel, s, e, seg.docNorm[d], true, b, 0, Float64Array.of(seg.eSum[d], seg.ePow[d], seg.eSumW[d]));
        expect(Array.from(b)).toEqual(Array.from(a));
        // And with the shared peaks found through the query's index by bin instead of a merge.
        scoreMerged(q.bins, q.w, q.e, q.n, q.norm, seg.fBin, seg.fW, seg.fRel, s, e, seg.docNorm[d], true, b, 0, Float64Array.of(seg.eSum[d], seg.ePow[d], seg.eSumW[d]), qIdx);
        expect(Array.from(b)).toEqual(Array.from(a));
        if (seg.ePow[d] > 0) reweighted++;
      }
    }
    expect(reweighted).toBeGreaterThan(0);
  });
});
