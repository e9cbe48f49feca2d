// Reading report rows and what they point at (users, record versions), and
// the visibility rule of API.md: viewers see approved reports only; analysts
// their own and approved ones; curators also every submitted or returned one;
// auditors (and admins, who hold the audit capability) every report.
import { QueryTypes, type Transaction } from 'sequelize';
import { getSequelize } from '../db/sequelize';
import { can } from '../roles';
import { decodePeaks } from '../spectra/decodePeaks';
import type { Actor, Peak } from './types';

export type Row = Record<string, any>;

export function jsonValue<T>(v: unknown, fallback: T): T {
  if (v === null || v === undefined) return fallback;
  if (typeof v !== 'string') return v as T;
  try {
    return JSON.parse(v) as T;
  } catch {
    return fallback;
  }
}

export const iso = (d: unknown): string | null => (d === null || d === undefined ? null : new Date(d as string).toISOString());

/** SQL condition (alias r) for the reports an actor may see, with its replacements. */
export function visibilityWhere(actor: Actor, alias = 'r'): { sql: string; params: unknown[] } {
  if (can(actor.roles, 'audit')) return { sql: '1=1', params: [] };
  const parts = [`${alias}.status = 'approved'`];
  const params: unknown[] = [];
  if (can(actor.roles, 'report')) {
    parts.push(`${alias}.authorId = ?`);
    params.push(actor.id);
  }
  if (can(actor.roles, 'approve')) {
    parts.push(`${alias}.status IN ('submitted', 'returned')`, `${alias}.reviewerId = ?`);
    params.push(actor.id);
  }
  return { sql: `(${parts.join(' OR ')})`, params };
}

export function canView(actor: Actor, row: Row): boolean {
  if (can(actor.roles, 'audit')) return true;
  if (row.status === 'approved') return true;
  if (can(actor.roles, 'report') && row.authorId === actor.id) return true;
  if (can(actor.roles, 'approve') && (row.status === 'submitted' || row.status === 'returned' || row.reviewerId === actor.id)) return true;
  return false;
}

export async function readReportRow(id: number, transaction?: Transaction, lock = false): Promise<Row | null> {
  const [row] = await getSequelize().query<Row>(`SELECT * FROM report WHERE id = ?${lock ? ' FOR UPDATE' : ''}`, {
    replacements: [id],
    type: QueryTypes.SELECT,
    transaction,
  });
  return row ?? null;
}

export async function readCitations(reportId: number, transaction?: Transaction) {
  const rows = await getSequelize().query<Row>('SELECT recordId, version, role FROM report_citation WHERE reportId = ? ORDER BY recordId, version', {
    replacements: [reportId],
    type: QueryTypes.SELECT,
    transaction,
  });
  return rows.map((r) => ({ recordId: Number(r.recordId), version: Number(r.version), role: String(r.role) }));
}

export async function userNames(ids: (string | null | undefined)[]): Promise<Map<string, { id: string; name: string; email: string }>> {
  const wanted = [...new Set(ids.filter((x): x is string => !!x))];
  const out = new Map<string, { id: string; name: string; email: string }>();
  if (wanted.length === 0) return out;
  const rows = await getSequelize().query<Row>('SELECT id, name, email FROM `user` WHERE id IN (?)', { replacements: [wanted], type: QueryTypes.SELECT });
  for (const r of rows) out.set(String(r.id), { id: String(r.id), name: String(r.name), email: String(r.email) });
  return out;
}

export interface CitedVersion {
  recordId: number;
  version: number;
  versionId: number;
  name: string;
  formula: string | null;
  status: string;
  synthetic: boolean;
  peaks: Peak[];
  retentionIndices: { phase: string; value: number }[];
}

/** A record at exactly the cited version (whatever its status now), or null. */
export async function readCitedVersion(recordId: number, version: number, transaction?: Transaction): Promise<CitedVersion | null> {
  const s = getSequelize();
  const [v] = await s.query<Row>(
    `SELECT v.id, v.recordId, v.version, v.name, v.formula, v.status, v.peaks, v.synthetic, r.synthetic AS recordSynthetic
       FROM spectrum_version v JOIN spectrum_record r ON r.id = v.recordId WHERE v.recordId = ? AND v.version = ?`,
    { replacements: [recordId, version], type: QueryTypes.SELECT, transaction },
  );
  if (!v) return null;
  const ris = await s.query<Row>('SELECT phase, value FROM retention_index WHERE spectrumVersionId = ? ORDER BY phase', {
    replacements: [v.id],
    type: QueryTypes.SELECT,
    transaction,
  });
  let peaks: Peak[] = [];
  try {
    peaks = decodePeaks(v.peaks as Buffer);
  } catch {
    peaks = [];
  }
  return {
    recordId: Number(v.recordId),
    version: Number(v.version),
    versionId: Number(v.id),
    name: String(v.name),
    formula: v.formula ?? null,
    status: String(v.status),
    synthetic: !!Number(v.synthetic) || !!Number(v.recordSynthetic),
    peaks,
    retentionIndices: ris.map((r) => ({ phase: String(r.phase), value: Number(r.value) })),
  };
}

/** Active curators other than the author: who is asked to review. */
export async function reviewersFor(authorId: string, transaction?: Transaction): Promise<{ id: string; name: string; email: string }[]> {
  const rows = await getSequelize().query<Row>('SELECT id, name, email, roles FROM `user` WHERE active = 1 AND id <> ?', {
    replacements: [authorId],
    type: QueryTypes.SELECT,
    transaction,
  });
  return rows
    .filter((r) => String(r.roles).split(',').map((x) => x.trim()).includes('curator'))
    .map((r) => ({ id: String(r.id), name: String(r.name), email: String(r.email) }));
}
