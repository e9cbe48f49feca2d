// One search against the process's index, with the lab's defaults, the
// caller's status rights and API.md's answer shape.
import { HttpError } from '../http';
import { can, type Role } from '../roles';
import { getLibraryIndex, libraryIndexStatus } from '../library-index';
import type { SearchFilters, SearchOptions, SearchHit } from '../search/types';
import { getSearchDefaults } from './search-defaults';
import type { Peak } from './resolve-query';

export const HIT_CAUTION =
  'A hit is a candidate, not a confirmed identity. Confirm an identification with an authentic reference standard analysed under your laboratory\'s procedures.';

/** Above this many indexed spectra a single search runs in the worker pool. */
export const IN_THREAD_MAX_SPECTRA = 20_000;

export interface ApiHit {
  rank: number;
  spectrumId: number;
  version: number;
  name: string;
  formula: string | null;
  nominalMass: number | null;
  ihd: number | null;
  scores: SearchHit['scores'];
  score: number;
  riDelta?: number;
}

export function toApiHit(h: SearchHit): ApiHit {
  return {
    rank: h.rank,
    spectrumId: h.recordId,
    version: h.version,
    name: h.name,
    formula: h.formula,
    nominalMass: h.nominalMass,
    ihd: h.ihd,
    scores: h.scores,
    score: h.score,
    ...(h.riDelta !== undefined ? { riDelta: h.riDelta } : {}),
  };
}

export async function prepareSearch(
  filters: SearchFilters | undefined,
  options: SearchOptions | undefined,
  limit: number | undefined,
  roles: readonly Role[],
): Promise<{ filters: SearchFilters; options: SearchOptions }> {
  if (!libraryIndexStatus().ready) throw new HttpError(503, 'index_not_ready', 'The search index is still being built; try again in a moment');
  const f: SearchFilters = { ...(filters ?? {}) };
  if (f.status && f.status.some((s) => s !== 'released') && !(can(roles, 'curate') || can(roles, 'audit'))) {
    throw new HttpError(403, 'forbidden', 'filters.status: only curators and auditors may search drafts and records in review');
  }
  if (f.ihdMin !== undefined && f.ihdMax !== undefined && f.ihdMin > f.ihdMax) {
    throw new HttpError(400, 'invalid_input', 'filters.ihdMin: must not exceed ihdMax');
  }
  const d = await getSearchDefaults();
  const o: SearchOptions = {
    rankBy: options?.rankBy ?? d.rankBy,
    weights: options?.weights ?? d.weights,
    lowMassCutoff: options?.lowMassCutoff ?? d.lowMassCutoff,
    excludeIons: options?.excludeIons ?? d.excludeIons,
    ...(options?.tolerance !== undefined ? { tolerance: options.tolerance } : {}),
    ...(options?.noiseFloor !== undefined ? { noiseFloor: options.noiseFloor } : {}),
    limit: limit ?? d.limit,
  };
  return { filters: f, options: o };
}

export async function runSearch(peaks: Peak[], filters: SearchFilters, options: SearchOptions) {
  const index = getLibraryIndex();
  // A lab-sized library answers in well under a millisecond in this thread;
  // a large one is split across the worker pool so the event loop stays free.
  const r = index.size > IN_THREAD_MAX_SPECTRA ? await index.searchAsync(peaks, options, filters) : index.search(peaks, options, filters);
  return { hits: r.hits.map(toApiHit), searched: r.searched, tookMs: r.tookMs, libraryVersion: index.libraryVersion };
}
