import { describe, expect, it } from 'vitest';
import { TopK } from '../../../src/lib/search/topK';
import { rng } from './helpers';

describe('TopK', () => {
  it('keeps the k best, ties by lower doc', () => {
    const r = rng(3);
    const items = Array.from({ length: 500 }, (_, d) => ({ d, s: Math.floor(r() * 20) / 20 }));
    const top = new TopK(25);
    for (const it of items) top.push(it.s, it.d);
    const got = top.order().map((i) => top.doc[i]);
    const want = [...items].sort((a, b) => b.s - a.s || a.d - b.d).slice(0, 25).map((x) => x.d);
    expect(got).toEqual(want);
  });
  it('rejects k < 1', () => {
    expect(() => new TopK(0)).toThrow(RangeError);
  });
});
