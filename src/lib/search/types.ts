/** A peak as [m/z, intensity]. Intensities may come on any scale. */
export type Peak = [number, number];

export type SpectrumStatus = 'released' | 'in_review' | 'draft';

/** One spectrum version as the search index holds it. */
export interface LibraryEntry {
  /** Internal row id of a spectrum version (unique in the index). */
  spectrumId: number;
  /** Stable record id (the API's `:id`, a hit's `spectrumId`). */
  recordId: number;
  version: number;
  name: string;
  formula: string | null;
  nominalMass: number | null;
  ihd: number | null;
  /** Element symbols present, e.g. `['C', 'H', 'Cl']`. */
  elements: string[];
  tags: string[];
  status: SpectrumStatus;
  /** Retention indices, one per stationary-phase class. */
  ri: { phase: string; value: number }[];
  /** Raw centroided (or profile) peaks on any intensity scale. */
  peaks: Peak[];
}

export interface RiFilter {
  /** The unknown's retention index. */
  value: number;
  /** Half-width of the accepted window (|RI(library) - value| <= window). */
  window: number;
  /** Stationary-phase class the RI refers to, e.g. `'non-polar'`. */
  phase: string;
  /**
   * Without a penalty the window is a hard filter. With one (0..1), spectra
   * outside the window or without an RI on that phase stay in the search and
   * their ranking score is lowered by this amount (never below 0).
   */
  penalty?: number;
}

export interface SearchFilters {
  /** Molecular formula; compared in Hill order, so `H2O` equals `OH2`. */
  formula?: string;
  /** Elements that must all be present. */
  elements?: string[];
  /** Elements that must all be absent. */
  excludeElements?: string[];
  ihdMin?: number;
  ihdMax?: number;
  massMin?: number;
  massMax?: number;
  /** Tags that must all be present. */
  tags?: string[];
  /** @default ['released'] */
  status?: SpectrumStatus[];
  ri?: RiFilter;
}

export type ScoreName = 'cosine' | 'reverseCosine' | 'composite' | 'entropy';

export const SCORE_NAMES: readonly ScoreName[] = ['cosine', 'reverseCosine', 'composite', 'entropy'];

export interface PeakWeights {
  /** Exponent a of m/z in m/z^a * I^b. @default 3 */
  mz: number;
  /** Exponent b of the intensity in m/z^a * I^b. @default 0.6 */
  intensity: number;
}

export interface SearchOptions {
  /** Ranking score. @default 'composite' */
  rankBy?: ScoreName;
  /** Peak weighting m/z^a * I^b. @default { mz: 3, intensity: 0.6 } */
  weights?: PeakWeights;
  /** Drop bins below this m/z, in query and library alike. @default undefined (off) */
  lowMassCutoff?: number;
  /** Drop these ions (bins), in query and library alike. @default [] */
  excludeIons?: number[];
  /**
   * m/z bin width. The library is stored binned, so this must equal the
   * index's own `tolerance`; it is accepted here so callers can state it.
   * @default the index's tolerance (1, unit mass)
   */
  tolerance?: number;
  /** Drop peaks below this fraction of the base peak, in query and library alike. @default 0 (off) */
  noiseFloor?: number;
  /** Hits to return, 1..500. @default 50 */
  limit?: number;
}

export interface SearchHit {
  rank: number;
  recordId: number;
  spectrumId: number;
  version: number;
  name: string;
  formula: string | null;
  nominalMass: number | null;
  ihd: number | null;
  /** All four scores, each 0..1. */
  scores: Record<ScoreName, number>;
  /** The ranking score (after an RI penalty, if any), 0..1. */
  score: number;
  /** Library RI minus the filter's RI, when an RI filter was given and the spectrum has one on that phase. */
  riDelta?: number;
}

export interface SearchResult {
  hits: SearchHit[];
  /** Spectra that passed the filters (the candidates compared). */
  searched: number;
  tookMs: number;
}
