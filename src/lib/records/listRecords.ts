// GET /api/spectra: the library as a list of each record's current version,
// filtered, fuzzily searched by name and synonym, sorted and paged.
import { QueryTypes } from 'sequelize';
import { getSequelize } from '../db/sequelize';
import { buildListWhere } from './buildListWhere';
import { effectiveSort, type ParsedSort, type RecordStatus, type SpectraListQuery } from './listQuery';
import { buildNameIndex } from './nameIndex';

export interface RecordListItem {
  /** the record id (stable across versions) */
  id: number;
  version: number;
  /** spectrum_version row id */
  versionId: number;
  name: string;
  synonyms: string[];
  formula: string | null;
  nominalMass: number | null;
  ihd: number | null;
  casRegistryNo: string | null;
  tags: string[];
  status: RecordStatus;
  peakCount: number;
  basePeak: number | null;
  synthetic: boolean;
  updatedAt: string;
  /** the synonym a name search matched, when not the name itself */
  matchedSynonym?: string;
}

export interface RecordList {
  items: RecordListItem[];
  total: number;
  page: number;
  pageSize: number;
  sort: string;
}

type Row = Record<string, any>;

const LIGHT_COLUMNS = `v.id AS versionId, v.recordId, v.version, v.status, v.name, v.synonyms, v.formula, v.nominalMass,
  v.ihd, v.casRegistryNo, v.peakCount, v.basePeakMz, v.synthetic, v.updatedAt`;

const SQL_ORDER: Record<Exclude<ParsedSort['key'], 'relevance'>, string> = {
  name: 'LOWER(v.name)',
  formula: 'v.formula',
  nominalMass: 'v.nominalMass',
  ihd: 'v.ihd',
  peakCount: 'v.peakCount',
  basePeak: 'v.basePeakMz',
  status: 'v.status',
  updatedAt: 'v.updatedAt',
  id: 'v.recordId',
};

function parseJsonList(value: unknown): string[] {
  if (Array.isArray(value)) return value.map(String);
  if (typeof value === 'string' && value.trim() !== '') {
    try {
      const parsed = JSON.parse(value);
      return Array.isArray(parsed) ? parsed.map(String) : [];
    } catch {
      return [];
    }
  }
  return [];
}

function toItem(r: Row, tags: string[]): RecordListItem {
  return {
    id: Number(r.recordId),
    version: Number(r.version),
    versionId: Number(r.versionId),
    name: String(r.name),
    synonyms: parseJsonList(r.synonyms),
    formula: r.formula ?? null,
    nominalMass: r.nominalMass === null ? null : Number(r.nominalMass),
    ihd: r.ihd === null ? null : Number(r.ihd),
    casRegistryNo: r.casRegistryNo ?? null,
    tags,
    status: r.status,
    peakCount: Number(r.peakCount),
    basePeak: r.basePeakMz === null ? null : Number(r.basePeakMz),
    synthetic: !!r.synthetic,
    updatedAt: new Date(r.updatedAt).toISOString(),
  };
}

/** Tag names of each record, sorted. */
export async function tagsOfRecords(recordIds: number[]): Promise<Map<number, string[]>> {
  const out = new Map<number, string[]>();
  if (recordIds.length === 0) return out;
  const rows = await getSequelize().query<Row>(
    'SELECT rt.recordId, t.name FROM record_tag rt JOIN tag t ON t.id = rt.tagId WHERE rt.recordId IN (?) ORDER BY t.name',
    { replacements: [recordIds], type: QueryTypes.SELECT },
  );
  for (const r of rows) out.set(Number(r.recordId), [...(out.get(Number(r.recordId)) ?? []), String(r.name)]);
  return out;
}

function compareRows(sort: ParsedSort) {
  const key = (r: Row): string | number | null => {
    switch (sort.key) {
      case 'name':
        return String(r.name).toLowerCase();
      case 'formula':
        return r.formula ?? null;
      case 'nominalMass':
        return r.nominalMass ?? null;
      case 'ihd':
        return r.ihd ?? null;
      case 'peakCount':
        return Number(r.peakCount);
      case 'basePeak':
        return r.basePeakMz ?? null;
      case 'status':
        return String(r.status);
      case 'updatedAt':
        return new Date(r.updatedAt).getTime();
      default:
        return Number(r.recordId);
    }
  };
  return (a: Row, b: Row) => {
    const ka = key(a);
    const kb = key(b);
    // Missing values go last whichever the direction, as in SQL with NULLS LAST.
    if (ka === null && kb === null) return Number(a.recordId) - Number(b.recordId);
    if (ka === null) return 1;
    if (kb === null) return -1;
    const c = ka < kb ? -1 : ka > kb ? 1 : 0;
    return (sort.descending ? -c : c) || Number(a.recordId) - Number(b.recordId);
  };
}

/**
 * List records. Without `q` the database sorts and pages; with `q` the rows
 * that pass the filters are ranked by the name index and paged here.
 * @param query - the parsed list query
 * @param options.statuses - statuses to list (the caller checks who may ask for which); default released
 * @param options.all - return every match on one page (for the CSV export), up to `maxAll`
 */
export async function listRecords(
  query: SpectraListQuery,
  options: { statuses?: RecordStatus[]; all?: boolean; maxAll?: number } = {},
): Promise<RecordList> {
  const s = getSequelize();
  const sort = effectiveSort(query);
  const where = buildListWhere(query, options.statuses ?? []);
  const pageSize = options.all ? (options.maxAll ?? 10_000) : query.pageSize;
  const page = options.all ? 1 : query.page;
  const offset = (page - 1) * pageSize;
  const sortText = `${sort.descending ? '-' : ''}${sort.key}`;

  let rows: Row[];
  let total: number;
  const matchedSynonym = new Map<number, string>();
  if (!query.q) {
    const [count] = await s.query<Row>(`SELECT COUNT(*) AS n FROM spectrum_version v WHERE ${where.sql}`, {
      replacements: where.params,
      type: QueryTypes.SELECT,
    });
    total = Number(count?.n ?? 0);
    const order = sort.key === 'relevance' ? SQL_ORDER.name : SQL_ORDER[sort.key];
    const dir = sort.descending ? 'DESC' : 'ASC';
    rows = await s.query<Row>(
      `SELECT ${LIGHT_COLUMNS} FROM spectrum_version v WHERE ${where.sql}
        ORDER BY ${order} IS NULL, ${order} ${dir}, v.recordId ASC LIMIT ? OFFSET ?`,
      { replacements: [...where.params, pageSize, offset], type: QueryTypes.SELECT },
    );
  } else {
    const candidates = await s.query<Row>(`SELECT ${LIGHT_COLUMNS} FROM spectrum_version v WHERE ${where.sql}`, {
      replacements: where.params,
      type: QueryTypes.SELECT,
    });
    const index = buildNameIndex(
      candidates.map((r) => ({ versionId: Number(r.versionId), name: String(r.name), synonyms: parseJsonList(r.synonyms), casRegistryNo: r.casRegistryNo })),
    );
    const matches = index.search(query.q);
    const byId = new Map(candidates.map((r) => [Number(r.versionId), r]));
    let ranked = matches.map((m) => byId.get(m.versionId)!).filter(Boolean);
    for (const m of matches) if (m.matchedSynonym) matchedSynonym.set(m.versionId, m.matchedSynonym);
    if (sort.key !== 'relevance') ranked = [...ranked].sort(compareRows(sort));
    total = ranked.length;
    rows = ranked.slice(offset, offset + pageSize);
  }
  const tags = await tagsOfRecords(rows.map((r) => Number(r.recordId)));
  const items = rows.map((r) => {
    const item = toItem(r, tags.get(Number(r.recordId)) ?? []);
    const syn = matchedSynonym.get(item.versionId);
    return syn ? { ...item, matchedSynonym: syn } : item;
  });
  return { items, total, page, pageSize, sort: sortText };
}

/** Every tag name in use, for filter suggestions. */
export async function listTagNames(): Promise<string[]> {
  const rows = await getSequelize().query<Row>('SELECT name FROM tag ORDER BY name', { type: QueryTypes.SELECT });
  return rows.map((r) => String(r.name));
}
