import type { SearchTask, TaskHits } from './runSearchTask';
import type { Peak } from './types';

// How a pool task and its hits cross to a worker thread and back: the
// queries' peaks as two flat float arrays and the hits of all its queries in
// three, instead of an array per peak and three per query (a 32-query task
// took 380 us to copy as arrays, 18 as flat ones, measured here; fewer
// objects for either thread's garbage collector too).

/** The queries of a task, flat: query i owns peaks ends[i-1] .. ends[i]-1. */
export interface PackedQueries {
  mz: Float64Array;
  intensity: Float64Array;
  ends: Uint32Array;
}

/** A task as it is posted: its queries packed when every value is a number (else as they are). */
export type WireTask = Omit<SearchTask, 'queries'> & { queries: Peak[][] | null; packed: PackedQueries | null };

/** The hits of a task's queries, flat: query i owns hits ends[i-1] .. ends[i]-1 (scores 4 a hit). */
export interface PackedHits {
  docs: Int32Array;
  rank: Float64Array;
  scores: Float64Array;
  ends: Uint32Array;
}

export function toWire(task: SearchTask): WireTask {
  const qs = task.queries;
  let n = 0;
  for (const q of qs) {
    if (!Array.isArray(q)) return { ...task, packed: null };
    for (const p of q) {
      if (!Array.isArray(p) || p.length !== 2 || typeof p[0] !== 'number' || typeof p[1] !== 'number') return { ...task, packed: null };
    }
    n += q.length;
  }
  const mz = new Float64Array(n);
  const intensity = new Float64Array(n);
  const ends = new Uint32Array(qs.length);
  let at = 0;
  qs.forEach((q, i) => {
    for (const p of q) {
      mz[at] = p[0];
      intensity[at] = p[1];
      at++;
    }
    ends[i] = at;
  });
  return { ...task, queries: null, packed: { mz, intensity, ends } };
}

export function fromWire(w: WireTask): SearchTask {
  if (w.packed === null) return { ...w, queries: w.queries ?? [] };
  const { mz, intensity, ends } = w.packed;
  const queries: Peak[][] = new Array(ends.length);
  let at = 0;
  for (let i = 0; i < ends.length; i++) {
    const q: Peak[] = new Array(ends[i] - at);
    for (let j = 0; at < ends[i]; j++, at++) q[j] = [mz[at], intensity[at]];
    queries[i] = q;
  }
  const { packed: _packed, ...rest } = w;
  return { ...rest, queries };
}

export function packHits(parts: TaskHits[]): PackedHits {
  let n = 0;
  for (const p of parts) n += p.docs.length;
  const docs = new Int32Array(n);
  const rank = new Float64Array(n);
  const scores = new Float64Array(4 * n);
  const ends = new Uint32Array(parts.length);
  let at = 0;
  parts.forEach((p, i) => {
    docs.set(p.docs, at);
    rank.set(p.rank, at);
    scores.set(p.scores.subarray(0, 4 * p.docs.length), 4 * at);
    at += p.docs.length;
    ends[i] = at;
  });
  return { docs, rank, scores, ends };
}

/** The hits again, query by query, as views into the packed arrays (no copy). */
export function unpackHits(h: PackedHits): TaskHits[] {
  const out: TaskHits[] = new Array(h.ends.length);
  let at = 0;
  for (let i = 0; i < h.ends.length; i++) {
    const end = h.ends[i];
    out[i] = { docs: h.docs.subarray(at, end), rank: h.rank.subarray(at, end), scores: h.scores.subarray(4 * at, 4 * end) };
    at = end;
  }
  return out;
}
