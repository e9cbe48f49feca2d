import { compileFilters, type EntryMeta } from './filters';
import { toHits, type Candidate } from './hits';
import { resolveIndexOptions, resolveSearchOptions, type IndexOptions } from './options';
import { prepareQuery, stage, stageStored, storeSpectrum } from './prepare';
import { scoreMerged, SCORE_SLOT } from './scorePrepared';
import type { LibraryEntry, Peak, SearchFilters, SearchOptions, SearchResult } from './types';

/**
 * The reference: compare the query with every entry, one by one, with no
 * index and no pruning. Same preprocessing and stored precision as the index,
 * same scoring function, same order (ranking score, then record id, then
 * spectrum id); spectra sharing no peak with the query are not hits.
 */
export function bruteForceSearch(
  entries: Iterable<LibraryEntry>,
  peaks: readonly Peak[],
  options: SearchOptions = {},
  filters: SearchFilters = {},
  indexOptions: IndexOptions = {},
): SearchResult {
  const t0 = performance.now();
  const io = resolveIndexOptions(indexOptions);
  const o = resolveSearchOptions(options, io);
  const pred = compileFilters(filters);
  const q = prepareQuery(peaks, o);
  const byId = new Map<number, LibraryEntry>();
  for (const e of entries) byId.set(e.spectrumId, e);
  const cands: Candidate[] = [];
  let searched = 0;
  const slot = SCORE_SLOT[o.rankBy];
  const penalty = filters.ri?.penalty ?? 0;
  for (const e of byId.values()) {
    const allow = pred(e);
    if (allow === 0) continue;
    searched++;
    const stored = storeSpectrum(e.peaks, io.tolerance, io.noiseFloor);
    const lib = o.stored ? stageStored(stored, io.tolerance, io.weights) : stage(stored, o);
    const out = new Float64Array(4);
    scoreMerged(q.bins, q.w, q.e, q.n, q.norm, lib.bins, lib.w, lib.e, 0, lib.n, lib.norm, true, out);
    if (!(out[0] > 0)) continue;
    const raw = out[slot];
    const { peaks: _peaks, ...meta } = e;
    cands.push({ score: allow === 2 ? Math.max(0, raw - penalty) : raw, recordId: e.recordId, spectrumId: e.spectrumId, scores: out, at: 0, doc: -1, meta: meta as EntryMeta });
  }
  return { hits: toHits(cands, o.limit, filters, () => { throw new Error('no segment'); }), searched, tookMs: performance.now() - t0 };
}
