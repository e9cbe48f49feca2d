import { afterAll, describe, expect, it } from 'vitest';
import { SearchIndex } from '../../../src/lib/search/SearchIndex';
import { resolveSearchOptions } from '../../../src/lib/search/options';
import { prepareQuery } from '../../../src/lib/search/prepare';
import { bruteForceSegment, type KernelParams } from '../../../src/lib/search/searchSegment';
import { Arena, searchKernel, kernelModule, setSearchKernel, wasmScratch } from '../../../src/lib/search/wasmKernel';
import { docPeaks, noisyReplicate, rng, syntheticColumns } from '../../../bench/synthetic';
import { sameFromBothKernels } from './helpers';

describe('wasmKernel', () => {
  afterAll(() => setSearchKernel('wasm'));

  it('compiles the kernel module here', () => {
    expect(kernelModule()).toBeInstanceOf(WebAssembly.Module);
    expect(searchKernel()).toBe('wasm');
  });

  it('carves 8-byte-aligned arrays from one shared memory, after a first page left to the module, and refuses to overflow it', () => {
    const arena = Arena.create(1000, 10, 10);
    expect(arena).not.toBeNull();
    const a = arena!.take(Uint8Array, 3);
    const b = arena!.take(Float64Array, 2);
    expect(a.byteOffset).toBe(65536);
    expect(b.byteOffset % 8).toBe(0);
    expect(b.byteOffset).toBeGreaterThanOrEqual(a.byteOffset + 3);
    expect(b.buffer).toBe(a.buffer);
    expect(a.buffer).toBeInstanceOf(SharedArrayBuffer);
    expect(() => arena!.take(Uint8Array, 1 << 20)).toThrow(RangeError);
  });

  it('gives no scratch on a memory that cannot grow, and the search then runs the JavaScript kernel with the same hits', () => {
    expect(wasmScratch(new WebAssembly.Memory({ initial: 1, maximum: 1, shared: true }), 100, 100)).toBeNull();
    const cols = syntheticColumns(2000, 3);
    const seg = SearchIndex.fromColumns(cols).segment;
    // The same arrays, but a memory the scratch cannot be grown into (and a new id, so no scratch is cached).
    const stuck = { ...seg, id: seg.id + 0.5, memory: new WebAssembly.Memory({ initial: 1, maximum: 1, shared: true }) };
    const r = rng(4);
    for (let i = 0; i < 10; i++) {
      const q = prepareQuery(noisyReplicate(docPeaks(cols, Math.floor(r() * cols.count)), r, { noise: 0.2, dropBelow: 0.02, dropP: 0.3, background: 3 }), resolveSearchOptions({ rankBy: 'cosine', limit: 25 }));
      const params: KernelParams = { k: 25, rankBy: 'cosine', allow: seg.live, penalty: 0, lo: 0, hi: seg.n, generic: null };
      const fallback = sameFromBothKernels(seg, q, params, stuck);
      expect(Array.from(fallback.docs)).toEqual(Array.from(bruteForceSegment(seg, q, params).docs));
    }
  });
});
