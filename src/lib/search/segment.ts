import { entropyParams } from './entropyWeights';
import { stageInto } from './prepare';
import { Arena } from './wasmKernel';
import type { PeakWeights } from './types';

/**
 * Library spectra in stored form, column by column (the fast way in: no
 * object per spectrum or per peak). Spectrum d owns peaks offsets[d] ..
 * offsets[d+1]-1, with bins sorted ascending and unique, and `rel` the
 * intensity relative to the base peak in (0, 1].
 */
export interface StoredColumns {
  count: number;
  offsets: ArrayLike<number>;
  bins: ArrayLike<number>;
  rel: Float32Array;
  recordIds: ArrayLike<number>;
  spectrumIds: ArrayLike<number>;
}

/**
 * The immutable, shared-memory part of the index. Every array lives in a
 * SharedArrayBuffer, so worker threads read the same memory without copies
 * (posting a Segment to a worker shares the buffers). Spectra ("docs") are
 * ordered by (recordId, spectrumId), so doc order is the tie-break order.
 */
export interface Segment {
  id: number;
  n: number;
  nPeaks: number;
  /** Largest bin + 1. */
  nBins: number;
  tolerance: number;
  weights: PeakWeights;
  maxDocPeaks: number;
  // Forward storage, doc by doc.
  docStart: Uint32Array;
  fBin: Uint16Array | Int32Array;
  /** Unit-norm m/z^a * I^b weights. */
  fW: Float32Array;
  /** Intensity relative to the base peak, for searches with other options. */
  fRel: Float32Array;
  /** sqrt(sum fW^2) per doc as stored. */
  docNorm: Float64Array;
  /**
   * Per doc, its entropy weights' parameters (entropyParams of fRel: sum,
   * exponent, reweighted sum), so a hit's entropy weights are computed for
   * its shared peaks only, to the same bits as entropyWeightsInto.
   */
  eSum: Float64Array;
  ePow: Float64Array;
  eSumW: Float64Array;
  recordId: Float64Array;
  spectrumId: Float64Array;
  // Inverted index: bin -> docs (ascending) with their weight.
  pStart: Uint32Array;
  pDoc: Uint32Array;
  pW: Float32Array;
  /** Entropy intensities (Li et al. 2021 preprocessing, summing to 1 per doc), per posting. */
  pE: Float32Array;
  binMaxW: Float32Array;
  binMaxE: Float32Array;
  /**
   * Per bin with at least TOP_MIN_POSTINGS postings, its TOP_POSTINGS
   * heaviest ones (posting indices, weight descending, then doc) at
   * pTop[pTopStart[b]] .. pTop[pTopStart[b + 1]]; other bins have none. A
   * cosine search's first refresh picks from them instead of every doc of
   * its first bin (see cosineMaxScore).
   */
  pTopStart: Uint32Array;
  pTop: Uint32Array;
  /** 1 while a doc is current, 0 once removed or replaced (shared, mutable). */
  live: Uint8Array;
  /**
   * The shared WebAssembly memory every array above lives in (see
   * wasmKernel.ts), so the compiled kernels can read them; null when
   * they are plain SharedArrayBuffers (no WebAssembly, or too large).
   */
  memory: WebAssembly.Memory | null;
}

let nextSegmentId = 1;

function sharedArray<T>(Ctor: { new (buffer: SharedArrayBuffer, byteOffset: number, length: number): T; BYTES_PER_ELEMENT: number }, length: number): T {
  return new Ctor(new SharedArrayBuffer(Math.max(1, length) * Ctor.BYTES_PER_ELEMENT), 0, length);
}

/** Build a segment from stored spectra. Empty docs are kept (they match nothing). */
/** How many heaviest postings the long bins keep (TOP_POSTINGS, TOP_MIN_POSTINGS; smaller in tests, so small libraries have them). */
export interface TopPostings {
  postings: number;
  minPostings: number;
}

export function buildSegment(cols: StoredColumns, tolerance: number, weights: PeakWeights, top: TopPostings = { postings: TOP_POSTINGS, minPostings: TOP_MIN_POSTINGS }): Segment {
  const { count, offsets, bins, rel, recordIds, spectrumIds } = cols;
  let sorted = true;
  for (let d = 1; d < count && sorted; d++) {
    if (recordIds[d] < recordIds[d - 1] || (recordIds[d] === recordIds[d - 1] && spectrumIds[d] <= spectrumIds[d - 1])) sorted = false;
  }
  let order: Uint32Array;
  if (sorted) {
    order = new Uint32Array(count);
    for (let d = 0; d < count; d++) order[d] = d;
  } else {
    const idx = Array.from({ length: count }, (_, d) => d);
    idx.sort((a, b) => recordIds[a] - recordIds[b] || spectrumIds[a] - spectrumIds[b]);
    order = Uint32Array.from(idx);
  }
  let nPeaks = 0;
  let maxBin = 0;
  let maxDocPeaks = 0;
  for (let d = 0; d < count; d++) {
    const len = offsets[d + 1] - offsets[d];
    nPeaks += len;
    if (len > maxDocPeaks) maxDocPeaks = len;
  }
  for (let j = 0; j < offsets[count]; j++) if (bins[j] > maxBin) maxBin = bins[j];
  const nBins = maxBin + 1;
  const wideBins = nBins > 65536;

  // Every array in one shared WebAssembly memory when possible (8-byte aligned each), else one SharedArrayBuffer each.
  const al = (bytes: number) => (Math.max(1, bytes) + 7) & ~7;
  // (The bins' top postings take at most nPeaks / minPostings x postings entries.)
  const topBound = Math.floor(nPeaks / top.minPostings) * top.postings;
  const bytes =
    al(4 * (count + 1)) + al((wideBins ? 4 : 2) * nPeaks) + 5 * al(4 * nPeaks) + 6 * al(8 * count) + al(count) + 2 * al(4 * (nBins + 1)) + 2 * al(4 * nBins) + al(4 * topBound);
  const arena = count > 0 ? Arena.create(bytes, count, nBins) : null;
  const shared = <T>(Ctor: { new (buffer: ArrayBufferLike, byteOffset: number, length: number): T; BYTES_PER_ELEMENT: number }, length: number): T =>
    arena ? arena.take(Ctor, length) : sharedArray(Ctor, length);

  const docStart = shared(Uint32Array, count + 1);
  const fBin = wideBins ? shared(Int32Array, nPeaks) : shared(Uint16Array, nPeaks);
  const fW = shared(Float32Array, nPeaks);
  const fE = new Float32Array(nPeaks); // only to fill the postings; the forward side recomputes it from fRel
  const fRel = shared(Float32Array, nPeaks);
  const docNorm = shared(Float64Array, count);
  const eSum = shared(Float64Array, count);
  const ePow = shared(Float64Array, count);
  const eSumW = shared(Float64Array, count);
  const recordId = shared(Float64Array, count);
  const spectrumId = shared(Float64Array, count);
  const live = shared(Uint8Array, count);
  const binCount = new Uint32Array(nBins + 1);

  const tmpBins = new Int32Array(maxDocPeaks);
  const tmpW = new Float32Array(maxDocPeaks);
  const tmpE = new Float32Array(maxDocPeaks);
  let at = 0;
  for (let d = 0; d < count; d++) {
    const src = order[d];
    const s = offsets[src];
    const e = offsets[src + 1];
    docStart[d] = at;
    const { n, norm } = stageInto(bins, rel, s, e, tolerance, weights, 0, 0, [], tmpBins, tmpW, tmpE);
    for (let i = 0; i < n; i++) {
      fBin[at + i] = tmpBins[i];
      fW[at + i] = tmpW[i];
      fE[at + i] = tmpE[i];
      fRel[at + i] = rel[s + i];
      binCount[tmpBins[i]]++;
    }
    at += n;
    docNorm[d] = norm;
    const ep = entropyParams(fRel, docStart[d], at);
    eSum[d] = ep.sum;
    ePow[d] = ep.pow;
    eSumW[d] = ep.sumW;
    recordId[d] = recordIds[src];
    spectrumId[d] = spectrumIds[src];
    live[d] = 1;
  }
  docStart[count] = at;

  const pStart = shared(Uint32Array, nBins + 1);
  let acc = 0;
  for (let b = 0; b < nBins; b++) {
    pStart[b] = acc;
    acc += binCount[b];
  }
  pStart[nBins] = acc;
  const pDoc = shared(Uint32Array, at);
  const pW = shared(Float32Array, at);
  const pE = shared(Float32Array, at);
  const binMaxW = shared(Float32Array, nBins);
  const binMaxE = shared(Float32Array, nBins);
  const fill = binCount; // reuse as a cursor per bin
  for (let b = 0; b < nBins; b++) fill[b] = pStart[b];
  for (let d = 0; d < count; d++) {
    for (let j = docStart[d]; j < docStart[d + 1]; j++) {
      const b = fBin[j];
      const k = fill[b]++;
      pDoc[k] = d;
      const w = fW[j];
      pW[k] = w;
      pE[k] = fE[j];
      if (w > binMaxW[b]) binMaxW[b] = w;
      if (fE[j] > binMaxE[b]) binMaxE[b] = fE[j];
    }
  }
  const pTopStart = shared(Uint32Array, nBins + 1);
  let nTop = 0;
  for (let b = 0; b < nBins; b++) {
    pTopStart[b] = nTop;
    if (pStart[b + 1] - pStart[b] >= top.minPostings) nTop += top.postings;
  }
  pTopStart[nBins] = nTop;
  const pTop = shared(Uint32Array, nTop);
  for (let b = 0; b < nBins; b++) if (pTopStart[b + 1] > pTopStart[b]) heaviestPostings(pW, pStart[b], pStart[b + 1], pTop, pTopStart[b], top.postings);
  return {
    id: nextSegmentId++ + Math.floor(Math.random() * 1e6) * 1e6,
    n: count,
    nPeaks: at,
    nBins,
    tolerance,
    weights: { ...weights },
    maxDocPeaks,
    docStart,
    fBin,
    fW,
    fRel,
    docNorm,
    eSum,
    ePow,
    eSumW,
    recordId,
    spectrumId,
    pStart,
    pDoc,
    pW,
    pE,
    binMaxW,
    binMaxE,
    pTopStart,
    pTop,
    live,
    memory: arena ? arena.memory : null,
  };
}

/** Postings a bin keeps among its heaviest (pTop): enough for a search of up to 256 hits, and for a top-100 search over half the docs (a pool task's range) to find its 100 there. */
export const TOP_POSTINGS = 256;
/** The least postings of a bin that keeps its heaviest (a shorter bin is read whole, which costs little). */
export const TOP_MIN_POSTINGS = 16 * TOP_POSTINGS;

/**
 * The m heaviest postings of from..to (weight descending, then posting
 * index, which is doc order) into out[at..at + m], through a heap of the m
 * best so far: a posting below its root, most of them, costs one comparison.
 */
export function heaviestPostings(pW: Float32Array, from: number, to: number, out: Uint32Array, at: number, m: number): void {
  const hj = new Uint32Array(m);
  let size = 0;
  // worse(i, j): heap entry i ranks after entry j (lighter, or as heavy and later).
  const worse = (i: number, j: number) => pW[hj[i]] < pW[hj[j]] || (pW[hj[i]] === pW[hj[j]] && hj[i] > hj[j]);
  const down = (from0: number, n: number) => {
    let i = from0;
    for (;;) {
      const l = 2 * i + 1;
      const r = l + 1;
      let w = i;
      if (l < n && worse(l, w)) w = l;
      if (r < n && worse(r, w)) w = r;
      if (w === i) return;
      const t = hj[i];
      hj[i] = hj[w];
      hj[w] = t;
      i = w;
    }
  };
  for (let j = from; j < to; j++) {
    if (size < m) {
      hj[size] = j;
      let i = size++;
      while (i > 0) {
        const parent = (i - 1) >> 1;
        if (!worse(i, parent)) break;
        const t = hj[i];
        hj[i] = hj[parent];
        hj[parent] = t;
        i = parent;
      }
    } else if (pW[j] > pW[hj[0]]) {
      // (Later postings come in doc order, so one as heavy as the root ranks after it.)
      hj[0] = j;
      down(0, size);
    }
  }
  // Heapsort: the worst goes to the end each turn, so the array ends best first.
  for (let n = size - 1; n > 0; n--) {
    const t = hj[0];
    hj[0] = hj[n];
    hj[n] = t;
    down(0, n);
  }
  for (let i = 0; i < size; i++) out[at + i] = hj[i];
}

/** Bytes held by a segment's typed arrays (forward storage, postings and per-doc columns). */
export function segmentBytes(seg: Segment): number {
  const arrays = [seg.docStart, seg.fBin, seg.fW, seg.fRel, seg.docNorm, seg.eSum, seg.ePow, seg.eSumW, seg.recordId, seg.spectrumId, seg.pStart, seg.pDoc, seg.pW, seg.pE, seg.binMaxW, seg.binMaxE, seg.pTopStart, seg.pTop, seg.live];
  let bytes = 0;
  for (const a of arrays) bytes += a.byteLength;
  return bytes;
}
