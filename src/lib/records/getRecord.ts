// GET /api/spectra/:id: one record version with its compound identity,
// acquisition metadata, peaks, the list of versions and the record's history
// from the audit trail. Drafts and versions in review are shown only to
// callers who may curate or audit.
import { QueryTypes } from 'sequelize';
import { getSequelize } from '../db/sequelize';
import { decodePeaks } from '../spectra/decodePeaks';
import { HttpError } from '../http';
import { tagsOfRecords } from './listRecords';
import type { RecordStatus } from './listQuery';

/** Statuses everyone who may read the library may see (old versions stay readable for reports). */
export const PUBLIC_STATUSES: readonly RecordStatus[] = ['released', 'superseded', 'retired'];

export interface RecordVersionSummary {
  version: number;
  status: RecordStatus;
  createdAt: string;
  updatedAt: string;
  changeReason: string | null;
  submittedAt: string | null;
  approvedAt: string | null;
  retiredAt: string | null;
}

export interface RecordHistoryEvent {
  id: number;
  at: string;
  action: string;
  actor: string | null;
  version: number | null;
  reason: string | null;
}

export interface RecordDetail {
  id: number;
  version: number;
  versionId: number;
  status: RecordStatus;
  latestVersion: number;
  releasedVersion: number | null;
  synthetic: boolean;
  compound: {
    id: number;
    name: string;
    synonyms: string[];
    formula: string | null;
    nominalMass: number | null;
    monoisotopicMass: number | null;
    averageMass: number | null;
    ihd: number | null;
    elements: string[];
    smiles: string | null;
    molfile: string | null;
    casRegistryNo: string | null;
    derivative: string | null;
    parentCompound: string | null;
    saltForm: string | null;
  };
  metadata: Record<string, unknown>;
  retentionIndices: { phase: string; value: number; ladder: string | null; column: string | null }[];
  tags: string[];
  peaks: [number, number][];
  peakCount: number;
  basePeak: number | null;
  sourceFileName: string | null;
  workflow: {
    createdBy: string | null;
    editors: string[];
    submittedBy: string | null;
    submittedAt: string | null;
    approvedBy: string | null;
    approvedAt: string | null;
    retiredAt: string | null;
    changeReason: string | null;
    /** user ids behind the names above, for the four-eyes check */
    ids: { createdBy: string | null; submittedBy: string | null; approvedBy: string | null; editors: string[] };
  };
  createdAt: string;
  updatedAt: string;
  versions: RecordVersionSummary[];
  history: RecordHistoryEvent[];
}

type Row = Record<string, any>;

const iso = (d: unknown): string | null => (d === null || d === undefined ? null : new Date(d as string).toISOString());
const num = (x: unknown): number | null => (x === null || x === undefined ? null : Number(x));
function jsonValue<T>(value: unknown, fallback: T): T {
  if (value === null || value === undefined) return fallback;
  if (typeof value !== 'string') return value as T;
  try {
    return JSON.parse(value) as T;
  } catch {
    return fallback;
  }
}

/**
 * Read one record.
 * @param id - the record id
 * @param options.version - the version to read; default the newest one the caller may see
 *   (for everyone else: the released version, else the newest superseded or retired one)
 * @param options.privileged - the caller may curate or audit, and so see drafts and versions in review
 * @throws {HttpError} 404 when the record or version does not exist or is not visible to the caller
 */
export async function getRecord(id: number, options: { version?: number; privileged?: boolean } = {}): Promise<RecordDetail> {
  const s = getSequelize();
  const visible = (status: string) => options.privileged || (PUBLIC_STATUSES as readonly string[]).includes(status);
  const [record] = await s.query<Row>('SELECT * FROM spectrum_record WHERE id = ?', { replacements: [id], type: QueryTypes.SELECT });
  if (!record) throw new HttpError(404, 'not_found', `There is no record ${id}`);
  const versionRows = await s.query<Row>(
    `SELECT version, status, createdAt, updatedAt, changeReason, submittedAt, approvedAt, retiredAt
       FROM spectrum_version WHERE recordId = ? ORDER BY version`,
    { replacements: [id], type: QueryTypes.SELECT },
  );
  const versions: RecordVersionSummary[] = versionRows
    .filter((r) => visible(r.status))
    .map((r) => ({
      version: Number(r.version),
      status: r.status,
      createdAt: iso(r.createdAt)!,
      updatedAt: iso(r.updatedAt)!,
      changeReason: r.changeReason ?? null,
      submittedAt: iso(r.submittedAt),
      approvedAt: iso(r.approvedAt),
      retiredAt: iso(r.retiredAt),
    }));
  if (versions.length === 0) throw new HttpError(404, 'not_found', `There is no record ${id}`);

  let wanted: number;
  if (options.version !== undefined) {
    if (!versions.some((v) => v.version === options.version)) {
      throw new HttpError(404, 'not_found', `Record ${id} has no version ${options.version} you may read`);
    }
    wanted = options.version;
  } else if (options.privileged) {
    wanted = versions[versions.length - 1].version;
  } else {
    const released = versions.find((v) => v.status === 'released');
    wanted = released ? released.version : versions[versions.length - 1].version;
  }

  const [v] = await s.query<Row>('SELECT * FROM spectrum_version WHERE recordId = ? AND version = ?', {
    replacements: [id, wanted],
    type: QueryTypes.SELECT,
  });
  const [compound] = await s.query<Row>('SELECT id FROM compound WHERE id = ?', { replacements: [record.compoundId], type: QueryTypes.SELECT });
  const ris = await s.query<Row>('SELECT phase, value, ladder, `column` FROM retention_index WHERE spectrumVersionId = ? ORDER BY phase', {
    replacements: [v.id],
    type: QueryTypes.SELECT,
  });
  const tags = (await tagsOfRecords([id])).get(id) ?? [];
  const visibleVersions = new Set(versions.map((x) => x.version));
  const events = await s.query<Row>(
    `SELECT e.id, e.at, e.action, e.actorEmail, e.version, e.reason, u.name AS actorName
       FROM audit_event e LEFT JOIN \`user\` u ON u.id = e.actorId
      WHERE e.recordId = ? ORDER BY e.at, e.id`,
    { replacements: [id], type: QueryTypes.SELECT },
  );
  const history: RecordHistoryEvent[] = events
    .filter((e) => e.version === null || visibleVersions.has(Number(e.version)))
    .map((e) => ({
      id: Number(e.id),
      at: iso(e.at)!,
      action: String(e.action),
      actor: e.actorName ?? e.actorEmail ?? null,
      version: num(e.version),
      reason: e.reason ?? null,
    }));

  const userIds = [v.createdBy, v.submittedBy, v.approvedBy, ...jsonValue<string[]>(v.editors, [])].filter(Boolean);
  const names = new Map<string, string>();
  if (userIds.length > 0) {
    const users = await s.query<Row>('SELECT id, name FROM `user` WHERE id IN (?)', { replacements: [[...new Set(userIds)]], type: QueryTypes.SELECT });
    for (const u of users) names.set(String(u.id), String(u.name));
  }
  const who = (uid: unknown) => (uid ? (names.get(String(uid)) ?? String(uid)) : null);

  return {
    id,
    version: Number(v.version),
    versionId: Number(v.id),
    status: v.status,
    latestVersion: Number(record.latestVersion),
    releasedVersion: num(record.releasedVersion),
    synthetic: !!v.synthetic || !!record.synthetic,
    compound: {
      id: Number(compound?.id ?? record.compoundId),
      name: String(v.name),
      synonyms: jsonValue<string[]>(v.synonyms, []),
      formula: v.formula ?? null,
      nominalMass: num(v.nominalMass),
      monoisotopicMass: num(v.monoisotopicMass),
      averageMass: num(v.averageMass),
      ihd: num(v.ihd),
      elements: v.elements ? String(v.elements).split(',').filter(Boolean) : [],
      smiles: v.smiles ?? null,
      molfile: v.molfile ?? null,
      casRegistryNo: v.casRegistryNo ?? null,
      derivative: v.derivative ?? null,
      parentCompound: v.parentCompound ?? null,
      saltForm: v.saltForm ?? null,
    },
    metadata: {
      technique: v.technique,
      ionizationMode: v.ionizationMode ?? null,
      ionizationEnergy: num(v.ionizationEnergy),
      instrument: v.instrument ?? null,
      analyzerType: v.analyzerType ?? null,
      sourceTemperature: num(v.sourceTemperature),
      massRangeMin: num(v.massRangeMin),
      massRangeMax: num(v.massRangeMax),
      method: v.method ?? null,
      retentionTime: num(v.retentionTime),
      referenceLot: v.referenceLot ?? null,
      referencePurity: v.referencePurity ?? null,
      acquiredAt: v.acquiredAt ?? null,
      acquiredBy: v.acquiredBy ?? null,
      origin: v.origin ?? null,
      owner: v.owner ?? null,
      notes: v.notes ?? null,
      extra: jsonValue<Record<string, unknown>>(v.metadata, {}),
    },
    retentionIndices: ris.map((r) => ({ phase: String(r.phase), value: Number(r.value), ladder: r.ladder ?? null, column: r.column ?? null })),
    tags,
    peaks: decodePeaks(v.peaks as Buffer),
    peakCount: Number(v.peakCount),
    basePeak: num(v.basePeakMz),
    sourceFileName: v.sourceFileName ?? null,
    workflow: {
      createdBy: who(v.createdBy),
      editors: jsonValue<string[]>(v.editors, []).map((e) => who(e)!),
      submittedBy: who(v.submittedBy),
      submittedAt: iso(v.submittedAt),
      approvedBy: who(v.approvedBy),
      approvedAt: iso(v.approvedAt),
      retiredAt: iso(v.retiredAt),
      changeReason: v.changeReason ?? null,
      ids: { createdBy: v.createdBy ?? null, submittedBy: v.submittedBy ?? null, approvedBy: v.approvedBy ?? null, editors: jsonValue<string[]>(v.editors, []) },
    },
    createdAt: iso(v.createdAt)!,
    updatedAt: iso(v.updatedAt)!,
    versions,
    history,
  };
}
