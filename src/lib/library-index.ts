// The process's in-memory search index over the library: built from MariaDB at
// start, then kept current by polling the library version (every server polls,
// so a release made through another server shows up within seconds), and
// refreshed at once by the process that makes a change.
import { QueryTypes } from 'sequelize';
import { getSequelize } from './db/sequelize';
import { SearchIndex, resolveIndexOptions, type EntryMeta, type StoredColumns } from './search/index';
import type { LibraryEntry } from './search/types';
import { decodePeaks } from './spectra/index';
import { StoredColumnsBuilder } from './library-columns';
import { registerStartupStep } from './runtime';

const INDEXED_STATUSES = ['released', 'in_review', 'draft'];
const POLL_MS = 1000;

interface State {
  index: SearchIndex;
  ready: boolean;
  version: number;
  lastSync: Date | null;
  timer: NodeJS.Timeout | null;
  syncing: Promise<void> | null;
}
const state: State = { index: new SearchIndex(), ready: false, version: 0, lastSync: null, timer: null, syncing: null };

export function getLibraryIndex(): SearchIndex {
  return state.index;
}

export function libraryIndexStatus() {
  let released = 0;
  const idx = state.index as unknown as { countByStatus?: (s: string) => number; size: number };
  released = typeof idx.countByStatus === 'function' ? idx.countByStatus('released') : idx.size;
  return { ready: state.ready, spectra: state.ready ? released : 0, version: state.version };
}

type Row = Record<string, any>;

/** Versions per query when a full rebuild reads the library (by ranges of version id). */
const LOAD_CHUNK = 5000;

const VERSION_COLUMNS = 'v.id, v.recordId, v.version, v.status, v.name, v.formula, v.nominalMass, v.ihd, v.elements, v.peaks';

/** Tags by record id and retention indices by version id, for the versions matching `where`. */
async function fetchTagsAndRis(where: string, replacements: unknown[]): Promise<TagsAndRis> {
  const s = getSequelize();
  // By join rather than by a list of ids, so a full rebuild of a large library stays a few queries.
  const tagRows = await s.query<Row>(
    `SELECT DISTINCT rt.recordId, t.name FROM record_tag rt JOIN tag t ON t.id = rt.tagId
       JOIN spectrum_version v ON v.recordId = rt.recordId JOIN spectrum_record r ON r.id = v.recordId WHERE ${where}`,
    { replacements, type: QueryTypes.SELECT },
  );
  const riRows = await s.query<Row>(
    `SELECT ri.spectrumVersionId, ri.phase, ri.value FROM retention_index ri
       JOIN spectrum_version v ON v.id = ri.spectrumVersionId JOIN spectrum_record r ON r.id = v.recordId WHERE ${where}`,
    { replacements, type: QueryTypes.SELECT },
  );
  return groupTagsAndRis(tagRows, riRows);
}

type TagsAndRis = { tags: Map<number, string[]>; ris: Map<number, { phase: string; value: number }[]> };

/** Tag names by record id and retention indices by version id, in row order. */
function groupTagsAndRis(tagRows: Row[], riRows: Row[]): TagsAndRis {
  const tags = new Map<number, string[]>();
  for (const t of tagRows) {
    const id = Number(t.recordId);
    const list = tags.get(id);
    if (list) list.push(String(t.name));
    else tags.set(id, [String(t.name)]);
  }
  const ris = new Map<number, { phase: string; value: number }[]>();
  for (const r of riRows) {
    const id = Number(r.spectrumVersionId);
    const item = { phase: String(r.phase), value: Number(r.value) };
    const list = ris.get(id);
    if (list) list.push(item);
    else ris.set(id, [item]);
  }
  return { tags, ris };
}

/** A version row's metadata as the index keeps it (everything of a LibraryEntry but the peaks). */
function metaOfRow(r: Row, tags: Map<number, string[]>, ris: Map<number, { phase: string; value: number }[]>): EntryMeta {
  return {
    spectrumId: Number(r.id),
    recordId: Number(r.recordId),
    version: Number(r.version),
    name: String(r.name),
    formula: r.formula ?? null,
    nominalMass: r.nominalMass === null ? null : Number(r.nominalMass),
    ihd: r.ihd === null ? null : Number(r.ihd),
    elements: r.elements ? String(r.elements).split(',').filter(Boolean) : [],
    tags: tags.get(Number(r.recordId)) ?? [],
    status: r.status,
    ri: ris.get(Number(r.id)) ?? [],
  };
}

/** Versions matching `where` as LibraryEntry objects (the sync path), and those no longer indexed. */
async function fetchEntries(where: string, replacements: unknown[]): Promise<{ entries: LibraryEntry[]; gone: number[] }> {
  const s = getSequelize();
  const rows = await s.query<Row>(`SELECT ${VERSION_COLUMNS} FROM spectrum_version v JOIN spectrum_record r ON r.id = v.recordId WHERE ${where}`, {
    replacements,
    type: QueryTypes.SELECT,
  });
  if (rows.length === 0) return { entries: [], gone: [] };
  const { tags, ris } = await fetchTagsAndRis(where, replacements);
  const entries: LibraryEntry[] = [];
  const gone: number[] = [];
  for (const r of rows) {
    if (!INDEXED_STATUSES.includes(r.status)) {
      gone.push(Number(r.id));
      continue;
    }
    entries.push({ ...metaOfRow(r, tags, ris), peaks: decodePeaks(r.peaks as Buffer) });
  }
  return { entries, gone };
}

async function readVersion(): Promise<number> {
  const [row] = await getSequelize().query<Row>('SELECT version FROM library_state WHERE id = 1', { type: QueryTypes.SELECT });
  return Number(row?.version ?? 0);
}

/** The mariadb driver's connection, as the Sequelize pool hands it out (only what is used here). */
interface DriverConnection {
  query(sql: { sql: string; rowsAsArray?: boolean; typeCast?: undefined }, values?: unknown[]): Promise<unknown[][]>;
}

/**
 * Run `fn` on one connection of the process's pool, in a read-only
 * transaction with a consistent snapshot. Queries go to the driver as is:
 * rows as arrays and without Sequelize's per-value type hook, which on a full
 * load costs more than the rest of the reading. Used for the columns the
 * rebuild reads (integers, doubles, strings, the peaks BLOB), whose values
 * the hook leaves as the driver makes them.
 */
async function withSnapshot<T>(fn: (query: (sql: string, values?: unknown[]) => Promise<unknown[][]>) => Promise<T>): Promise<T> {
  const manager = getSequelize().connectionManager;
  const conn = (await manager.getConnection({ type: 'read' })) as unknown as DriverConnection;
  const query = (sql: string, values?: unknown[]) => conn.query({ sql, rowsAsArray: true, typeCast: undefined }, values);
  try {
    await query('SET TRANSACTION ISOLATION LEVEL REPEATABLE READ');
    await query('START TRANSACTION WITH CONSISTENT SNAPSHOT, READ ONLY');
    let result: T;
    try {
      result = await fn(query);
    } catch (e) {
      await query('ROLLBACK').catch(() => {});
      throw e;
    }
    await query('COMMIT');
    return result;
  } finally {
    manager.releaseConnection(conn);
  }
}

/**
 * The whole indexed library as index columns and metadata, read in one
 * consistent snapshot. Versions come in ranges of id (the next range is
 * asked for while the current one is decoded), and their packed peaks go
 * straight into the index's stored columns (StoredColumnsBuilder: the same
 * preprocessing as SearchIndex.build, without an object per peak).
 */
async function loadColumns(): Promise<{ cols: StoredColumns; metas: EntryMeta[]; version: number }> {
  const options = resolveIndexOptions();
  const statuses = INDEXED_STATUSES.map(() => '?').join(', ');
  return withSnapshot(async (query) => {
    const [versionRow] = await query('SELECT version FROM library_state WHERE id = 1');
    const version = Number(versionRow?.[0] ?? 0);
    const where = `v.status IN (${statuses})`;
    const tagRows = await query(
      `SELECT DISTINCT rt.recordId, t.name FROM record_tag rt JOIN tag t ON t.id = rt.tagId
         JOIN spectrum_version v ON v.recordId = rt.recordId JOIN spectrum_record r ON r.id = v.recordId WHERE ${where}`,
      INDEXED_STATUSES,
    );
    const riRows = await query(
      `SELECT ri.spectrumVersionId, ri.phase, ri.value FROM retention_index ri
         JOIN spectrum_version v ON v.id = ri.spectrumVersionId JOIN spectrum_record r ON r.id = v.recordId WHERE ${where}`,
      INDEXED_STATUSES,
    );
    const { tags, ris } = groupTagsAndRis(
      tagRows.map(([recordId, name]) => ({ recordId, name })),
      riRows.map(([spectrumVersionId, phase, value]) => ({ spectrumVersionId, phase, value })),
    );
    const [span] = await query('SELECT MIN(id), MAX(id) FROM spectrum_version');
    const builder = new StoredColumnsBuilder(options.tolerance, options.noiseFloor);
    const metas: EntryMeta[] = [];
    if (span && span[0] !== null) {
      const lo = Number(span[0]);
      const hi = Number(span[1]);
      const range = (from: number) => {
        const rows = query(
          `SELECT ${VERSION_COLUMNS} FROM spectrum_version v JOIN spectrum_record r ON r.id = v.recordId
             WHERE v.id >= ? AND v.id < ? AND ${where}`,
          [from, from + LOAD_CHUNK, ...INDEXED_STATUSES],
        );
        rows.catch(() => {}); // awaited below; if decoding the range before fails first, its error is the one reported
        return rows;
      };
      let next: Promise<unknown[][]> | null = range(lo);
      for (let from = lo; next; from += LOAD_CHUNK) {
        const rows: unknown[][] = await next;
        next = from + LOAD_CHUNK <= hi ? range(from + LOAD_CHUNK) : null;
        for (const [id, recordId, version, status, name, formula, nominalMass, ihd, elements, peaks] of rows) {
          if (!INDEXED_STATUSES.includes(status as string)) continue;
          const meta = metaOfRow({ id, recordId, version, status, name, formula, nominalMass, ihd, elements }, tags, ris);
          builder.add(meta.spectrumId, meta.recordId, peaks as Uint8Array);
          metas.push(meta);
        }
      }
    }
    return { cols: builder.finish(), metas, version };
  });
}

/** Build a fresh index from the database and swap it in atomically. */
export async function rebuildLibraryIndex(): Promise<void> {
  const started = new Date(Date.now() - 2000);
  const { cols, metas, version } = await loadColumns();
  const fresh = SearchIndex.fromColumns(cols, resolveIndexOptions(), metas);
  fresh.libraryVersion = version;
  state.index = fresh;
  state.version = version;
  state.lastSync = started;
  state.ready = true;
}

/**
 * @internal The index as a rebuild made it before the columnar loader:
 * LibraryEntry objects through SearchIndex.build. Tests compare the two.
 */
export async function buildLibraryIndexFromEntries(): Promise<SearchIndex> {
  const { entries } = await fetchEntries('v.status IN (?)', [INDEXED_STATUSES]);
  return SearchIndex.build(entries);
}

/** Apply what changed since the last sync (versions or records touched since then). */
export async function syncLibraryIndex(): Promise<void> {
  if (state.syncing) return state.syncing;
  state.syncing = (async () => {
    try {
      const version = await readVersion();
      if (version === state.version && state.ready) return;
      const since = state.lastSync ?? new Date(0);
      const started = new Date(Date.now() - 2000);
      const { entries, gone } = await fetchEntries('(v.updatedAt >= ? OR r.updatedAt >= ?)', [since, since]);
      for (const id of gone) state.index.remove(id);
      for (const e of entries) state.index.upsert(e);
      state.index.libraryVersion = version;
      state.version = version;
      state.lastSync = started;
    } finally {
      state.syncing = null;
    }
  })();
  return state.syncing;
}

function startPolling() {
  if (state.timer) return;
  state.timer = setInterval(() => {
    syncLibraryIndex().catch(() => {
      /* database down: health shows it; the next tick tries again */
    });
  }, POLL_MS);
  state.timer.unref();
}

export function stopLibraryIndexPolling() {
  if (state.timer) clearInterval(state.timer);
  state.timer = null;
}

registerStartupStep('search index', async () => {
  await rebuildLibraryIndex();
  startPolling();
});
