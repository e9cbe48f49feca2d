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
  return cands.slice(0, limit).map((c, i) => makeHit(i + 1, c.meta ?? metaOfDoc(c.doc), c.scores, c.at, c.score, filters));
}

/**
 * The hits of one kernel result straight from its arrays (no candidate
 * objects, no sort) when they are already in hit order: ranking score
 * descending, then doc, which is (record id, spectrum id) order. null when
 * they are not, and toHits must sort them.
 */
export function hitsInOrder(docs: ArrayLike<number>, rank: ArrayLike<number>, scores: ArrayLike<number>, limit: number, filters: SearchFilters | undefined, metaOfDoc: (doc: number) => EntryMeta): SearchHit[] | null {
  const n = Math.min(limit, docs.length);
  for (let i = 1; i < docs.length; i++) {
    if (!(rank[i - 1] > rank[i] || (rank[i - 1] === rank[i] && docs[i - 1] < docs[i]))) return null;
  }
  const hits: SearchHit[] = new Array(n);
  for (let i = 0; i < n; i++) hits[i] = makeHit(i + 1, metaOfDoc(docs[i]), scores, 4 * i, rank[i], filters);
  return hits;
}

function makeHit(rank: number, m: EntryMeta, s: ArrayLike<number>, at: number, score: number, filters: SearchFilters | undefined): SearchHit {
  const scores: Record<ScoreName, number> = { cosine: s[at], reverseCosine: s[at + 1], composite: s[at + 2], entropy: s[at + 3] };
  const hit: SearchHit = {
    rank,
    recordId: m.recordId,
    spectrumId: m.spectrumId,
    version: m.version,
    name: m.name,
    formula: m.formula,
    nominalMass: m.nominalMass,
    ihd: m.ihd,
    scores,
    score,
  };
  const delta = riDelta(m, filters);
  if (delta !== undefined) hit.riDelta = delta;
  return hit;
}
