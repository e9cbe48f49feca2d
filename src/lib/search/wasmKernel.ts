// The compiled search kernels (wasm/kernels.ts) and the memory they work in.
//
// A segment's arrays are carved from one shared WebAssembly.Memory (its
// buffer is a SharedArrayBuffer, so workers still share them without copies),
// and each thread that searches a segment grows that memory once for its own
// scratch. Where WebAssembly or the memory is not available (or the segment
// is too large for a 32-bit memory), segments use plain SharedArrayBuffers and
// the JavaScript loops, which return the same hits.
import { KERNELS_WASM_BASE64 } from './kernelsWasm.generated';
import { MAX_LIMIT } from './options';

const PAGE = 65536;
/** WebAssembly's 32-bit memories: 4 GiB. */
const MAX_PAGES = 65536;
/** Scratch regions a segment's memory leaves room for (pool threads, the main thread, re-created scratch). */
const SCRATCH_SLOTS = 10;

let module: WebAssembly.Module | null | undefined;

/** The compiled kernel module, or null where WebAssembly is not available. */
export function kernelModule(): WebAssembly.Module | null {
  if (module === undefined) {
    try {
      module = new WebAssembly.Module(Buffer.from(KERNELS_WASM_BASE64, 'base64'));
    } catch {
      module = null;
    }
  }
  return module;
}

export type SearchKernel = 'wasm' | 'js';
let kernel: SearchKernel = process.env.SEARCH_KERNEL === 'js' ? 'js' : 'wasm';

/** Which kernels searches use (the cosine MaxScore and the one-pass scores): 'wasm' (default) or 'js' (`SEARCH_KERNEL=js`, or set here, for tests and the benchmark). */
export function searchKernel(): SearchKernel {
  return kernel;
}
export function setSearchKernel(k: SearchKernel): void {
  kernel = k;
}

/** Bytes of one thread's scratch for a segment of n docs and nBins bins. */
function scratchBytes(n: number, nBins: number): number {
  const k = MAX_LIMIT;
  return 128 + 4 * 2 * n + n + 4 * n + 4 * (n + 1) + 8 * n + 4 * n + 8 * nBins + 4 * 257 + 8 * 1025 + 2 * (12 * k) + nBins * 16 + 2 * 8 * (nBins + 1) + 32 + n + 32 * n + 4 * nBins + 8 * nBins + 16 * 24;
}

/** Bump allocator over a segment's shared memory (8-byte aligned; the first page is left to the module). */
export class Arena {
  readonly memory: WebAssembly.Memory;
  private at = PAGE;
  private constructor(memory: WebAssembly.Memory) {
    this.memory = memory;
  }

  /** An arena for `bytes` of arrays of a segment of n docs, or null (no WebAssembly, or too large). */
  static create(bytes: number, n: number, nBins: number): Arena | null {
    if (kernelModule() === null) return null;
    const pages = Math.ceil((PAGE + bytes + 8 * 32) / PAGE);
    const scratchPages = Math.ceil(scratchBytes(n, nBins) / PAGE);
    if (pages + scratchPages > MAX_PAGES) return null;
    try {
      const memory = new WebAssembly.Memory({ initial: pages, maximum: Math.min(MAX_PAGES, pages + SCRATCH_SLOTS * scratchPages), shared: true });
      return new Arena(memory);
    } catch {
      return null;
    }
  }

  take<T>(Ctor: { new (buffer: ArrayBufferLike, byteOffset: number, length: number): T; BYTES_PER_ELEMENT: number }, length: number): T {
    const at = this.at;
    this.at = (at + Math.max(1, length) * Ctor.BYTES_PER_ELEMENT + 7) & ~7;
    if (this.at > this.memory.buffer.byteLength) throw new RangeError('segment arena overflow');
    return new Ctor(this.memory.buffer, at, length);
  }
}

/** One thread's state for the compiled kernel on one segment. */
export interface WasmScratch {
  cosine: (...args: number[]) => void;
  onePass: (...args: number[]) => number;
  header: number;
  qDense: Float64Array;
  oQ: Float64Array;
  oFrom: Uint32Array;
  oTo: Uint32Array;
  R: Float64Array;
  Q: Float64Array;
  heapS: Float64Array;
  heapD: Int32Array;
  out: Float64Array;
  allow: Uint8Array;
  /** The one-pass scores' state, 4 numbers a doc (searchSegment.ts uses it as its own). */
  st: Float64Array;
  touched: Int32Array;
  /** Entropy intensities of the query's terms, for the one-pass entropy. */
  oA: Float64Array;
}

/** Grow the segment's memory by this thread's scratch and instantiate the kernel on it; null if that fails. */
export function wasmScratch(memory: WebAssembly.Memory, n: number, nBins: number): WasmScratch | null {
  const mod = kernelModule();
  if (mod === null) return null;
  let base: number;
  const bytes = scratchBytes(n, nBins);
  try {
    base = memory.grow(Math.ceil(bytes / PAGE)) * PAGE;
  } catch {
    return null;
  }
  const instance = new WebAssembly.Instance(mod, { env: { memory } });
  const buffer = memory.buffer;
  let at = base + 128;
  const take = <T>(Ctor: { new (buffer: ArrayBufferLike, byteOffset: number, length: number): T; BYTES_PER_ELEMENT: number }, length: number): [T, number] => {
    const p = at;
    at = (at + Math.max(1, length) * Ctor.BYTES_PER_ELEMENT + 7) & ~7;
    return [new Ctor(buffer, p, length), p];
  };
  const k = MAX_LIMIT;
  const header = new Uint32Array(buffer, base, 32);
  // The kernel reads these offsets in this order (wasm/kernels.ts, the start of cosine()).
  const ptrs: number[] = [];
  ptrs.push(take(Float32Array, 2 * n)[1]); // acc
  ptrs.push(take(Uint8Array, n)[1]); // seen
  const [touched, touchedP] = take(Int32Array, n);
  ptrs.push(touchedP);
  ptrs.push(take(Int32Array, n + 1)[1]); // candD
  ptrs.push(take(Float64Array, n)[1]); // candV
  ptrs.push(take(Int32Array, n)[1]); // candS
  const [qDense, qDenseP] = take(Float64Array, nBins);
  ptrs.push(qDenseP);
  ptrs.push(take(Int32Array, 257)[1]); // bucket
  ptrs.push(take(Float64Array, 1025)[1]); // hist
  const [heapS, heapSP] = take(Float64Array, k);
  const [heapD, heapDP] = take(Int32Array, k);
  ptrs.push(heapSP, heapDP);
  ptrs.push(take(Float64Array, k)[1], take(Int32Array, k)[1]); // pick heap
  const [oQ, oQP] = take(Float64Array, nBins);
  const [oFrom, oFromP] = take(Uint32Array, nBins);
  const [oTo, oToP] = take(Uint32Array, nBins);
  const [R, RP] = take(Float64Array, nBins + 1);
  const [Q, QP] = take(Float64Array, nBins + 1);
  const [out, outP] = take(Float64Array, 4);
  ptrs.push(oQP, oFromP, oToP, RP, QP, outP);
  const [allow] = take(Uint8Array, n);
  // The one-pass scores (onePass): header slots 20, 21, 22 (slot 19 is unused).
  ptrs.push(0);
  const [st, stP] = take(Float64Array, 4 * n);
  ptrs.push(stP, take(Uint32Array, nBins)[1]); // per-doc state, a cursor per bin
  const [oA, oAP] = take(Float64Array, nBins);
  ptrs.push(oAP);
  if (at > base + Math.ceil(bytes / PAGE) * PAGE) throw new RangeError('wasm scratch overflow');
  header.set(ptrs);
  return {
    cosine: instance.exports.cosine as (...args: number[]) => void,
    onePass: instance.exports.onePass as (...args: number[]) => number,
    header: base,
    qDense,
    oQ,
    oFrom,
    oTo,
    R,
    Q,
    heapS,
    heapD,
    out,
    allow,
    st,
    touched,
    oA,
  };
}
