import { describe, expect, it } from 'vitest';
import { TopK } from '../../../src/lib/search/topK';
import { heaviestFirst } from '../../../src/lib/search/searchSegment';
import { rng } from './helpers';

describe('TopK', () => {
  it('keeps the k best, ties by lower doc', () => {
    const r = rng(3);
    const items = Array.from({ length: 500 }, (_, d) => ({ d, s: Math.floor(r() * 20) / 20 }));
    // (k = 600: fewer items than k, the heap never fills.)
    for (const k of [1, 2, 7, 25, 100, 600]) {
      const top = new TopK(k);
      for (const it of items) top.push(it.s, it.d);
      const got = top.order().map((i) => top.doc[i]);
      const want = [...items].sort((a, b) => b.s - a.s || a.d - b.d).slice(0, k).map((x) => x.d);
      expect(got).toEqual(want);
    }
  });
  it('rejects k < 1', () => {
    expect(() => new TopK(0)).toThrow(RangeError);
  });
});

describe('heaviestFirst (the cosine kernels\' term order)', () => {
  it('orders terms by bound, heaviest first, ties by bin, as a sort does', () => {
    const r = rng(5);
    for (const T of [0, 1, 2, 3, 17, 73, 400]) {
      // Coarse bounds, so that many tie.
      const tU = Float64Array.from({ length: T }, () => Math.floor(r() * 8) / 8);
      const tBin = Array.from({ length: T }, (_, i) => i * 3 + Math.floor(r() * 3));
      const want = Array.from({ length: T }, (_, i) => i).sort((a, b) => tU[b] - tU[a] || tBin[a] - tBin[b]);
      expect(heaviestFirst(tU, tBin)).toEqual(want);
    }
  });
});
