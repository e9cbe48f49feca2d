import { entropyWeightAt } from './entropyWeights';
import type { ScoreName } from './types';

const LN4 = Math.log(4);

/** Index of each score in the 4-slot output of scoreMerged. */
export const SCORE_SLOT: Record<ScoreName, number> = { cosine: 0, reverseCosine: 1, composite: 2, entropy: 3 };

/**
 * All four scores of a prepared query against one prepared library spectrum
 * in a single merge over their sorted bins (the same definitions as
 * cosineScore, reverseCosineScore, compositeScore and entropySimilarity, on
 * unit-norm weights). Writes [cosine, reverseCosine, composite, entropy] into
 * `out` at `at`. Every search path and the brute-force reference score with
 * this one function, so their results agree to the last bit.
 *
 * With `lRel` set, `lE` holds the library spectrum's relative intensities and
 * lRel its entropyParams [sum, pow, sumW]: each shared peak's entropy weight
 * is computed when it is met, rounded to float32 as a stored weight array
 * would hold it (the same bits as entropyWeightsInto into a Float32Array,
 * without weighting every peak). With `qIdx` (the query's index by bin, -1
 * elsewhere, covering every library bin) shared peaks are found by lookup.
 * With `qEH` (each query peak's qE * ln qE, 0 where qE is 0: queryEntropyTerms)
 * that term is read instead of computed: the same value, one logarithm fewer
 * a shared peak.
 */
export function scoreMerged(
  qBins: Int32Array,
  qW: ArrayLike<number>,
  qE: ArrayLike<number>,
  qN: number,
  qNorm: number,
  lBins: ArrayLike<number>,
  lW: ArrayLike<number>,
  lE: ArrayLike<number>,
  start: number,
  end: number,
  lNorm: number,
  withEntropy: boolean,
  out: Float64Array,
  at = 0,
  lRel: Float64Array | null = null,
  qIdx: Int32Array | null = null,
  qEH: Float64Array | null = null,
): void {
  let i = 0;
  let dot = 0;
  let qShared = 0;
  let nShared = 0;
  let ratioSum = 0;
  let prevQ = 0;
  let prevL = 0;
  let ent = 0;
  // The library peaks in m/z order; each finds its query peak through qIdx
  // (bin -> query index, -1 where the query has none: one test a peak) or
  // by merging with the query's sorted bins. Either way the shared peaks
  // come in the same order, so the sums are the same to the bit.
  for (let j = start; j < end; j++) {
    const b = lBins[j];
    if (qIdx !== null) {
      const k = qIdx[b];
      if (k < 0) continue;
      i = k;
    } else {
      while (i < qN && qBins[i] < b) i++;
      if (i >= qN) break;
      if (qBins[i] !== b) continue;
    }
    const x = qW[i];
    const y = lW[j];
    dot += x * y;
    qShared += x * x;
    if (nShared > 0) {
      const r = (y / prevL) * (prevQ / x);
      ratioSum += r <= 1 ? r : 1 / r;
    }
    prevQ = x;
    prevL = y;
    nShared++;
    if (withEntropy) {
      const ea = qE[i];
      const eb = lRel === null ? lE[j] : Math.fround(entropyWeightAt(lE[j], lRel[0], lRel[1], lRel[2]));
      if (ea > 0 && eb > 0) ent += (ea + eb) * Math.log(ea + eb) - (qEH === null ? ea * Math.log(ea) : qEH[i]) - eb * Math.log(eb);
    }
  }
  if (nShared === 0 || !(qNorm > 0) || !(lNorm > 0)) {
    out[at] = 0;
    out[at + 1] = 0;
    out[at + 2] = 0;
    out[at + 3] = 0;
    return;
  }
  const cos = Math.min(1, dot / (qNorm * lNorm));
  out[at] = cos;
  out[at + 1] = qShared > 0 ? Math.min(1, dot / (Math.sqrt(qShared) * lNorm)) : 0;
  const fD = cos * cos;
  // Stein & Scott 1994 composite; F_R averaged over the N_UL - 1 adjacent pairs (see compositeScore).
  out[at + 2] = nShared < 2 ? fD : Math.min(1, (qN * fD + nShared * (ratioSum / (nShared - 1))) / (qN + nShared));
  out[at + 3] = withEntropy ? Math.min(1, Math.max(0, ent / LN4)) : 0;
}

/** Each query peak's qE * ln qE (0 where qE is not positive) into `out`, for scoreMerged's qEH. */
export function queryEntropyTerms(qE: ArrayLike<number>, n: number, out: Float64Array): void {
  for (let i = 0; i < n; i++) {
    const ea = qE[i];
    out[i] = ea > 0 ? ea * Math.log(ea) : 0;
  }
}
