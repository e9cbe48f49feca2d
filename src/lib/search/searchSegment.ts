import { stageInto, type PreparedSpectrum } from './prepare';
import { queryEntropyTerms, scoreMerged, SCORE_SLOT } from './scorePrepared';
import type { Segment } from './segment';
import { TopK } from './topK';
import type { PeakWeights, ScoreName } from './types';
import { searchKernel, wasmScratch, type WasmScratch } from './wasmKernel';
import { MAX_LIMIT } from './options';

const LN4 = Math.log(4);
/**
 * Slack between values accumulated from the 32-bit stored weights (bounds,
 * one-pass approximations) and the exact 64-bit scores: a doc is only ever
 * dropped when its bound is this far below the k-th exact score. The
 * rounding differences are ~1e-7.
 */
const EPS = 1e-5;
/** The same slack for the cosine's float32 accumulators (see cosineMaxScore). */
const CEPS = 2e-5;
/** The smallest positive float32. */
const MIN_F32 = 2 ** -149;
/** Work of one exact rescoring, in postings read (a merge over ~2 x 80 peaks). */
const EVAL_COST = 40;
/** Docs rescored together, their loops interleaved (the compiled kernel's flush holds the same number). */
const GROUP = 8;
/** Docs per block of the one-pass modes (32 bytes of state each: 1 MiB, cache-sized). */
const BLOCK = 32768;

export interface GenericStage {
  tolerance: number;
  weights: PeakWeights;
  noiseFloor: number;
  lowMassCutoff: number;
  excludeBins: number[];
}

export interface KernelParams {
  k: number;
  rankBy: ScoreName;
  /** Per doc: 0 excluded, 1 searched, 2 searched with `penalty` off its ranking score. */
  allow: Uint8Array;
  penalty: number;
  /** Doc range [lo, hi). */
  lo: number;
  hi: number;
  /** Re-preprocess library spectra with these options (null: use the stored weights). */
  generic: GenericStage | null;
  /** Turn pruning off (cosine: every term in full); for tests and the benchmark. */
  noPruning?: boolean;
}

export interface KernelResult {
  /** Hit docs, best first. */
  docs: Int32Array;
  /** Ranking score per hit (after any penalty). */
  rank: Float64Array;
  /** [cosine, reverseCosine, composite, entropy] per hit. */
  scores: Float64Array;
  /** Postings read and docs scored exactly, for the benchmark. */
  postings: number;
  evaluated: number;
}

/** The JavaScript cosine kernel's per-doc state (allocated on its first use: the compiled kernel has its own). */
interface CosineScratch {
  /** Per doc d: [2d] 0 not seen, > 0 partial dot, -1 scored exactly; [2d+1] sum of the read weights' squares. */
  acc: Float32Array;
  /** Per doc: 1 while seen and not yet scored exactly, else 0 (a multiplier, so updates need no branch). */
  seen: Uint8Array;
  candD: Int32Array;
  candV: Float64Array;
  candS: Int32Array;
  bucket: Int32Array;
  hist: Float64Array;
  /** The query's weights by bin (0 elsewhere), during a search. */
  qDense: Float64Array;
}

interface Scratch {
  cos: CosineScratch | null;
  /** Per doc d, interleaved so one cache line serves a posting: [4d] dot, [4d+1] ratio or q^2 sum, [4d+2] previous ratio, [4d+3] shared count. */
  st: Float64Array;
  flag: Uint8Array;
  touched: Int32Array;
  gBins: Int32Array;
  gW: Float64Array;
  gE: Float64Array;
  /** The query being scored, by bin: its peak's index, -1 elsewhere (set by setQuery, cleared by clearQuery). */
  qIdx: Int32Array;
  /** A doc's entropyParams [sum, pow, sumW], passed to scoreMerged. */
  eParams: Float64Array;
  /** The query's entropy terms qE * ln qE by peak (set by setQuery), passed to scoreMerged. */
  qEH: Float64Array;
  /** The compiled kernel's state for this segment in this thread (null: use the JavaScript kernel). */
  wasm: WasmScratch | null;
}

const scratchCache = new Map<number, Scratch>();

function scratchFor(seg: Segment): Scratch {
  let s = scratchCache.get(seg.id);
  if (!s) {
    if (scratchCache.size >= 2) scratchCache.delete(scratchCache.keys().next().value as number);
    const wasm = seg.memory && seg.n > 0 ? wasmScratch(seg.memory, seg.n, seg.nBins) : null;
    s = {
      cos: null,
      // (With the compiled kernel, the one-pass state and touched list live in its scratch, for both kernels.)
      st: wasm ? wasm.st : new Float64Array(seg.n * 4),
      flag: new Uint8Array(seg.n),
      touched: wasm ? wasm.touched : new Int32Array(seg.n),
      gBins: new Int32Array(seg.maxDocPeaks),
      gW: new Float64Array(seg.maxDocPeaks),
      gE: new Float64Array(seg.maxDocPeaks),
      // (With the compiled kernel, in its scratch: scoreHits reads it there.)
      qIdx: wasm ? wasm.qIdx : new Int32Array(seg.nBins).fill(-1),
      eParams: new Float64Array(3),
      qEH: new Float64Array(64),
      wasm,
    };
    scratchCache.set(seg.id, s);
  }
  return s;
}

function cosineScratch(seg: Segment, sc: Scratch): CosineScratch {
  if (sc.cos === null) {
    sc.cos = {
      acc: new Float32Array(seg.n * 2),
      seen: new Uint8Array(seg.n),
      // (+1: the branch-free list writes go one past the last kept entry.)
      candD: new Int32Array(seg.n + 1),
      candV: new Float64Array(seg.n),
      candS: new Int32Array(seg.n),
      bucket: new Int32Array(257),
      hist: new Float64Array(1025),
      qDense: new Float64Array(seg.nBins),
    };
  }
  return sc.cos;
}

/** Index the query's peaks by bin for scoreMerged (library bins are all < nBins). */
function setQuery(sc: Scratch, q: PreparedSpectrum): void {
  const qIdx = sc.qIdx;
  for (let i = 0; i < q.n; i++) if (q.bins[i] >= 0 && q.bins[i] < qIdx.length) qIdx[q.bins[i]] = i;
  if (sc.qEH.length < q.n) sc.qEH = new Float64Array(Math.max(q.n, 2 * sc.qEH.length));
  queryEntropyTerms(q.e, q.n, sc.qEH);
}

function clearQuery(sc: Scratch, q: PreparedSpectrum): void {
  const qIdx = sc.qIdx;
  for (let i = 0; i < q.n; i++) if (q.bins[i] >= 0 && q.bins[i] < qIdx.length) qIdx[q.bins[i]] = -1;
}

/** First posting index in [from, to) whose doc is >= doc. */
function lowerBound(pDoc: Uint32Array, from: number, to: number, doc: number): number {
  let a = from;
  let b = to;
  while (a < b) {
    const m = (a + b) >>> 1;
    if (pDoc[m] < doc) a = m + 1;
    else b = m;
  }
  return a;
}

/** Scores one doc into out[at..at+3]; with `generic` it re-preprocesses the stored spectrum first. */
function evaluate(seg: Segment, q: PreparedSpectrum, d: number, generic: GenericStage | null, sc: Scratch, withEntropy: boolean, out: Float64Array, at: number): void {
  const s = seg.docStart[d];
  const e = seg.docStart[d + 1];
  if (generic === null) {
    if (withEntropy) {
      // The entropy weights of the shared peaks only, from the relative intensities and the doc's parameters.
      const ep = sc.eParams;
      ep[0] = seg.eSum[d];
      ep[1] = seg.ePow[d];
      ep[2] = seg.eSumW[d];
      scoreMerged(q.bins, q.w, q.e, q.n, q.norm, seg.fBin, seg.fW, seg.fRel, s, e, seg.docNorm[d], true, out, at, ep, sc.qIdx, sc.qEH);
    } else {
      // No entropy: the forward arrays in place (lE is not read).
      scoreMerged(q.bins, q.w, q.e, q.n, q.norm, seg.fBin, seg.fW, seg.fW, s, e, seg.docNorm[d], false, out, at, null, sc.qIdx);
    }
  } else {
    const g = stageInto(seg.fBin, seg.fRel, s, e, generic.tolerance, generic.weights, generic.noiseFloor, generic.lowMassCutoff, generic.excludeBins, sc.gBins, sc.gW, sc.gE);
    scoreMerged(q.bins, q.w, q.e, q.n, q.norm, sc.gBins, sc.gW, sc.gE, 0, g.n, g.norm, withEntropy, out, at, null, sc.qIdx, sc.qEH);
  }
}

/** The hits in order with their four scores (compiled where it can be, unless `compiled` is false: the brute-force reference scores in JavaScript). */
function finish(seg: Segment, q: PreparedSpectrum, p: KernelParams, sc: Scratch, heap: TopK, postings: number, evaluated: number, compiled = true): KernelResult {
  const order = heap.order();
  const m = order.length;
  const docs = new Int32Array(m);
  const rank = new Float64Array(m);
  const scores = new Float64Array(m * 4);
  for (let i = 0; i < m; i++) {
    docs[i] = heap.doc[order[i]];
    rank[i] = heap.score[order[i]];
  }
  const w = sc.wasm;
  if (compiled && m > 0 && p.generic === null && w !== null && searchKernel() === 'wasm' && m <= w.hitD.length) scoreHitsWasm(seg, q, sc, w, docs, scores);
  else for (let i = 0; i < m; i++) evaluate(seg, q, docs[i], p.generic, sc, true, scores, i * 4);
  return { docs, rank, scores, postings, evaluated };
}

/**
 * The hits' four scores by the compiled scoreHits (wasm/kernels.ts: scoreMerged's
 * stored-weights path, the same bits): the query by peak and the hit docs
 * into this thread's scratch, the scores out of it.
 */
function scoreHitsWasm(seg: Segment, q: PreparedSpectrum, sc: Scratch, w: WasmScratch, docs: Int32Array, scores: Float64Array): void {
  // The query's index by bin is setQuery's (sc.qIdx is the scratch's). Its
  // bins ascend, so the peaks inside the library's bins are the first ones
  // and their indices are the same by peak here.
  let c = 0;
  while (c < q.n && q.bins[c] < seg.nBins) c++;
  w.qW.set(q.w.subarray(0, c));
  w.qE.set(q.e.subarray(0, c));
  w.qEH.set(sc.qEH.subarray(0, c));
  w.hitD.set(docs);
  w.scoreHits(w.header, docs.length, seg.docStart.byteOffset, seg.fBin.byteOffset, seg.fBin instanceof Int32Array ? 1 : 0, seg.fW.byteOffset, seg.fRel.byteOffset, seg.docNorm.byteOffset, seg.eSum.byteOffset, seg.ePow.byteOffset, seg.eSumW.byteOffset, q.n, q.norm, LN4);
  scores.set(w.hitOut.subarray(0, docs.length * 4));
}

/**
 * Exact top-k of one prepared query over a doc range of a segment, by the
 * ranking score, ties by doc (= record id) order. Only docs sharing at least
 * one bin with the query are hits. The k-th score only ever comes from
 * exact scores (scoreMerged, as the brute-force reference computes them), and
 * a doc is skipped only when a bound shows it cannot reach it, so the result
 * equals the brute-force one.
 *
 * - cosine: MaxScore. Query bins go from the heaviest bound (query weight x
 *   the bin's largest stored weight) down. A doc not seen yet can score at
 *   most R, the smaller of the remaining per-bin bounds' sum and the
 *   Euclidean norm of the remaining query weights (Cauchy-Schwarz, stored
 *   weights have unit norm). Once R is below the k-th exact score no new doc
 *   is admitted; the remaining bins update the docs already seen as long as
 *   that is cheaper than rescoring them, then every seen doc whose bound
 *   (partial dot + R) still reaches the k-th score is rescored exactly, best
 *   bound first.
 * - composite, entropy, reverse cosine: one pass over the query's postings
 *   in m/z order gives each doc's score from the stored weights (the
 *   composite's ratio term too, as adjacent shared peaks arrive in m/z
 *   order); every doc within 2 EPS of the k-th of these is rescored
 *   exactly. Their bounds do not prune on EI data: the composite's ratio
 *   term (at most 1) lets a spectrum sharing many light peaks reach about
 *   0.5 whatever its dot product, and a library spectrum made of a few of
 *   the query's light peaks has a reverse cosine of 1.
 */
export function searchSegment(seg: Segment, q: PreparedSpectrum, p: KernelParams): KernelResult {
  const sc = scratchFor(seg);
  const heap = new TopK(p.k);
  const lo = Math.max(0, p.lo);
  const hi = Math.min(seg.n, p.hi);
  if (q.n === 0 || hi <= lo || seg.n === 0) return finish(seg, q, p, sc, heap, 0, 0);
  setQuery(sc, q);
  const { allow, penalty, rankBy } = p;
  const slot = SCORE_SLOT[rankBy];
  const { pStart, pDoc, pW, pE } = seg;
  const { st, flag, touched } = sc;
  const out = new Float64Array(4);
  let nTouched = 0;
  let postings = 0;
  let evaluated = 0;

  // The query's bins that have postings in the range, in m/z order, with their posting spans.
  const tBin: number[] = [];
  const tQ: number[] = [];
  const tA: number[] = [];
  const tFrom: number[] = [];
  const tTo: number[] = [];
  for (let i = 0; i < q.n; i++) {
    const b = q.bins[i];
    if (b < 0 || b >= seg.nBins) continue;
    let from = pStart[b];
    let to = pStart[b + 1];
    if (from === to) continue;
    if (lo > 0) from = lowerBound(pDoc, from, to, lo);
    if (hi < seg.n) to = lowerBound(pDoc, from, to, hi);
    if (from === to) continue;
    tBin.push(b);
    tQ.push(q.w[i] / q.norm);
    tA.push(q.e[i]);
    tFrom.push(from);
    tTo.push(to);
  }
  const T = tBin.length;

  const reset = () => {
    for (let t = 0; t < nTouched; t++) {
      const d = touched[t];
      const o = d << 2;
      st[o] = 0;
      st[o + 1] = 0;
      st[o + 2] = 0;
      st[o + 3] = 0;
      flag[d] = 0;
    }
  };
  const scoreDoc = (d: number) => {
    flag[d] = 1;
    evaluated++;
    evaluate(seg, q, d, p.generic, sc, rankBy === 'entropy', out, 0);
    if (out[0] > 0) {
      const raw = out[slot];
      heap.push(allow[d] === 2 ? Math.max(0, raw - penalty) : raw, d);
    }
  };
  const done = () => {
    const r = finish(seg, q, p, sc, heap, postings, evaluated);
    reset();
    clearQuery(sc, q);
    return r;
  };

  // Other options than the stored ones: rescore every doc that shares a bin.
  if (p.generic !== null) {
    for (let t = 0; t < T; t++) {
      for (let j = tFrom[t], end = tTo[t]; j < end; j++) {
        const d = pDoc[j];
        if (allow[d] === 0 || st[(d << 2) + 3] !== 0) continue;
        st[(d << 2) + 3] = 1;
        touched[nTouched++] = d;
      }
      postings += tTo[t] - tFrom[t];
    }
    for (let t = 0; t < nTouched; t++) scoreDoc(touched[t]);
    return done();
  }

  if (rankBy !== 'cosine') {
    // One pass in m/z order, block by block of docs so the per-doc state of a
    // block stays in cache (postings are sorted by doc, one cursor per bin).
    for (let t = 0; t < T; t++) postings += tTo[t] - tFrom[t];
    const w = sc.wasm;
    if (w !== null && searchKernel() === 'wasm') {
      // Compiled (onePass in wasm/kernels.ts, the same loops): terms in m/z order into its scratch.
      for (let t = 0; t < T; t++) {
        w.oQ[t] = tQ[t];
        w.oFrom[t] = tFrom[t];
        w.oTo[t] = tTo[t];
        w.oA[t] = tA[t];
      }
      nTouched = w.onePass(w.header, ONE_PASS_MODE[rankBy], pDoc.byteOffset, pW.byteOffset, pE.byteOffset, allowOffset(seg, p, w, lo, hi), lo, hi, T, BLOCK);
    } else {
      const cur = tFrom.slice();
      for (let blockEnd = lo + BLOCK; ; blockEnd += BLOCK) {
        const stop = Math.min(blockEnd, hi);
        for (let t = 0; t < T; t++) {
          const x = tQ[t];
          const end = tTo[t];
          let j = cur[t];
          if (rankBy === 'composite') {
            const invX = 1 / x;
            for (; j < end; j++) {
              const d = pDoc[j];
              if (d >= stop) break;
              if (allow[d] === 0) continue;
              const w = pW[j];
              const rho = w * invX;
              const o = d << 2;
              const c = st[o + 3];
              touched[nTouched] = d;
              nTouched += c === 0 ? 1 : 0;
              // min(r, 1/r) of r = rho / previous rho as min / max, written
              // (s - g) / (s + g) with s the sum and g the absolute difference:
              // no branch (r <= 1 mispredicts half the time, and so do Math.min
              // and Math.max), and 0 for a doc's first shared peak (prev = 0).
              const prev = st[o + 2];
              const sum = rho + prev;
              const gap = Math.abs(rho - prev);
              st[o + 1] += (sum - gap) / (sum + gap);
              st[o + 2] = rho;
              st[o + 3] = c + 1;
              st[o] += x * w;
            }
          } else if (rankBy === 'reverseCosine') {
            const xx = x * x;
            for (; j < end; j++) {
              const d = pDoc[j];
              if (d >= stop) break;
              if (allow[d] === 0) continue;
              const o = d << 2;
              if (st[o + 3] === 0) {
                touched[nTouched++] = d;
                st[o + 3] = 1;
              }
              st[o] += x * pW[j];
              st[o + 1] += xx;
            }
          } else {
            const a = tA[t];
            const aLnA = a > 0 ? a * Math.log(a) : 0;
            for (; j < end; j++) {
              const d = pDoc[j];
              if (d >= stop) break;
              if (allow[d] === 0) continue;
              const o = d << 2;
              if (st[o + 3] === 0) {
                touched[nTouched++] = d;
                st[o + 3] = 1;
              }
              const b = pE[j];
              if (a > 0 && b > 0) st[o] += (a + b) * Math.log(a + b) - aLnA - b * Math.log(b);
            }
          }
          cur[t] = j;
        }
        if (stop >= hi) break;
      }
    }
    const nU = q.n;
    const approx = (d: number): number => {
      let v: number;
      const o = d << 2;
      if (rankBy === 'composite') {
        const cos = Math.min(1, st[o]);
        const fD = cos * cos;
        const c = st[o + 3];
        v = c < 2 ? fD : (nU * fD + c * (st[o + 1] / (c - 1))) / (nU + c);
      } else if (rankBy === 'reverseCosine') v = st[o + 1] > 0 ? st[o] / Math.sqrt(st[o + 1]) : 0;
      else v = st[o] / LN4;
      return allow[d] === 2 ? Math.max(0, v - penalty) : v;
    };
    const top = new TopK(p.k);
    const vals = new Float64Array(nTouched);
    for (let t = 0; t < nTouched; t++) {
      vals[t] = approx(touched[t]);
      top.push(vals[t], touched[t]);
    }
    const theta = top.threshold() - 2 * EPS;
    for (let t = 0; t < nTouched; t++) if (vals[t] >= theta) scoreDoc(touched[t]);
    return done();
  }

  // Cosine: MaxScore over float32 accumulators (see cosineMaxScore), compiled where it can be.
  const terms = { tBin, tQ, tFrom, tTo };
  const c = sc.wasm !== null && searchKernel() === 'wasm' && p.k <= MAX_LIMIT ? cosineWasm(seg, q, p, sc.wasm, heap, terms) : cosineMaxScore(seg, q, p, sc, heap, terms);
  postings += c.postings;
  evaluated += c.evaluated;
  return done();
}

interface Terms {
  tBin: number[];
  tQ: number[];
  tFrom: number[];
  tTo: number[];
}

/**
 * The order the cosine kernels take the query's bins in: heaviest bound
 * (query weight x the bin's largest stored weight) first, ties by bin. Fills
 * R[i] (what a doc not seen in the first i bins can still score: the smaller
 * of the remaining bounds' sum and the remaining query weights' norm) and
 * Q[i] (that norm); R[T] = Q[T] = 0.
 */
function termOrder(seg: Segment, terms: Terms, R: Float64Array, Q: Float64Array): number[] {
  const { tBin, tQ } = terms;
  const T = tBin.length;
  const tU = new Float64Array(T);
  for (let t = 0; t < T; t++) tU[t] = tQ[t] * seg.binMaxW[tBin[t]];
  const order = heaviestFirst(tU, tBin);
  let s1 = 0;
  let s2 = 0;
  R[T] = 0;
  Q[T] = 0;
  for (let i = T - 1; i >= 0; i--) {
    const t = order[i];
    s1 += tU[t];
    s2 += tQ[t] * tQ[t];
    Q[i] = Math.sqrt(s2);
    R[i] = Math.min(s1, Q[i]);
  }
  return order;
}

/**
 * Term indices by bound, heaviest first, ties by bin: a heapsort inline (a
 * sort with a comparator called T log T times cost more than the rest of
 * the query's preparation).
 */
export function heaviestFirst(tU: Float64Array, tBin: number[]): number[] {
  const T = tU.length;
  // `later(a, b)`: a comes after b. The heap keeps the latest at the root.
  const later = (a: number, b: number) => tU[a] < tU[b] || (tU[a] === tU[b] && tBin[a] > tBin[b]);
  const h: number[] = new Array(T);
  for (let i = 0; i < T; i++) h[i] = i;
  const down = (from: number, size: number) => {
    let i = from;
    for (;;) {
      const l = 2 * i + 1;
      const r = l + 1;
      let m = i;
      if (l < size && later(h[l], h[m])) m = l;
      if (r < size && later(h[r], h[m])) m = r;
      if (m === i) return;
      const t = h[i];
      h[i] = h[m];
      h[m] = t;
      i = m;
    }
  };
  for (let i = (T >> 1) - 1; i >= 0; i--) down(i, T);
  for (let size = T - 1; size > 0; size--) {
    const t = h[0];
    h[0] = h[size];
    h[size] = t;
    down(0, size);
  }
  return h;
}

/** Where the compiled kernels read the filter mask: the segment's live flags, or a copy of the task's mask in the scratch. */
function allowOffset(seg: Segment, p: KernelParams, w: WasmScratch, lo: number, hi: number): number {
  if (p.allow === seg.live) return seg.live.byteOffset;
  w.allow.set(p.allow.subarray(lo, hi), lo);
  return w.allow.byteOffset;
}

/** onePass's mode for each one-pass ranking. */
const ONE_PASS_MODE: Record<ScoreName, number> = { composite: 0, reverseCosine: 1, entropy: 2, cosine: -1 };

/**
 * cosineMaxScore, compiled (wasm/kernels.ts is its line-by-line port): the
 * query's terms in order and its dense weights go into this thread's scratch
 * in the segment's memory, the kernel runs, and its heap becomes `heap`.
 */
function cosineWasm(seg: Segment, q: PreparedSpectrum, p: KernelParams, w: WasmScratch, heap: TopK, terms: Terms): { postings: number; evaluated: number } {
  const T = terms.tBin.length;
  const order = termOrder(seg, terms, w.R, w.Q);
  for (let i = 0; i < T; i++) {
    const t = order[i];
    w.oQ[i] = terms.tQ[t];
    w.oFrom[i] = terms.tFrom[t];
    w.oTo[i] = terms.tTo[t];
  }
  const qDense = w.qDense;
  for (let i = 0; i < q.n; i++) if (q.bins[i] >= 0 && q.bins[i] < seg.nBins) qDense[q.bins[i]] = q.w[i];
  const lo = Math.max(0, p.lo);
  const hi = Math.min(seg.n, p.hi);
  // (The first bin's heaviest postings, for the first refresh; none when T is 0.)
  const b0 = T > 0 ? terms.tBin[order[0]] : 0;
  const topFrom = T > 0 ? seg.pTopStart[b0] : 0;
  const topTo = T > 0 ? seg.pTopStart[b0 + 1] : 0;
  w.cosine(w.header, seg.docStart.byteOffset, seg.fBin.byteOffset, seg.fBin instanceof Int32Array ? 1 : 0, seg.fW.byteOffset, seg.docNorm.byteOffset, seg.pDoc.byteOffset, seg.pW.byteOffset, allowOffset(seg, p, w, lo, hi), lo, hi, p.k, T, p.noPruning ? 1 : 0, p.penalty, q.norm, seg.pTop.byteOffset, topFrom, topTo);
  for (let i = 0; i < q.n; i++) if (q.bins[i] >= 0 && q.bins[i] < seg.nBins) qDense[q.bins[i]] = 0;
  const size = w.out[2];
  heap.size = size;
  heap.score.set(w.heapS.subarray(0, size));
  heap.doc.set(w.heapD.subarray(0, size));
  return { postings: w.out[0], evaluated: w.out[1] };
}

/**
 * Cosine by MaxScore. Query bins go from the heaviest bound (query weight x
 * the bin's largest stored weight) down. A doc not seen yet can score at most
 * R, the smaller of the remaining per-bin bounds' sum and the Euclidean norm
 * of the remaining query weights (Cauchy-Schwarz: stored weights have unit
 * norm). Once R is below the k-th exact score no new doc is admitted; the
 * remaining bins update the docs already seen while that is cheaper than
 * rescoring them, then every seen doc whose bound (partial dot + R) still
 * reaches the k-th score is rescored exactly, best bounds first.
 *
 * Per doc the state is two float32 (8 bytes, so a million docs take 8 MB):
 * the partial dot (0 not seen, -1 scored exactly) and the sum of squares of
 * the doc's weights read so far, which tightens its bound; and a byte, 1
 * while the doc is seen and not scored, by which the updates after
 * admission multiply instead of testing (a third of the postings or so are
 * of seen docs, at random, and the mispredicted tests cost more than the
 * updates: 7.4 against 4.1 ns a posting measured here). The float32
 * rounding (a rounding of each product and each sum, of values <= 1: under
 * 1e-5 for 80 shared peaks) is inside CEPS.
 */
function cosineMaxScore(seg: Segment, q: PreparedSpectrum, p: KernelParams, sc: Scratch, heap: TopK, terms: Terms): { postings: number; evaluated: number } {
  const { tQ, tFrom, tTo } = terms;
  const T = terms.tBin.length;
  const { allow, penalty } = p;
  const { pDoc, pW, docStart, fBin, fW, docNorm } = seg;
  const cs = cosineScratch(seg, sc);
  const acc = cs.acc;
  const seen = cs.seen;
  const touched = sc.touched;
  let nTouched = 0;
  let postings = 0;
  let evaluated = 0;
  const lo = Math.max(0, p.lo);
  const hi = Math.min(seg.n, p.hi);

  const R = new Float64Array(T + 1);
  const Q = new Float64Array(T + 1);
  const order = termOrder(seg, terms, R, Q);
  const theta = () => (p.noPruning ? -Infinity : heap.threshold() - CEPS);
  // The exact cosine of a doc through a dense copy of the query's weights: the
  // shared peaks' products added in m/z order, as scoreMerged adds them
  // (adding the zeros of unshared peaks changes no bit), so the value is the
  // brute-force reference's to the last bit.
  const qDense = cs.qDense;
  for (let i = 0; i < q.n; i++) if (q.bins[i] >= 0 && q.bins[i] < seg.nBins) qDense[q.bins[i]] = q.w[i];
  const qNorm = q.norm;
  const dotOf = (d: number) => {
    let dot = 0;
    for (let j = docStart[d], e = docStart[d + 1]; j < e; j++) dot += qDense[fBin[j]] * fW[j];
    return dot;
  };
  const settle = (d: number, dot: number) => {
    acc[d << 1] = -1;
    seen[d] = 0;
    evaluated++;
    if (dot > 0 && qNorm > 0 && docNorm[d] > 0) {
      const cos = Math.min(1, dot / (qNorm * docNorm[d]));
      heap.push(allow[d] === 2 ? Math.max(0, cos - penalty) : cos, d);
    }
  };
  // Docs to rescore are queued and scored GROUP at a time, their loops
  // interleaved: each doc's peaks are a fresh read from memory, and several
  // streams at once keep several reads in flight instead of one. (Each doc's
  // products are still added in its own m/z order. The compiled kernel
  // queues the same way, so both rescore the same docs.)
  const group = new Int32Array(GROUP);
  let nGroup = 0;
  const flush = () => {
    if (nGroup === GROUP) {
      const [g0, g1, g2, g3, g4, g5, g6, g7] = group;
      const s0 = docStart[g0];
      const s1 = docStart[g1];
      const s2 = docStart[g2];
      const s3 = docStart[g3];
      const s4 = docStart[g4];
      const s5 = docStart[g5];
      const s6 = docStart[g6];
      const s7 = docStart[g7];
      const e0 = docStart[g0 + 1];
      const e1 = docStart[g1 + 1];
      const e2 = docStart[g2 + 1];
      const e3 = docStart[g3 + 1];
      const e4 = docStart[g4 + 1];
      const e5 = docStart[g5 + 1];
      const e6 = docStart[g6 + 1];
      const e7 = docStart[g7 + 1];
      const len = Math.min(e0 - s0, e1 - s1, e2 - s2, e3 - s3, e4 - s4, e5 - s5, e6 - s6, e7 - s7);
      let x0 = 0;
      let x1 = 0;
      let x2 = 0;
      let x3 = 0;
      let x4 = 0;
      let x5 = 0;
      let x6 = 0;
      let x7 = 0;
      for (let i = 0; i < len; i++) {
        x0 += qDense[fBin[s0 + i]] * fW[s0 + i];
        x1 += qDense[fBin[s1 + i]] * fW[s1 + i];
        x2 += qDense[fBin[s2 + i]] * fW[s2 + i];
        x3 += qDense[fBin[s3 + i]] * fW[s3 + i];
        x4 += qDense[fBin[s4 + i]] * fW[s4 + i];
        x5 += qDense[fBin[s5 + i]] * fW[s5 + i];
        x6 += qDense[fBin[s6 + i]] * fW[s6 + i];
        x7 += qDense[fBin[s7 + i]] * fW[s7 + i];
      }
      for (let j = s0 + len; j < e0; j++) x0 += qDense[fBin[j]] * fW[j];
      for (let j = s1 + len; j < e1; j++) x1 += qDense[fBin[j]] * fW[j];
      for (let j = s2 + len; j < e2; j++) x2 += qDense[fBin[j]] * fW[j];
      for (let j = s3 + len; j < e3; j++) x3 += qDense[fBin[j]] * fW[j];
      for (let j = s4 + len; j < e4; j++) x4 += qDense[fBin[j]] * fW[j];
      for (let j = s5 + len; j < e5; j++) x5 += qDense[fBin[j]] * fW[j];
      for (let j = s6 + len; j < e6; j++) x6 += qDense[fBin[j]] * fW[j];
      for (let j = s7 + len; j < e7; j++) x7 += qDense[fBin[j]] * fW[j];
      settle(g0, x0);
      settle(g1, x1);
      settle(g2, x2);
      settle(g3, x3);
      settle(g4, x4);
      settle(g5, x5);
      settle(g6, x6);
      settle(g7, x7);
    } else for (let i = 0; i < nGroup; i++) settle(group[i], dotOf(group[i]));
    nGroup = 0;
  };
  const queue = (d: number) => {
    group[nGroup++] = d;
    if (nGroup === GROUP) flush();
  };
  // Seen docs are visited through the touched list, or by a sequential sweep
  // of the state once most docs have been seen (cheaper than random reads).
  const sweep = () => nTouched > (hi - lo) >> 2;
  // Score the seen docs with the best partial dots exactly, to raise the k-th
  // score. After the first refresh, the docs whose partial dot rises above
  // `cut` (the k-th partial dot of the last refresh; every doc left unscored
  // was at or below it) are listed in `hot`, and the next refresh picks from
  // that list alone instead of every seen doc.
  const hot = cs.candD;
  let nHot = 0;
  let cut = Infinity;
  // The first refresh, after the first bin, picks its docs with the best
  // partial dots, which are its heaviest postings (the partial is the bin's
  // one product, which grows with the weight): when the bin keeps its
  // heaviest postings (seg.pTop) and k of them are of docs in range and
  // admitted, those are the picks, best first, and no doc is scanned (6,500
  // of them a top-100 query at 100k, 40 us). Else the docs are scanned.
  const firstPicks = (): { size: number; doc: Int32Array; score: Float64Array } | null => {
    if (pos !== 1 || T === 0) return null;
    const t0 = order[0];
    const b = terms.tBin[t0];
    const from = tFrom[t0];
    const to = tTo[t0];
    const doc = new Int32Array(p.k);
    const score = new Float64Array(p.k);
    let size = 0;
    for (let i = seg.pTopStart[b], e = seg.pTopStart[b + 1]; i < e && size < p.k; i++) {
      const j = seg.pTop[i];
      if (j < from || j >= to) continue;
      const d = pDoc[j];
      const a = acc[d << 1];
      if (a > 0) {
        doc[size] = d;
        score[size++] = a;
      }
    }
    return size === p.k ? { size, doc, score } : null;
  };
  const refresh = () => {
    const listed = cut === Infinity ? firstPicks() : null;
    let pick: { size: number; doc: ArrayLike<number> };
    if (listed !== null) {
      // (Best first: the k-th partial dot is the last.)
      cut = listed.score[p.k - 1];
      pick = listed;
    } else {
      const top = new TopK(p.k);
      if (cut !== Infinity) {
        for (let i = 0; i < nHot; i++) {
          const d = hot[i];
          const a = acc[d << 1];
          if (a > 0 && (top.size < p.k || a > top.score[0])) top.push(a, d);
        }
      } else if (sweep()) {
        for (let d = lo; d < hi; d++) {
          const a = acc[d << 1];
          if (a > 0 && (top.size < p.k || a > top.score[0])) top.push(a, d);
        }
      } else
        for (let t = 0; t < nTouched; t++) {
          const d = touched[t];
          const a = acc[d << 1];
          if (a > 0 && (top.size < p.k || a > top.score[0])) top.push(a, d);
        }
      // With fewer than k picks the last cut stays: every unscored doc not
      // listed is still at or below it. (Lowering it to 0 would stop listing
      // the docs already seen, and later refreshes would pick from new docs
      // alone: 217k against 205k postings a top-100 query at 100k.)
      if (top.size === p.k) cut = top.score[0];
      else if (cut === Infinity) cut = 0;
      pick = top;
    }
    nHot = 0;
    // A pick whose bound is already below the k-th score never reaches it (bounds only fall): leave it.
    const rest = R[pos];
    for (let i = 0; i < pick.size; i++) {
      const d = pick.doc[i];
      const a = acc[d << 1];
      if (a > 0 && a + rest >= theta()) queue(d);
    }
    flush();
  };

  // Admit docs while an unseen one could still make the top k.
  let pos = 0;
  let nextRefresh = 1;
  while (pos < T && R[pos] >= theta()) {
    const t = order[pos];
    // (In float32 arithmetic, as the compiled kernel does it: each product
    // and each sum rounded by Math.fround.)
    const x = Math.fround(tQ[t]);
    const end = tTo[t];
    postings += end - tFrom[t];
    for (let j = tFrom[t]; j < end; j++) {
      const d = pDoc[j];
      const o = d << 1;
      const a = acc[o];
      const w = pW[j];
      if (a > 0) {
        const na = Math.fround(a + Math.fround(x * w));
        acc[o] = na;
        // (The sum of squares in float32 arithmetic, as the compiled kernel adds it.)
        acc[o + 1] += Math.fround(w * w);
        if (a <= cut && na > cut) hot[nHot++] = d;
      } else if (a === 0 && allow[d] !== 0) {
        touched[nTouched++] = d;
        seen[d] = 1;
        // (A product that rounds to 0 is stored as the smallest float32: 0 marks a doc not seen.)
        const p = Math.fround(x * w);
        const na = p === 0 ? MIN_F32 : p;
        acc[o] = na;
        acc[o + 1] = Math.fround(w * w);
        if (na > cut) hot[nHot++] = d;
      }
    }
    pos++;
    if (pos === nextRefresh) {
      refresh();
      nextRefresh *= 2;
    }
  }
  refresh();

  // No new doc can make it now. Update the seen docs with further bins while a
  // bin's postings cost less than the rescoring they could spare (estimated
  // from a histogram of the partial dots taken once, as they only grow).
  const H = 1024;
  const hist = cs.hist;
  hist.fill(0);
  // (An estimate only, so one seen doc in four is counted, four times.)
  if (pos < T) {
    // (From the touched list: every entry is a seen doc, so the test is
    // nearly always true, unlike one over all docs.)
    for (let t = 0; t < nTouched; t += 4) {
      const a = acc[touched[t] << 1];
      if (a > 0) hist[Math.min(H, Math.floor(a * H))] += 4;
    }
    for (let i = H - 1; i >= 0; i--) hist[i] += hist[i + 1];
  }
  const estimate = (rest: number) => hist[Math.min(H, Math.max(0, Math.floor((theta() - rest) * H)))];
  let pending = pos < T ? estimate(R[pos]) : 0;
  while (pos < T && pending * EVAL_COST > tTo[order[pos]] - tFrom[order[pos]]) {
    const t = order[pos];
    const x = Math.fround(tQ[t]);
    const end = tTo[t];
    postings += end - tFrom[t];
    // No branch: a third of the docs or so are seen, at random, and a
    // mispredicted test costs more than the update (unseen and scored docs
    // have seen = 0 and get 0 added). In float32 arithmetic, as the compiled
    // kernel does it: each product rounded by Math.fround, each sum by the
    // store (the exact float32 results: an f64 product of two float32 is
    // exact, and a sum rounded twice rounds as once); the rounding, at most
    // 2 x 80 float32 roundings of values <= 1 (< 1e-5), is inside CEPS.
    for (let j = tFrom[t]; j < end; j++) {
      const d = pDoc[j];
      const o = d << 1;
      const w = pW[j] * seen[d];
      acc[o] += Math.fround(x * w);
      acc[o + 1] += Math.fround(w * w);
    }
    pos++;
    pending = pos < T ? estimate(R[pos]) : 0;
  }

  // Rescore the seen docs whose bound still reaches the k-th score, in
  // buckets of their bound from the best down. A doc's bound is its partial
  // dot plus the smaller of R and, by Cauchy-Schwarz on the bins not yet
  // read, |query weights left| x sqrt(|doc weights|^2 - those already read)
  // (1e-5 covers the float32 sum of squares).
  const rest = R[pos];
  const qRest = Q[pos];
  const th0 = theta();
  const candD = cs.candD;
  const candV = cs.candV;
  let nCand = 0;
  let maxV = -Infinity;
  // Cheap test first, without a branch: the bound is at most a + rest. The
  // docs that pass are listed in candD, then the full bound is taken.
  let nPass = 0;
  if (sweep()) {
    for (let d = lo; d < hi; d++) {
      candD[nPass] = d;
      nPass += seen[d] & +(acc[d << 1] + rest >= th0);
    }
  } else
    for (let t = 0; t < nTouched; t++) {
      const d = touched[t];
      candD[nPass] = d;
      nPass += seen[d] & +(acc[d << 1] + rest >= th0);
    }
  for (let i = 0; i < nPass; i++) {
    const d = candD[i];
    const a = acc[d << 1];
    const nd = docNorm[d];
    const v = a + Math.min(rest, qRest * Math.sqrt(Math.max(0, nd * nd - acc[(d << 1) + 1]) + 1e-5)) - (allow[d] === 2 ? penalty : 0);
    if (v >= th0) {
      candD[nCand] = d;
      candV[nCand++] = v;
      if (v > maxV) maxV = v;
    }
  }
  if (nCand > 0) {
    const NB = 256;
    const floor = th0 === -Infinity ? 0 : th0;
    const width = (maxV - floor) / NB || 1;
    const count = cs.bucket;
    count.fill(0);
    // (Clamped at both ends: with no k-th score yet a penalized bound can fall below the floor.)
    const bucketOf = (v: number) => Math.min(NB - 1, Math.max(0, Math.floor((v - floor) / width)));
    for (let i = 0; i < nCand; i++) count[NB - 1 - bucketOf(candV[i])]++;
    // Counting sort, best bucket first.
    let sum = 0;
    for (let b = 0; b <= NB; b++) {
      const c = count[b];
      count[b] = sum;
      sum += c;
    }
    const sorted = cs.candS;
    for (let i = 0; i < nCand; i++) sorted[count[NB - 1 - bucketOf(candV[i])]++] = i;
    for (let s = 0; s < nCand; s++) {
      const i = sorted[s];
      const v = candV[i];
      const th = theta();
      // Buckets run best first: once a bucket's top is below the k-th score, so are all later ones.
      if (v < th) {
        const bucketTop = floor + (bucketOf(v) + 1) * width;
        if (bucketTop < th) break;
        continue;
      }
      if (acc[candD[i] << 1] > 0) queue(candD[i]);
    }
    flush();
  }

  // Clear the state for the next search.
  for (let i = 0; i < q.n; i++) if (q.bins[i] >= 0 && q.bins[i] < seg.nBins) qDense[q.bins[i]] = 0;
  if (sweep()) {
    acc.fill(0, lo << 1, hi << 1);
    seen.fill(0, lo, hi);
  } else
    for (let t = 0; t < nTouched; t++) {
      const d = touched[t];
      const o = d << 1;
      acc[o] = 0;
      acc[o + 1] = 0;
      seen[d] = 0;
    }
  return { postings, evaluated };
}

/** Reference over a segment: score every allowed doc in the range exactly (no index, no pruning). */
export function bruteForceSegment(seg: Segment, q: PreparedSpectrum, p: KernelParams): KernelResult {
  const sc = scratchFor(seg);
  const heap = new TopK(p.k);
  const out = new Float64Array(4);
  const slot = SCORE_SLOT[p.rankBy];
  const hi = Math.min(seg.n, p.hi);
  let evaluated = 0;
  setQuery(sc, q);
  for (let d = Math.max(0, p.lo); d < hi; d++) {
    if (p.allow[d] === 0) continue;
    evaluated++;
    evaluate(seg, q, d, p.generic, sc, p.rankBy === 'entropy', out, 0);
    if (out[0] > 0) {
      const raw = out[slot];
      heap.push(p.allow[d] === 2 ? Math.max(0, raw - p.penalty) : raw, d);
    }
  }
  const r = finish(seg, q, p, sc, heap, 0, evaluated, false);
  clearQuery(sc, q);
  return r;
}

/** The memory-scan floor: one sequential pass over every stored peak's weight. */
export function scanFloor(seg: Segment): number {
  const w = seg.pW;
  let s = 0;
  for (let i = 0; i < w.length; i++) s += w[i];
  return s;
}
