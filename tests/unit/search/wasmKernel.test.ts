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

  // Reference: the engine's own Math.log (fdlibm's __ieee754_log), which the
  // brute-force entropy scores use; the hits' compiled scores use the port.
  it('takes logarithms to the bits of Math.log', () => {
    const memory = new WebAssembly.Memory({ initial: 1, maximum: 16, shared: true });
    const { logOf } = new WebAssembly.Instance(kernelModule() as WebAssembly.Module, { env: { memory, pow: Math.pow } }).exports as { logOf: (x: number) => number };
    let seed = 99;
    const next = () => (seed = (Math.imul(seed, 1664525) + 1013904223) >>> 0) / 4294967296;
    const bits = new Float64Array(1);
    const words = new Uint32Array(bits.buffer);
    const special = [0, -0, 1, 2, 0.5, Number.MIN_VALUE, 1e-310, Infinity, -Infinity, NaN, -1, 1 + 2 ** -52, 1 - 2 ** -53, Number.MAX_VALUE, Math.fround(1e-30)];
    const values: number[] = [...special];
    for (let i = 0; i < 400_000; i++) {
      values.push(2 * next()); // the range of entropy intensities and their sums
      values.push(Math.fround(next()) + Math.fround(next()) / 7);
      values.push(2 ** -Math.floor(next() * 60) * (1 + next() * 1e-6)); // near powers of two
      words[0] = next() * 4294967296;
      words[1] = next() * 2147483648; // any positive double
      values.push(bits[0]);
    }
    let differ = 0;
    for (const v of values) if (!Object.is(logOf(v), Math.log(v))) differ++;
    expect(differ).toBe(0);
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
