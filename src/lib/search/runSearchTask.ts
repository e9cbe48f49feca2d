import { prepareQuery } from './prepare';
import type { ResolvedSearchOptions } from './options';
import { bruteForceSegment, searchSegment, type KernelParams } from './searchSegment';
import type { Segment } from './segment';
import type { Peak } from './types';

/** A unit of work for the pool (or the main thread): some queries against a doc range of a segment. */
export interface SearchTask {
  kind: 'search' | 'brute';
  seg: Segment;
  /** Filter mask (0 excluded, 1 searched, 2 penalized); null: every live doc. */
  allow: Uint8Array | null;
  penalty: number;
  options: ResolvedSearchOptions;
  queries: Peak[][];
  lo: number;
  hi: number;
}

export interface TaskHits {
  docs: Int32Array;
  rank: Float64Array;
  scores: Float64Array;
}

/** Runs a task to completion; the worker's handler and the in-thread path alike. */
export function runSearchTask(task: SearchTask): TaskHits[] {
  const o = task.options;
  const params: KernelParams = {
    k: o.limit,
    rankBy: o.rankBy,
    allow: task.allow ?? task.seg.live,
    penalty: task.penalty,
    lo: task.lo,
    hi: task.hi,
    generic: o.stored ? null : { tolerance: o.tolerance, weights: o.weights, noiseFloor: o.noiseFloor, lowMassCutoff: o.lowMassCutoff, excludeBins: o.excludeBins },
  };
  const run = task.kind === 'brute' ? bruteForceSegment : searchSegment;
  return task.queries.map((peaks) => {
    const r = run(task.seg, prepareQuery(peaks, o), params);
    return { docs: r.docs, rank: r.rank, scores: r.scores };
  });
}
