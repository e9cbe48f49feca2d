// The process's in-memory search index over the library: built from MariaDB at
// start, then kept current by polling the library version (every server polls,
// so a release made through another server shows up within seconds), and
// refreshed at once by the process that makes a change.
import { QueryTypes } from 'sequelize';
import { getSequelize } from './db/sequelize';
import { SearchIndex } from './search/index';
import type { LibraryEntry } from './search/types';
import { decodePeaks } from './spectra/index';
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

async function fetchEntries(where: string, replacements: unknown[]): Promise<{ entries: LibraryEntry[]; gone: number[] }> {
  const s = getSequelize();
  const rows = await s.query<Row>(
    `SELECT v.id, v.recordId, v.version, v.status, v.name, v.formula, v.nominalMass, v.ihd, v.elements, v.peaks
       FROM spectrum_version v JOIN spectrum_record r ON r.id = v.recordId WHERE ${where}`,
    { replacements, type: QueryTypes.SELECT },
  );
  if (rows.length === 0) return { entries: [], gone: [] };
  // Tags and retention indices of the same rows, by join rather than by a
  // list of ids, so a full rebuild of a large library stays two queries.
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
  const tags = new Map<number, string[]>();
  for (const t of tagRows) tags.set(Number(t.recordId), [...(tags.get(Number(t.recordId)) ?? []), String(t.name)]);
  const ris = new Map<number, { phase: string; value: number }[]>();
  for (const r of riRows) ris.set(Number(r.spectrumVersionId), [...(ris.get(Number(r.spectrumVersionId)) ?? []), { phase: String(r.phase), value: Number(r.value) }]);
  const entries: LibraryEntry[] = [];
  const gone: number[] = [];
  for (const r of rows) {
    if (!INDEXED_STATUSES.includes(r.status)) {
      gone.push(Number(r.id));
      continue;
    }
    entries.push({
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
      peaks: decodePeaks(r.peaks as Buffer),
    });
  }
  return { entries, gone };
}

async function readVersion(): Promise<number> {
  const [row] = await getSequelize().query<Row>('SELECT version FROM library_state WHERE id = 1', { type: QueryTypes.SELECT });
  return Number(row?.version ?? 0);
}

/** Build a fresh index from the database and swap it in atomically. */
export async function rebuildLibraryIndex(): Promise<void> {
  const started = new Date(Date.now() - 2000);
  const version = await readVersion();
  const { entries } = await fetchEntries('v.status IN (?)', [INDEXED_STATUSES]);
  const fresh = SearchIndex.build(entries);
  fresh.libraryVersion = version;
  state.index = fresh;
  state.version = version;
  state.lastSync = started;
  state.ready = true;
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
