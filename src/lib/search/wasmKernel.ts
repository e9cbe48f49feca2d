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

type ArrayCtor<T> = { new (buffer: ArrayBufferLike, byteOffset: number, length: number): T; BYTES_PER_ELEMENT: number };

/** Bytes an array takes in an arena: 8-byte aligned, at least one element. */
const aligned = (Ctor: ArrayCtor<unknown>, length: number) => (Math.max(1, length) * Ctor.BYTES_PER_ELEMENT + 7) & ~7;

/**
 * One thread's scratch for a segment of n docs and nBins bins, in the order
 * of the header the kernels read (wasm/kernels.ts: the start of cosine() and
 * of onePass(); header slot i holds entry i's byte offset).
 */
function scratchLayout(n: number, nBins: number) {
  const k = MAX_LIMIT;
  return {
    acc: [Float32Array, 2 * n],
    // (Unused since the kernel reads seen from a doc's state bits; the slot keeps the header's places.)
    spare: [Uint8Array, 0],
    touched: [Int32Array, n],
    candD: [Int32Array, n + 1],
    candV: [Float64Array, n],
    candS: [Int32Array, n],
    qDense: [Float64Array, nBins],
    bucket: [Int32Array, 257],
    hist: [Float64Array, 1025],
    heapS: [Float64Array, k],
    heapD: [Int32Array, k],
    pickS: [Float64Array, k],
    pickD: [Int32Array, k],
    oQ: [Float64Array, nBins],
    oFrom: [Uint32Array, nBins],
    oTo: [Uint32Array, nBins],
    R: [Float64Array, nBins + 1],
    Q: [Float64Array, nBins + 1],
    out: [Float64Array, 4],
    // (The kernels take the mask's offset as an argument; it has a slot all the same.)
    allow: [Uint8Array, n],
    st: [Float64Array, 4 * n],
    cur: [Uint32Array, nBins],
    oA: [Float64Array, nBins],
    // The hits' scores (scoreHits): the hit docs, their four scores, and the
    // query by bin (its peak index there, -1 elsewhere) and by peak.
    hitD: [Int32Array, k],
    hitOut: [Float64Array, 4 * k],
    qIdx: [Int32Array, nBins],
    qW: [Float64Array, nBins],
    qE: [Float64Array, nBins],
    qEH: [Float64Array, nBins],
    // A hit's shared peaks while scoreHits scores it: the doc's peak index and the query's.
    shJ: [Uint32Array, nBins],
    shI: [Int32Array, nBins],
  } as const;
}

const HEADER_BYTES = 128;

/** Bytes of one thread's scratch (header and arrays). */
function scratchBytes(n: number, nBins: number): number {
  let bytes = HEADER_BYTES;
  for (const [Ctor, length] of Object.values(scratchLayout(n, nBins))) bytes += aligned(Ctor, length);
  return bytes;
}

/** Bump allocator over a region of a shared memory (8-byte aligned). A segment's arena leaves the first page to the module. */
export class Arena {
  readonly memory: WebAssembly.Memory;
  private at: number;
  private readonly end: number;
  constructor(memory: WebAssembly.Memory, start: number, end: number) {
    this.memory = memory;
    this.at = start;
    this.end = end;
  }

  /** An arena for `bytes` of arrays of a segment of n docs, or null (no WebAssembly, or too large). */
  static create(bytes: number, n: number, nBins: number): Arena | null {
    if (kernelModule() === null) return null;
    const pages = Math.ceil((PAGE + bytes + 8 * 32) / PAGE);
    const scratchPages = Math.ceil(scratchBytes(n, nBins) / PAGE);
    if (pages + scratchPages > MAX_PAGES) return null;
    try {
      const memory = new WebAssembly.Memory({ initial: pages, maximum: Math.min(MAX_PAGES, pages + SCRATCH_SLOTS * scratchPages), shared: true });
      return new Arena(memory, PAGE, pages * PAGE);
    } catch {
      return null;
    }
  }

  take<T>(Ctor: ArrayCtor<T>, length: number): T {
    const at = this.at;
    this.at = at + aligned(Ctor, length);
    if (this.at > this.end) throw new RangeError('arena overflow');
    return new Ctor(this.memory.buffer, at, length);
  }
}

/** One thread's state for the compiled kernel on one segment. */
export interface WasmScratch {
  cosine: (...args: number[]) => void;
  onePass: (...args: number[]) => number;
  scoreHits: (...args: number[]) => void;
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
  hitD: Int32Array;
  hitOut: Float64Array;
  /** The query's peak index by bin (-1 elsewhere: kept so between searches). */
  qIdx: Int32Array;
  qW: Float64Array;
  qE: Float64Array;
  qEH: Float64Array;
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
  // (log and pow: the engine's own, so the hits' entropy is scoreMerged's to the bit.)
  const instance = new WebAssembly.Instance(mod, { env: { memory, pow: Math.pow } });
  const region = new Arena(memory, base + HEADER_BYTES, base + Math.ceil(bytes / PAGE) * PAGE);
  const layout = scratchLayout(n, nBins);
  const views = {} as { [K in keyof typeof layout]: InstanceType<(typeof layout)[K][0]> };
  const offsets: number[] = [];
  for (const [name, [Ctor, length]] of Object.entries(layout) as [keyof typeof layout, (typeof layout)[keyof typeof layout]][]) {
    const view = region.take(Ctor as ArrayCtor<ArrayBufferView>, length);
    (views as Record<string, ArrayBufferView>)[name] = view;
    offsets.push(view.byteOffset);
  }
  new Uint32Array(memory.buffer, base, HEADER_BYTES / 4).set(offsets);
  const { qDense, oQ, oFrom, oTo, R, Q, heapS, heapD, out, allow, st, touched, oA, hitD, hitOut, qIdx, qW, qE, qEH } = views;
  qIdx.fill(-1);
  return {
    cosine: instance.exports.cosine as (...args: number[]) => void,
    onePass: instance.exports.onePass as (...args: number[]) => number,
    scoreHits: instance.exports.scoreHits as (...args: number[]) => void,
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
    hitD,
    hitOut,
    qIdx,
    qW,
    qE,
    qEH,
  };
}
