import { riDelta, type EntryMeta } from './filters';
import type { ScoreName, SearchFilters, SearchHit } from './types';

/** A scored candidate before it becomes a SearchHit. */
export interface Candidate {
  score: number;
  recordId: number;
  spectrumId: number;
  /** [cosine, reverseCosine, composite, entropy] */
  scores: ArrayLike<number>;
  at: number;
  /** Segment doc, or -1 with `meta` set (a pending entry). */
  doc: number;
  meta: EntryMeta | null;
}

/** Hit order: ranking score descending, then record id, then spectrum id. */
export function compareCandidates(a: Candidate, b: Candidate): number {
  return b.score - a.score || a.recordId - b.recordId || a.spectrumId - b.spectrumId;
}

export function toHits(cands: Candidate[], limit: number, filters: SearchFilters | undefined, metaOfDoc: (doc: number) => EntryMeta): SearchHit[] {
  cands.sort(compareCandidates);
  return cands.slice(0, limit).map((c, i) => {
    const m = c.meta ?? metaOfDoc(c.doc);
    const s = c.scores;
    const scores: Record<ScoreName, number> = { cosine: s[c.at], reverseCosine: s[c.at + 1], composite: s[c.at + 2], entropy: s[c.at + 3] };
    const hit: SearchHit = {
      rank: i + 1,
      recordId: m.recordId,
      spectrumId: m.spectrumId,
      version: m.version,
      name: m.name,
      formula: m.formula,
      nominalMass: m.nominalMass,
      ihd: m.ihd,
      scores,
      score: c.score,
    };
    const delta = riDelta(m, filters);
    if (delta !== undefined) hit.riDelta = delta;
    return hit;
  });
}
