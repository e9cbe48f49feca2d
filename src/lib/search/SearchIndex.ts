import { checkFilters, compileFilters, type EntryMeta } from './filters';
import { hitsInOrder, toHits, type Candidate } from './hits';
import { resolveIndexOptions, resolveSearchOptions, type IndexOptions, type ResolvedIndexOptions, type ResolvedSearchOptions } from './options';
import { closeSearchPool, getSearchPool } from './pool';
import { prepareQuery, stage, stageStored, storeSpectrum, type PreparedSpectrum, type StoredSpectrum } from './prepare';
import { runSearchTask, type SearchTask, type TaskHits } from './runSearchTask';
import { scoreMerged, SCORE_SLOT } from './scorePrepared';
import { buildSegment, segmentBytes, type Segment, type StoredColumns } from './segment';
import type { LibraryEntry, Peak, SearchFilters, SearchOptions, SearchResult, SpectrumStatus } from './types';

interface Pending {
  meta: EntryMeta;
  stored: StoredSpectrum;
  prepared: PreparedSpectrum;
}

interface Mask {
  stamp: number;
  allow: Uint8Array | null;
  searched: number;
  pred: (m: EntryMeta) => 0 | 1 | 2;
}

/** Docs per in-thread slice when no worker pool is available, so the event loop gets a turn in between. */
const SLICE_DOCS = 100_000;
/** Below this many docs a single search runs in the calling thread (it takes well under a millisecond or two). */
const POOL_MIN_DOCS = 50_000;
/** Queries per pool task in a batch. */
const BATCH_CHUNK = 32;

/** The empty lists of a doc without metadata, shared (and frozen: never written). */
const NONE = Object.freeze([]) as unknown as never[];

const yieldToLoop = () => new Promise<void>((resolve) => setImmediate(resolve));

function validateEntry(e: LibraryEntry): void {
  if (!e || typeof e !== 'object') throw new RangeError('entry must be an object');
  if (!Number.isFinite(e.spectrumId)) throw new RangeError('entry.spectrumId must be a number');
  if (!Number.isFinite(e.recordId)) throw new RangeError('entry.recordId must be a number');
  if (!Array.isArray(e.peaks)) throw new RangeError('entry.peaks must be an array of [mz, intensity]');
}

function metaOf(e: LibraryEntry): EntryMeta {
  return {
    spectrumId: e.spectrumId,
    recordId: e.recordId,
    version: e.version,
    name: e.name,
    formula: e.formula ?? null,
    nominalMass: e.nominalMass ?? null,
    ihd: e.ihd ?? null,
    elements: e.elements ?? [],
    tags: e.tags ?? [],
    status: e.status,
    ri: e.ri ?? [],
  };
}

function emptyColumns(): StoredColumns {
  return { count: 0, offsets: [0], bins: new Int32Array(0), rel: new Float32Array(0), recordIds: [], spectrumIds: [] };
}

/**
 * The in-memory library for exact similarity search.
 *
 * A shared-memory Segment holds what was built in one go (see segment.ts);
 * entries upserted afterwards wait in a small pending store, searched by
 * plain comparison, and replaced docs are flagged dead in the segment's
 * shared `live` array. Past `maxPending` entries the index compacts into a
 * new segment. Every search combines both, so results are always exact.
 */
export class SearchIndex {
  readonly options: ResolvedIndexOptions;
  /** Library version this index reflects (reported by /api/health). */
  libraryVersion = 0;
  private seg: Segment;
  private metas: (EntryMeta | null)[];
  private docBySpectrum = new Map<number, number>();
  private pending = new Map<number, Pending>();
  private statusCount = new Map<SpectrumStatus, number>();
  private stamp = 0;
  private masks = new Map<string, Mask>();

  constructor(options: IndexOptions = {}) {
    this.options = resolveIndexOptions(options);
    this.seg = buildSegment(emptyColumns(), this.options.tolerance, this.options.weights);
    this.metas = [];
  }

  /** Build an index from entries in one go (later duplicates of a spectrumId win). */
  static build(entries: Iterable<LibraryEntry>, options: IndexOptions = {}): SearchIndex {
    const index = new SearchIndex(options);
    const byId = new Map<number, LibraryEntry>();
    for (const e of entries) {
      validateEntry(e);
      byId.set(e.spectrumId, e);
    }
    const list = [...byId.values()].sort((a, b) => a.recordId - b.recordId || a.spectrumId - b.spectrumId);
    const stored = list.map((e) => storeSpectrum(e.peaks, index.options.tolerance, index.options.noiseFloor));
    index.install(
      stored,
      list.map(metaOf),
    );
    return index;
  }

  /**
   * Build straight from stored columns (bins and base-relative intensities),
   * as the benchmark and a binary loader do. Without `metas` every doc is a
   * released spectrum with an empty name.
   */
  static fromColumns(cols: StoredColumns, options: IndexOptions = {}, metas?: (EntryMeta | null)[]): SearchIndex {
    const index = new SearchIndex(options);
    index.seg = buildSegment(cols, index.options.tolerance, index.options.weights);
    index.metas = metas ? new Array(index.seg.n).fill(null) : [];
    if (metas) {
      // The segment orders docs by (recordId, spectrumId); map the metas the same way.
      const bySpectrum = new Map<number, EntryMeta | null>();
      for (let i = 0; i < cols.count; i++) bySpectrum.set(cols.spectrumIds[i], metas[i] ?? null);
      for (let d = 0; d < index.seg.n; d++) index.metas[d] = bySpectrum.get(index.seg.spectrumId[d]) ?? null;
    }
    index.reindexDocs();
    return index;
  }

  private install(stored: StoredSpectrum[], metas: EntryMeta[]): void {
    let total = 0;
    for (const s of stored) total += s.bins.length;
    const offsets = new Uint32Array(stored.length + 1);
    const bins = new Int32Array(total);
    const rel = new Float32Array(total);
    let at = 0;
    stored.forEach((s, i) => {
      offsets[i] = at;
      bins.set(s.bins, at);
      rel.set(s.rel, at);
      at += s.bins.length;
    });
    offsets[stored.length] = at;
    this.seg = buildSegment(
      { count: stored.length, offsets, bins, rel, recordIds: metas.map((m) => m.recordId), spectrumIds: metas.map((m) => m.spectrumId) },
      this.options.tolerance,
      this.options.weights,
    );
    this.metas = metas;
    this.pending.clear();
    this.reindexDocs();
  }

  private reindexDocs(): void {
    this.docBySpectrum.clear();
    this.statusCount.clear();
    for (let d = 0; d < this.seg.n; d++) {
      if (!this.seg.live[d]) continue;
      this.docBySpectrum.set(this.seg.spectrumId[d], d);
      this.countStatus(this.metaAt(d).status, 1);
    }
    for (const p of this.pending.values()) this.countStatus(p.meta.status, 1);
    this.touch();
  }

  private countStatus(s: SpectrumStatus, by: number): void {
    this.statusCount.set(s, (this.statusCount.get(s) ?? 0) + by);
  }

  private touch(): void {
    this.stamp++;
    this.masks.clear();
  }

  /**
   * A doc's entry for building its hit at once (makeHit copies what it
   * needs): a doc without metadata (a column-built index) gets one scratch
   * entry, valid until the next call, where metaAt would allocate one per
   * hit on the event loop.
   */
  private readonly metaOfDoc = (d: number): EntryMeta => {
    const m = this.metas[d];
    if (m) return m;
    const b = this.bare;
    b.spectrumId = this.seg.spectrumId[d];
    b.recordId = this.seg.recordId[d];
    return b;
  };
  private readonly bare: EntryMeta = { spectrumId: 0, recordId: 0, version: 1, name: '', formula: null, nominalMass: null, ihd: null, elements: NONE, tags: NONE, status: 'released', ri: NONE };

  private metaAt(d: number): EntryMeta {
    const m = this.metas[d];
    if (m) return m;
    return {
      spectrumId: this.seg.spectrumId[d],
      recordId: this.seg.recordId[d],
      version: 1,
      name: '',
      formula: null,
      nominalMass: null,
      ihd: null,
      elements: NONE,
      tags: NONE,
      status: 'released',
      ri: NONE,
    };
  }

  /** Spectra (versions) in the index. */
  get size(): number {
    return this.docBySpectrum.size + this.pending.size;
  }

  /** Spectra with this status (released ones are what /api/health reports). */
  countByStatus(status: SpectrumStatus): number {
    return this.statusCount.get(status) ?? 0;
  }

  has(spectrumId: number): boolean {
    return this.docBySpectrum.has(spectrumId) || this.pending.has(spectrumId);
  }

  /** Add or replace one spectrum version; searchable at once, no rebuild. */
  upsert(entry: LibraryEntry): void {
    validateEntry(entry);
    this.dropExisting(entry.spectrumId);
    const stored = storeSpectrum(entry.peaks, this.options.tolerance, this.options.noiseFloor);
    const meta = metaOf(entry);
    this.pending.set(entry.spectrumId, { meta, stored, prepared: stageStored(stored, this.options.tolerance, this.options.weights) });
    this.countStatus(meta.status, 1);
    this.touch();
    if (this.pending.size > this.options.maxPending) this.compact();
  }

  /** Remove one spectrum version (retired, superseded or deleted). Returns whether it was there. */
  remove(spectrumId: number): boolean {
    const had = this.dropExisting(spectrumId);
    if (had) this.touch();
    return had;
  }

  private dropExisting(spectrumId: number): boolean {
    const d = this.docBySpectrum.get(spectrumId);
    if (d !== undefined) {
      this.seg.live[d] = 0;
      this.docBySpectrum.delete(spectrumId);
      this.countStatus(this.metaAt(d).status, -1);
      return true;
    }
    const p = this.pending.get(spectrumId);
    if (p) {
      this.pending.delete(spectrumId);
      this.countStatus(p.meta.status, -1);
      return true;
    }
    return false;
  }

  /** Fold pending entries and dead docs into a fresh segment. */
  compact(): void {
    const live: { stored: StoredSpectrum; meta: EntryMeta }[] = [];
    const seg = this.seg;
    for (let d = 0; d < seg.n; d++) {
      if (!seg.live[d]) continue;
      const s = seg.docStart[d];
      const e = seg.docStart[d + 1];
      live.push({ stored: { bins: Int32Array.from(seg.fBin.subarray(s, e)), rel: seg.fRel.slice(s, e) }, meta: this.metaAt(d) });
    }
    for (const p of this.pending.values()) live.push({ stored: p.stored, meta: p.meta });
    live.sort((a, b) => a.meta.recordId - b.meta.recordId || a.meta.spectrumId - b.meta.spectrumId);
    this.install(
      live.map((x) => x.stored),
      live.map((x) => x.meta),
    );
  }

  /** Take over another index's contents at once (a background rebuild). */
  replaceWith(other: SearchIndex): void {
    if (other.options.tolerance !== this.options.tolerance) throw new RangeError('replaceWith: tolerance differs');
    (this as { options: ResolvedIndexOptions }).options = other.options;
    this.seg = other.seg;
    this.metas = other.metas;
    this.pending = other.pending;
    this.docBySpectrum = other.docBySpectrum;
    this.statusCount = other.statusCount;
    this.libraryVersion = other.libraryVersion;
    this.touch();
  }

  /** Bytes of the shared typed arrays, and stored peaks, for the memory figure. */
  memory(): { bytes: number; peaks: number; bytesPerPeak: number } {
    const bytes = segmentBytes(this.seg);
    const peaks = this.seg.nPeaks;
    return { bytes, peaks, bytesPerPeak: peaks > 0 ? bytes / peaks : 0 };
  }

  /** @internal the shared segment (benchmark, tests). */
  get segment(): Segment {
    return this.seg;
  }

  private mask(filters: SearchFilters | undefined): Mask {
    const key = JSON.stringify(filters ?? {});
    const cached = this.masks.get(key);
    if (cached && cached.stamp === this.stamp) return cached;
    const pred = compileFilters(filters ?? {});
    const seg = this.seg;
    const f = filters ?? {};
    const onlyReleased = Object.keys(f).every((k) => k === 'status') && (f.status === undefined || (f.status.length === 1 && f.status[0] === 'released'));
    let allow: Uint8Array | null;
    let searched = 0;
    const liveReleasedOnly = this.docBySpectrum.size === this.countByStatus('released') - this.pendingCount('released');
    if (onlyReleased && liveReleasedOnly) {
      allow = null; // every live doc qualifies: the segment's own live flags serve as the mask
      searched = this.docBySpectrum.size;
    } else {
      allow = new Uint8Array(new SharedArrayBuffer(Math.max(1, seg.n)), 0, seg.n);
      for (let d = 0; d < seg.n; d++) {
        if (!seg.live[d]) continue;
        const v = pred(this.metaAt(d));
        allow[d] = v;
        if (v) searched++;
      }
    }
    const m: Mask = { stamp: this.stamp, allow, searched, pred };
    if (this.masks.size >= 16) this.masks.delete(this.masks.keys().next().value as string);
    this.masks.set(key, m);
    return m;
  }

  private pendingCount(status: SpectrumStatus): number {
    let n = 0;
    for (const p of this.pending.values()) if (p.meta.status === status) n++;
    return n;
  }

  private prepare(options: SearchOptions | undefined, filters: SearchFilters | undefined): { o: ResolvedSearchOptions; mask: Mask; penalty: number } {
    const o = resolveSearchOptions(options ?? {}, this.options);
    checkFilters(filters ?? {});
    return { o, mask: this.mask(filters), penalty: filters?.ri?.penalty ?? 0 };
  }

  private task(kind: 'search', o: ResolvedSearchOptions, mask: Mask, penalty: number, queries: Peak[][], lo: number, hi: number): SearchTask {
    return { kind, seg: this.seg, allow: mask.allow, penalty, options: o, queries, lo, hi };
  }

  /** Candidates from segment hits plus the pending entries, for one query. */
  private collect(parts: TaskHits[], peaks: readonly Peak[], o: ResolvedSearchOptions, mask: Mask, penalty: number): { cands: Candidate[]; searched: number } {
    const cands: Candidate[] = [];
    const seg = this.seg;
    for (const part of parts) {
      for (let i = 0; i < part.docs.length; i++) {
        const d = part.docs[i];
        cands.push({ score: part.rank[i], recordId: seg.recordId[d], spectrumId: seg.spectrumId[d], scores: part.scores, at: i * 4, doc: d, meta: null });
      }
    }
    let searched = mask.searched;
    if (this.pending.size > 0) {
      const q = prepareQuery(peaks, o);
      const slot = SCORE_SLOT[o.rankBy];
      for (const p of this.pending.values()) {
        const allow = mask.pred(p.meta);
        if (allow === 0) continue;
        searched++;
        const lib = o.stored ? p.prepared : stage(p.stored, o);
        const out = new Float64Array(4);
        scoreMerged(q.bins, q.w, q.e, q.n, q.norm, lib.bins, lib.w, lib.e, 0, lib.n, lib.norm, true, out);
        if (!(out[0] > 0)) continue;
        const raw = out[slot];
        const meta = p.meta;
        cands.push({ score: allow === 2 ? Math.max(0, raw - penalty) : raw, recordId: meta.recordId, spectrumId: meta.spectrumId, scores: out, at: 0, doc: -1, meta });
      }
    }
    return { cands, searched };
  }

  /**
   * Exact search in the calling thread: the top `limit` spectra by the
   * ranking score, equal to bruteForceSearch over the same entries.
   */
  search(peaks: Peak[], options?: SearchOptions, filters?: SearchFilters): SearchResult {
    const t0 = performance.now();
    const { o, mask, penalty } = this.prepare(options, filters);
    const [part] = runSearchTask(this.task('search', o, mask, penalty, [peaks], 0, this.seg.n));
    const { cands, searched } = this.collect([part], peaks, o, mask, penalty);
    return { hits: toHits(cands, o.limit, filters, this.metaOfDoc), searched, tookMs: performance.now() - t0 };
  }

  /**
   * The same search without holding the event loop: on a large index it is
   * split by doc range across the worker pool; without a pool it runs in
   * slices with a turn of the event loop between them.
   */
  async searchAsync(peaks: Peak[], options?: SearchOptions, filters?: SearchFilters): Promise<SearchResult> {
    const t0 = performance.now();
    const { o, mask, penalty } = this.prepare(options, filters);
    const n = this.seg.n;
    let parts: TaskHits[];
    const pool = n >= POOL_MIN_DOCS ? getSearchPool() : null;
    if (n < POOL_MIN_DOCS) {
      parts = runSearchTask(this.task('search', o, mask, penalty, [peaks], 0, n));
    } else if (pool) {
      const ranges = splitRange(n, pool.threads);
      try {
        const results = await Promise.all(ranges.map(([lo, hi]) => pool.run(this.task('search', o, mask, penalty, [peaks], lo, hi))));
        parts = results.map((r) => r[0]);
      } catch {
        await closeSearchPool();
        parts = await this.slices(o, mask, penalty, peaks);
      }
    } else {
      parts = await this.slices(o, mask, penalty, peaks);
    }
    const { cands, searched } = this.collect(parts, peaks, o, mask, penalty);
    return { hits: toHits(cands, o.limit, filters, this.metaOfDoc), searched, tookMs: performance.now() - t0 };
  }

  private async slices(o: ResolvedSearchOptions, mask: Mask, penalty: number, peaks: Peak[]): Promise<TaskHits[]> {
    const parts: TaskHits[] = [];
    for (let lo = 0; lo < this.seg.n; lo += SLICE_DOCS) {
      parts.push(runSearchTask(this.task('search', o, mask, penalty, [peaks], lo, Math.min(this.seg.n, lo + SLICE_DOCS)))[0]);
      await yieldToLoop();
    }
    return parts;
  }

  /**
   * Many queries with the same options and filters, through the worker pool
   * (each query whole on one thread); without a pool, one query at a time
   * with a turn of the event loop in between. Results in query order.
   */
  async searchBatch(queries: Peak[][], options?: SearchOptions, filters?: SearchFilters): Promise<SearchResult[]> {
    const t0 = performance.now();
    const { o, mask, penalty } = this.prepare(options, filters);
    const n = this.seg.n;
    const results: SearchResult[] = new Array(queries.length);
    const finishOne = (i: number, part: TaskHits) => {
      // With no pending entries the worker's hits are the result, usually in order already.
      const direct = this.pending.size === 0 ? hitsInOrder(part.docs, part.rank, part.scores, o.limit, filters, this.metaOfDoc) : null;
      if (direct !== null) {
        results[i] = { hits: direct, searched: mask.searched, tookMs: 0 };
        return;
      }
      const { cands, searched } = this.collect([part], queries[i], o, mask, penalty);
      results[i] = { hits: toHits(cands, o.limit, filters, this.metaOfDoc), searched, tookMs: 0 };
    };
    const pool = getSearchPool();
    let done = false;
    if (pool && queries.length > 1 && n > 0) {
      try {
        const chunks: Promise<void>[] = [];
        for (let s = 0; s < queries.length; s += BATCH_CHUNK) {
          const slice = queries.slice(s, s + BATCH_CHUNK);
          chunks.push(
            pool.run(this.task('search', o, mask, penalty, slice, 0, n)).then((parts) => {
              parts.forEach((part, j) => finishOne(s + j, part));
            }),
          );
        }
        await Promise.all(chunks);
        done = true;
      } catch {
        await closeSearchPool();
      }
    }
    if (!done) {
      for (let i = 0; i < queries.length; i++) {
        const parts = await this.slices(o, mask, penalty, queries[i]);
        const { cands, searched } = this.collect(parts, queries[i], o, mask, penalty);
        results[i] = { hits: toHits(cands, o.limit, filters, this.metaOfDoc), searched, tookMs: 0 };
      }
    }
    const took = performance.now() - t0;
    for (const r of results) r.tookMs = took / Math.max(1, queries.length);
    return results;
  }
}

function splitRange(n: number, parts: number): [number, number][] {
  const out: [number, number][] = [];
  const step = Math.ceil(n / parts);
  for (let lo = 0; lo < n; lo += step) out.push([lo, Math.min(n, lo + step)]);
  return out;
}
