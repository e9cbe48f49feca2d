import { centroid, CENTROID_MAX_GAP, looksLikeProfile } from './centroid';
import { dropInvalid } from './dropInvalid';
import { binPeaks, binSortedRuns, checkTolerance } from './binPeaks';
import { normalizeToBase } from './normalizeToBase';
import { applyNoiseFloor } from './applyNoiseFloor';
import { entropyWeightsInto } from './entropyWeights';
import type { ResolvedSearchOptions } from './options';
import type { Peak, PeakWeights } from './types';

/**
 * A spectrum as the library stores it: bin numbers (sorted, unique) and
 * intensities relative to the base peak, rounded to 32-bit floats (the
 * stored precision, which the brute-force reference applies too).
 */
export interface StoredSpectrum {
  bins: Int32Array;
  rel: Float32Array;
}

/** Stage 1, done once per library spectrum: centroid, drop invalid, bin, normalize, index noise floor. */
export function storeSpectrum(peaks: readonly Peak[], tolerance = 1, noiseFloor = 0): StoredSpectrum {
  const binned = applyNoiseFloor(normalizeToBase(binPeaks(dropInvalid(centroid(dropInvalid(peaks))), { tolerance })), noiseFloor);
  const bins = new Int32Array(binned.length);
  const rel = new Float32Array(binned.length);
  for (let i = 0; i < binned.length; i++) {
    bins[i] = Math.round(binned[i][0] / tolerance);
    rel[i] = binned[i][1];
  }
  return { bins, rel };
}

/** A spectrum ready for scoring: unit-norm weights and entropy intensities per bin. */
export interface PreparedSpectrum {
  bins: Int32Array;
  /** m/z^a * I^b, scaled to unit Euclidean norm. */
  w: Float64Array | Float32Array;
  /** Entropy-weighted intensities summing to 1 (Li et al. 2021). */
  e: Float64Array | Float32Array;
  /** sqrt(sum w^2) of the values as held (1 up to rounding). */
  norm: number;
  /** Peak count. */
  n: number;
}

/**
 * Stage 2, per search options: noise floor, low-mass cutoff, excluded bins,
 * m/z^a * I^b weighting scaled to unit norm, and the entropy weighting.
 * Reads `bins`/`rel` in [start, end) and writes up to end - start values into
 * the outputs; returns the kept count and the norm of the written weights.
 */
export function stageInto(
  bins: ArrayLike<number>,
  rel: ArrayLike<number>,
  start: number,
  end: number,
  tolerance: number,
  weights: PeakWeights,
  noiseFloor: number,
  lowMassCutoff: number,
  excludeBins: readonly number[],
  outBins: Int32Array,
  outW: Float64Array | Float32Array,
  outE: Float64Array | Float32Array,
): { n: number; norm: number } {
  let n = 0;
  let x = 0;
  const minBin = lowMassCutoff > 0 ? Math.ceil(lowMassCutoff / tolerance - 1e-9) : -Infinity;
  for (let j = start; j < end; j++) {
    const bin = bins[j];
    const r = rel[j];
    if (r < noiseFloor) continue;
    if (bin < minBin || bin * tolerance < lowMassCutoff) continue;
    if (excludeBins.length > 0) {
      while (x < excludeBins.length && excludeBins[x] < bin) x++;
      if (x < excludeBins.length && excludeBins[x] === bin) continue;
    }
    outBins[n] = bin;
    outE[n] = r;
    n++;
  }
  let ss = 0;
  const tmp = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const mz = outBins[i] * tolerance;
    const w = mz ** weights.mz * outE[i] ** weights.intensity;
    tmp[i] = w;
    ss += w * w;
  }
  const scale = ss > 0 ? 1 / Math.sqrt(ss) : 0;
  let norm2 = 0;
  for (let i = 0; i < n; i++) {
    outW[i] = tmp[i] * scale;
    const v = outW[i];
    norm2 += v * v;
  }
  // outE holds the relative intensities; turn them into entropy intensities in place.
  const view = outE.subarray(0, n);
  entropyWeightsInto(view, view);
  return { n, norm: Math.sqrt(norm2) };
}

/** Stage 2 into fresh arrays (64-bit, for queries and for re-preprocessed library spectra). */
export function stage(stored: StoredSpectrum, o: Pick<ResolvedSearchOptions, 'tolerance' | 'weights' | 'noiseFloor' | 'lowMassCutoff' | 'excludeBins'>): PreparedSpectrum {
  const len = stored.bins.length;
  const bins = new Int32Array(len);
  const w = new Float64Array(len);
  const e = new Float64Array(len);
  const { n, norm } = stageInto(stored.bins, stored.rel, 0, len, o.tolerance, o.weights, o.noiseFloor, o.lowMassCutoff, o.excludeBins, bins, w, e);
  return { bins: bins.subarray(0, n), w: w.subarray(0, n), e: e.subarray(0, n), norm, n };
}

/** Stage 2 with the index's own weights into 32-bit arrays: exactly what the index stores. */
export function stageStored(stored: StoredSpectrum, tolerance: number, weights: PeakWeights): PreparedSpectrum {
  const len = stored.bins.length;
  const bins = new Int32Array(len);
  const w = new Float32Array(len);
  const e = new Float32Array(len);
  const { n, norm } = stageInto(stored.bins, stored.rel, 0, len, tolerance, weights, 0, 0, [], bins, w, e);
  return { bins: bins.subarray(0, n), w: w.subarray(0, n), e: e.subarray(0, n), norm, n };
}

type QueryOptions = Pick<ResolvedSearchOptions, 'tolerance' | 'weights' | 'noiseFloor' | 'lowMassCutoff' | 'excludeBins'>;

/** Query preparation: stage 1 without f32 rounding, then stage 2 with the search's options. */
export function prepareQuery(peaks: readonly Peak[], o: QueryOptions): PreparedSpectrum {
  return centroidedQuery(peaks, o) ?? prepareQueryStaged(peaks, o);
}

/** prepareQuery stage by stage (dropInvalid, centroid, dropInvalid, binPeaks, normalizeToBase): every query's definition. */
export function prepareQueryStaged(peaks: readonly Peak[], o: QueryOptions): PreparedSpectrum {
  const binned = normalizeToBase(binPeaks(dropInvalid(centroid(dropInvalid(peaks))), { tolerance: o.tolerance }));
  const bins = new Int32Array(binned.length);
  const rel = new Float64Array(binned.length);
  for (let i = 0; i < binned.length; i++) {
    bins[i] = Math.round(binned[i][0] / o.tolerance);
    rel[i] = binned[i][1];
  }
  return stage({ bins, rel: rel as unknown as Float32Array }, o);
}

/**
 * prepareQueryStaged in one pass over flat arrays for centroided input (the
 * usual EI query; a batch worker prepared each in 28 us through the stages,
 * an array per peak per stage): the same valid peaks in the same (stable)
 * m/z order, the same sums per bin in the same order, the same division by
 * the base peak, so the same bits. null for profile data, which the stages
 * centroid.
 */
function centroidedQuery(peaks: readonly Peak[], o: QueryOptions): PreparedSpectrum | null {
  const tol = o.tolerance;
  checkTolerance(tol);
  const n0 = peaks.length;
  let mz = new Float64Array(n0);
  let inten = new Float64Array(n0);
  let n = 0;
  let sorted = true;
  for (let i = 0; i < n0; i++) {
    const p = peaks[i];
    if (!Array.isArray(p) && !(p && typeof p === 'object')) continue;
    const m = p[0];
    const v = p[1];
    if (typeof m !== 'number' || typeof v !== 'number') continue;
    if (!Number.isFinite(m) || !Number.isFinite(v) || m <= 0 || v <= 0) continue;
    if (n > 0 && m < mz[n - 1]) sorted = false;
    mz[n] = m;
    inten[n] = v;
    n++;
  }
  if (!sorted) {
    // centroid's sort is stable: equal m/z keep their input order.
    const idx = Array.from({ length: n }, (_, i) => i).sort((a, b) => mz[a] - mz[b] || a - b);
    const m2 = new Float64Array(n);
    const v2 = new Float64Array(n);
    for (let i = 0; i < n; i++) {
      m2[i] = mz[idx[i]];
      v2[i] = inten[idx[i]];
    }
    mz = m2;
    inten = v2;
  }
  // centroid's test for profile data.
  let close = 0;
  for (let k = 1; k < n; k++) if (mz[k] - mz[k - 1] <= CENTROID_MAX_GAP) close++;
  if (looksLikeProfile(close, n)) return null;
  const bins = new Int32Array(n);
  const rel = new Float64Array(n);
  let nb = binSortedRuns(mz, 0, inten, 0, n, tol, bins, rel);
  let base = 0;
  for (let i = 0; i < nb; i++) if (rel[i] > base) base = rel[i];
  if (!(base > 0)) nb = 0;
  for (let i = 0; i < nb; i++) {
    // binPeaks' m/z of the bin, then the bin of that m/z, as the stages compute it.
    bins[i] = Math.round((tol === 1 ? bins[i] : bins[i] * tol) / tol);
    rel[i] = rel[i] / base;
  }
  return stage({ bins: bins.subarray(0, nb), rel: rel.subarray(0, nb) as unknown as Float32Array }, o);
}
