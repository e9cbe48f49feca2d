import { stageInto, type PreparedSpectrum } from './prepare';
import { scoreMerged, SCORE_SLOT } from './scorePrepared';
import type { Segment } from './segment';
import { TopK } from './topK';
import type { PeakWeights, ScoreName } from './types';

const LN4 = Math.log(4);
/**
 * Slack for comparisons between bounds accumulated from 32-bit stored
 * weights and exact 64-bit scores: bounds are only trusted to prune when
 * they fall this far below the k-th score. Rounding errors are ~1e-7.
 */
const EPS = 1e-5;

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
  /** Turn pruning off (full pass); for tests and the benchmark. */
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

interface Scratch {
  acc: Float64Array;
  acc2: Float64Array | null;
  cnt: Uint16Array;
  flag: Uint8Array;
  touched: Int32Array;
  gBins: Int32Array;
  gW: Float64Array;
  gE: Float64Array;
}

const scratchCache = new Map<number, Scratch>();

function scratchFor(seg: Segment): Scratch {
  let s = scratchCache.get(seg.id);
  if (!s) {
    if (scratchCache.size >= 2) scratchCache.delete(scratchCache.keys().next().value as number);
    s = {
      acc: new Float64Array(seg.n),
      acc2: null,
      cnt: new Uint16Array(seg.n),
      flag: new Uint8Array(seg.n),
      touched: new Int32Array(seg.n),
      gBins: new Int32Array(seg.maxDocPeaks),
      gW: new Float64Array(seg.maxDocPeaks),
      gE: new Float64Array(seg.maxDocPeaks),
    };
    scratchCache.set(seg.id, s);
  }
  return s;
}

/** First posting index in [from, to) whose doc is >= lo. */
function lowerBound(pDoc: Uint32Array, from: number, to: number, lo: number): number {
  if (lo <= 0) return from;
  let a = from;
  let b = to;
  while (a < b) {
    const m = (a + b) >>> 1;
    if (pDoc[m] < lo) a = m + 1;
    else b = m;
  }
  return a;
}

/** Scores one doc into out[at..at+3]; with `generic` it re-preprocesses the stored spectrum first. */
function evaluate(seg: Segment, q: PreparedSpectrum, d: number, generic: GenericStage | null, sc: Scratch, withEntropy: boolean, out: Float64Array, at: number): void {
  const s = seg.docStart[d];
  const e = seg.docStart[d + 1];
  if (generic === null) {
    scoreMerged(q.bins, q.w, q.e, q.n, q.norm, seg.fBin, seg.fW, seg.fE, s, e, seg.docNorm[d], withEntropy, out, at);
  } else {
    const g = stageInto(seg.fBin, seg.fRel, s, e, generic.tolerance, generic.weights, generic.noiseFloor, generic.lowMassCutoff, generic.excludeBins, sc.gBins, sc.gW, sc.gE);
    scoreMerged(q.bins, q.w, q.e, q.n, q.norm, sc.gBins, sc.gW, sc.gE, 0, g.n, g.norm, withEntropy, out, at);
  }
}

function finish(seg: Segment, q: PreparedSpectrum, p: KernelParams, sc: Scratch, heap: TopK, postings: number, evaluated: number): KernelResult {
  const order = heap.order();
  const docs = new Int32Array(order.length);
  const rank = new Float64Array(order.length);
  const scores = new Float64Array(order.length * 4);
  order.forEach((pos, i) => {
    docs[i] = heap.doc[pos];
    rank[i] = heap.score[pos];
    evaluate(seg, q, heap.doc[pos], p.generic, sc, true, scores, i * 4);
  });
  return { docs, rank, scores, postings, evaluated };
}

/**
 * Exact top-k of one prepared query over a doc range of a segment, by the
 * ranking score, ties by doc (= record id) order. Only docs sharing at least
 * one bin with the query are hits.
 *
 * Stored weights and rankBy cosine, composite or entropy: MaxScore-style
 * pruning. Query bins are taken from the heaviest bound down; a doc not seen
 * in the bins processed so far can score at most ub(R, M), with R a bound on
 * the rest of the dot product (the smaller of the sum of per-bin maxima and
 * the Euclidean norm of the remaining query weights, by Cauchy-Schwarz) and
 * M the number of remaining bins. For the composite, ub(s, c) =
 * (N_U s^2 + c) / (N_U + c) bounds (N_U F_D + N_UL F_R) / (N_U + N_UL) since
 * F_R <= 1 and the expression grows with N_UL. Once ub(R, M) falls below the
 * k-th exact score found so far, no new doc is admitted; every seen doc whose
 * own bound still reaches the k-th score is scored exactly from the forward
 * storage, best bound first. The k-th score only ever comes from exact
 * scores, so the result equals the brute-force one.
 *
 * Reverse cosine has no useful bound (a library spectrum made of a few of the
 * query's light peaks scores 1), so it takes a full pass, accumulating both of
 * its sums, and rescoring exactly every doc within EPS of the k-th.
 */
export function searchSegment(seg: Segment, q: PreparedSpectrum, p: KernelParams): KernelResult {
  const sc = scratchFor(seg);
  const heap = new TopK(p.k);
  const lo = Math.max(0, p.lo);
  const hi = Math.min(seg.n, p.hi);
  if (q.n === 0 || hi <= lo || seg.n === 0) return finish(seg, q, p, sc, heap, 0, 0);
  const { allow, penalty, rankBy } = p;
  const slot = SCORE_SLOT[rankBy];
  const { pStart, pDoc, pW, binMaxW, binMaxE, docStart } = seg;
  const { acc, cnt, flag, touched } = sc;
  const out = new Float64Array(4);
  let nTouched = 0;
  let postings = 0;
  let evaluated = 0;

  // The query's bins that have postings, with their bounds.
  const tBin: number[] = [];
  const tQ: number[] = [];
  const tU: number[] = [];
  for (let i = 0; i < q.n; i++) {
    const b = q.bins[i];
    if (b < 0 || b >= seg.nBins || pStart[b + 1] === pStart[b]) continue;
    const x = q.w[i] / q.norm;
    tBin.push(b);
    tQ.push(x);
    if (rankBy === 'entropy') {
      const a = q.e[i];
      const m = binMaxE[b];
      tU.push(a > 0 && m > 0 ? ((a + m) * Math.log(a + m) - a * Math.log(a) - m * Math.log(m)) / LN4 : 0);
    } else tU.push(x * binMaxW[b]);
  }
  const T = tBin.length;
  const order = Array.from({ length: T }, (_, i) => i).sort((a, b) => tU[b] - tU[a] || tBin[a] - tBin[b]);

  const reset = () => {
    for (let t = 0; t < nTouched; t++) {
      const d = touched[t];
      acc[d] = 0;
      cnt[d] = 0;
      flag[d] = 0;
      if (sc.acc2) sc.acc2[d] = 0;
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

  // Generic options: the stored weights do not apply, so score every doc that shares a bin.
  if (p.generic !== null) {
    for (let t = 0; t < T; t++) {
      const b = tBin[t];
      const end = pStart[b + 1];
      for (let j = lowerBound(pDoc, pStart[b], end, lo); j < end; j++) {
        const d = pDoc[j];
        if (d >= hi) break;
        postings++;
        if (allow[d] === 0 || cnt[d] !== 0) continue;
        cnt[d] = 1;
        touched[nTouched++] = d;
      }
    }
    for (let t = 0; t < nTouched; t++) scoreDoc(touched[t]);
    const r = finish(seg, q, p, sc, heap, postings, evaluated);
    reset();
    return r;
  }

  if (rankBy === 'reverseCosine') {
    if (!sc.acc2) sc.acc2 = new Float64Array(seg.n);
    const acc2 = sc.acc2;
    for (let t = 0; t < T; t++) {
      const b = tBin[t];
      const x = tQ[t];
      const xx = x * x;
      const end = pStart[b + 1];
      for (let j = lowerBound(pDoc, pStart[b], end, lo); j < end; j++) {
        const d = pDoc[j];
        if (d >= hi) break;
        postings++;
        if (allow[d] === 0) continue;
        if (cnt[d] === 0) touched[nTouched++] = d;
        cnt[d] = 1;
        acc[d] += x * pW[j];
        acc2[d] += xx;
      }
    }
    const approxTop = new TopK(p.k);
    const approx = (d: number) => {
      const v = acc2[d] > 0 ? acc[d] / Math.sqrt(acc2[d]) : 0;
      return allow[d] === 2 ? Math.max(0, v - penalty) : v;
    };
    for (let t = 0; t < nTouched; t++) approxTop.push(approx(touched[t]), touched[t]);
    const theta = approxTop.threshold();
    for (let t = 0; t < nTouched; t++) {
      const d = touched[t];
      if (p.noPruning || approx(d) >= theta - 2 * EPS) scoreDoc(d);
    }
    const r = finish(seg, q, p, sc, heap, postings, evaluated);
    reset();
    return r;
  }

  const nU = q.n;
  const composite = rankBy === 'composite';
  const cosineLike = rankBy !== 'entropy';
  // Suffix bounds R[p] over the terms order[p..T-1].
  const R = new Float64Array(T + 1);
  {
    let s1 = 0;
    let s2 = 0;
    for (let i = T - 1; i >= 0; i--) {
      const t = order[i];
      s1 += tU[t];
      s2 += tQ[t] * tQ[t];
      R[i] = cosineLike ? Math.min(s1, Math.sqrt(s2)) : s1;
    }
  }
  const ub = (s: number, c: number): number => {
    if (!composite) return s;
    const f = Math.min(1, s);
    return c >= 2 ? (nU * f * f + c) / (nU + c) : f * f;
  };

  // Refresh the k-th exact score from the most promising seen docs.
  const refresh = () => {
    const pick = new TopK(p.k);
    for (let t = 0; t < nTouched; t++) {
      const d = touched[t];
      if (flag[d]) continue;
      pick.push(composite ? nU * acc[d] * acc[d] + cnt[d] : acc[d], d);
    }
    for (let i = 0; i < pick.size; i++) scoreDoc(pick.doc[i]);
  };

  let pos = 0;
  let nextRefresh = 1;
  while (pos < T) {
    if (!p.noPruning && ub(R[pos], Math.min(T - pos, seg.maxDocPeaks)) < heap.threshold() - EPS) break;
    const t = order[pos];
    const b = tBin[t];
    const inc = cosineLike ? tQ[t] : tU[t];
    const end = pStart[b + 1];
    for (let j = lowerBound(pDoc, pStart[b], end, lo); j < end; j++) {
      const d = pDoc[j];
      if (d >= hi) break;
      postings++;
      if (allow[d] === 0) continue;
      if (cnt[d] === 0) touched[nTouched++] = d;
      cnt[d]++;
      acc[d] += cosineLike ? inc * pW[j] : inc;
    }
    pos++;
    if (pos === nextRefresh) {
      refresh();
      nextRefresh *= 2;
    }
  }

  // Verification: every seen doc whose bound still reaches the k-th score is scored exactly.
  const rest = R[pos];
  const left = T - pos;
  const bound = (d: number) => {
    const c = Math.min(cnt[d] + left, docStart[d + 1] - docStart[d]);
    const v = ub(acc[d] + rest, c);
    return allow[d] === 2 ? v - penalty : v;
  };
  let candDocs = new Int32Array(0);
  let candUb = new Float64Array(0);
  for (let round = 0; ; round++) {
    const theta = p.noPruning ? -Infinity : heap.threshold() - EPS;
    let m = 0;
    const cd: number[] = [];
    const cu: number[] = [];
    for (let t = 0; t < nTouched; t++) {
      const d = touched[t];
      if (flag[d]) continue;
      const v = bound(d);
      if (v >= theta) {
        cd.push(d);
        cu.push(v);
        m++;
      }
    }
    if (m <= 4096 || round >= 3 || p.noPruning) {
      candDocs = Int32Array.from(cd);
      candUb = Float64Array.from(cu);
      break;
    }
    // Too many: score the k best bounds first to raise the k-th score, then filter again.
    const pick = new TopK(p.k);
    for (let i = 0; i < m; i++) pick.push(cu[i], cd[i]);
    for (let i = 0; i < pick.size; i++) scoreDoc(pick.doc[i]);
  }
  const idx = Array.from({ length: candDocs.length }, (_, i) => i).sort((a, b) => candUb[b] - candUb[a]);
  for (const i of idx) {
    if (!p.noPruning && candUb[i] < heap.threshold() - EPS) break;
    const d = candDocs[i];
    if (!flag[d]) scoreDoc(d);
  }
  const r = finish(seg, q, p, sc, heap, postings, evaluated);
  reset();
  return r;
}

/** Reference over a segment: score every allowed doc in the range exactly (no index, no pruning). */
export function bruteForceSegment(seg: Segment, q: PreparedSpectrum, p: KernelParams): KernelResult {
  const sc = scratchFor(seg);
  const heap = new TopK(p.k);
  const out = new Float64Array(4);
  const slot = SCORE_SLOT[p.rankBy];
  const hi = Math.min(seg.n, p.hi);
  let evaluated = 0;
  for (let d = Math.max(0, p.lo); d < hi; d++) {
    if (p.allow[d] === 0) continue;
    evaluated++;
    evaluate(seg, q, d, p.generic, sc, p.rankBy === 'entropy', out, 0);
    if (out[0] > 0) {
      const raw = out[slot];
      heap.push(p.allow[d] === 2 ? Math.max(0, raw - p.penalty) : raw, d);
    }
  }
  return finish(seg, q, p, sc, heap, 0, evaluated);
}

/** The memory-scan floor: one sequential pass over every stored peak's weight. */
export function scanFloor(seg: Segment): number {
  const w = seg.pW;
  let s = 0;
  for (let i = 0; i < w.length; i++) s += w[i];
  return s;
}
