import { centroid } from './centroid';
import { dropInvalid } from './dropInvalid';
import { binPeaks } from './binPeaks';
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

/** Query preparation: stage 1 without f32 rounding, then stage 2 with the search's options. */
export function prepareQuery(peaks: readonly Peak[], o: Pick<ResolvedSearchOptions, 'tolerance' | 'weights' | 'noiseFloor' | 'lowMassCutoff' | 'excludeBins'>): PreparedSpectrum {
  const binned = normalizeToBase(binPeaks(dropInvalid(centroid(dropInvalid(peaks))), { tolerance: o.tolerance }));
  const bins = new Int32Array(binned.length);
  const rel = new Float64Array(binned.length);
  for (let i = 0; i < binned.length; i++) {
    bins[i] = Math.round(binned[i][0] / o.tolerance);
    rel[i] = binned[i][1];
  }
  return stage({ bins, rel: rel as unknown as Float32Array }, o);
}
