import { checkTolerance } from './binPeaks';
import { checkLowMassCutoff } from './applyLowMassCutoff';
import { checkNoiseFloor } from './applyNoiseFloor';
import { checkExcludeIons } from './excludeIons';
import { checkWeights, DEFAULT_WEIGHTS } from './weightPeaks';
import { SCORE_NAMES, type PeakWeights, type ScoreName, type SearchOptions } from './types';

export interface IndexOptions {
  /** m/z bin width of the stored library. @default 1 (unit mass) */
  tolerance?: number;
  /** Weighting precomputed into the index (searches with other weights are exact but slower). @default { mz: 3, intensity: 0.6 } */
  weights?: PeakWeights;
  /** Noise floor applied when spectra are stored (fraction of the base peak). @default 0 */
  noiseFloor?: number;
  /** Entries added after a build wait in a small side store; beyond this many the index compacts. @default 2048 */
  maxPending?: number;
}

export interface ResolvedIndexOptions {
  tolerance: number;
  weights: PeakWeights;
  noiseFloor: number;
  maxPending: number;
}

export function resolveIndexOptions(options: IndexOptions = {}): ResolvedIndexOptions {
  const tolerance = options.tolerance ?? 1;
  checkTolerance(tolerance);
  const weights = options.weights ?? { ...DEFAULT_WEIGHTS };
  checkWeights(weights);
  const noiseFloor = options.noiseFloor ?? 0;
  checkNoiseFloor(noiseFloor);
  const maxPending = options.maxPending ?? 2048;
  if (!Number.isInteger(maxPending) || maxPending < 0) throw new RangeError('maxPending must be an integer >= 0');
  return { tolerance, weights: { mz: weights.mz, intensity: weights.intensity }, noiseFloor, maxPending };
}

/** Search options after defaults and checks; plain data, so it can cross to a worker. */
export interface ResolvedSearchOptions {
  rankBy: ScoreName;
  weights: PeakWeights;
  /** 0 means off. */
  lowMassCutoff: number;
  /** Excluded bins (bin numbers at the index tolerance), sorted. */
  excludeBins: number[];
  noiseFloor: number;
  tolerance: number;
  limit: number;
  /** True when the library side needs no re-preprocessing (the index's stored weights apply). */
  stored: boolean;
}

export const DEFAULT_LIMIT = 50;
export const MAX_LIMIT = 500;

/** Apply defaults and reject bad options with a RangeError naming the option. */
export function resolveSearchOptions(options: SearchOptions = {}, index: ResolvedIndexOptions = resolveIndexOptions()): ResolvedSearchOptions {
  const rankBy = options.rankBy ?? 'composite';
  if (!SCORE_NAMES.includes(rankBy)) throw new RangeError(`rankBy must be one of ${SCORE_NAMES.join(', ')}`);
  const weights = options.weights ?? index.weights;
  checkWeights(weights);
  const lowMassCutoff = options.lowMassCutoff ?? 0;
  checkLowMassCutoff(lowMassCutoff);
  const ions = options.excludeIons ?? [];
  checkExcludeIons(ions);
  const tolerance = options.tolerance ?? index.tolerance;
  checkTolerance(tolerance);
  if (tolerance !== index.tolerance) {
    throw new RangeError(`tolerance must equal the index's bin width (${index.tolerance}); the library is stored binned`);
  }
  // The library is stored after the index's own noise floor, so a lower one cannot apply.
  const noiseFloor = Math.max(options.noiseFloor ?? index.noiseFloor, index.noiseFloor);
  checkNoiseFloor(noiseFloor);
  const limit = options.limit ?? DEFAULT_LIMIT;
  if (!Number.isInteger(limit) || limit < 1 || limit > MAX_LIMIT) throw new RangeError(`limit must be an integer in 1..${MAX_LIMIT}`);
  const excludeBins = [...new Set(ions.map((ion) => Math.round(ion / tolerance)))].sort((a, b) => a - b);
  const stored =
    weights.mz === index.weights.mz &&
    weights.intensity === index.weights.intensity &&
    lowMassCutoff === 0 &&
    excludeBins.length === 0 &&
    noiseFloor === index.noiseFloor;
  return { rankBy, weights: { mz: weights.mz, intensity: weights.intensity }, lowMassCutoff, excludeBins, noiseFloor, tolerance, limit, stored };
}
