// What GET /api/reports and GET /api/reports/:id answer, and what the report
// pages render: one shape for both, so the page shows what the API says.
import { QueryTypes } from 'sequelize';
import type { z } from 'zod';
import { getSequelize } from '../db/sequelize';
import { getSecret } from '../config';
import { HttpError } from '../http';
import { can } from '../roles';
import { toCsv } from '../records/toCsv';
import { integrityOf, reportContent } from './integrity';
import { reportLabel } from './reportLabel';
import type { listReportsSchema } from './schemas';
import { canView, iso, jsonValue, readCitations, readCitedVersion, readReportRow, userNames, visibilityWhere, type Row } from './store';
import {
  CONCLUSION_LABELS, REPORT_CAUTION, STATUS_LABELS, type Actor, type Conclusion, type CriteriaEvaluation, type IntegrityStatus,
  type Peak, type ReferenceStandard, type ReportSnapshot, type ReportStatus, type SampleDetails,
} from './types';

type Person = { id: string; name: string } | null;

export interface ReportView {
  id: number;
  label: string;
  title: string;
  status: ReportStatus;
  statusLabel: string;
  conclusion: Conclusion | null;
  conclusionLabel: string | null;
  reasoning: string | null;
  sample: SampleDetails;
  referenceStandard: ReferenceStandard | null;
  snapshot: ReportSnapshot;
  selected: { recordId: number; version: number; name: string; status: string; synthetic: boolean; peaks: Peak[] } | null;
  criteria: CriteriaEvaluation | null;
  criteriaSettingsVersion: number | null;
  citations: { recordId: number; version: number; role: string; name: string | null; status: string | null; synthetic: boolean }[];
  comments: { id: number; author: Person; action: string | null; body: string; createdAt: string }[];
  author: Person;
  reviewer: Person;
  signature: { signerId: string; signerName: string; meaning: string; signedAt: string; contentDigest: string | null } | null;
  integrity: { status: IntegrityStatus; hmac: string | null };
  supersedesReportId: number | null;
  supersededBy: number[];
  createdAt: string;
  updatedAt: string;
  submittedAt: string | null;
  decidedAt: string | null;
  permissions: { edit: boolean; submit: boolean; approve: boolean; return: boolean; comment: boolean };
  caution: string;
}

function person(map: Map<string, { id: string; name: string }>, id: unknown): Person {
  if (!id) return null;
  const p = map.get(String(id));
  return p ? { id: p.id, name: p.name } : { id: String(id), name: String(id) };
}

/** One report as the caller may see it; 404 when it does not exist or is not theirs to see. */
export async function getReportView(id: number, actor: Actor): Promise<ReportView> {
  const s = getSequelize();
  const row = await readReportRow(id);
  if (!row || !canView(actor, row)) throw new HttpError(404, 'not_found', `There is no report ${id}`);
  const citations = await readCitations(id);
  const commentRows = await s.query<Row>('SELECT id, authorId, action, body, createdAt FROM report_comment WHERE reportId = ? ORDER BY id', {
    replacements: [id],
    type: QueryTypes.SELECT,
  });
  const [sig] = await s.query<Row>(
    "SELECT signerId, signerName, meaning, signedAt, contentDigest FROM signature WHERE subjectType = 'report' AND subjectId = ? ORDER BY id DESC LIMIT 1",
    { replacements: [id], type: QueryTypes.SELECT },
  );
  const later = await s.query<Row>('SELECT id, status, authorId, reviewerId FROM report WHERE supersedesReportId = ? ORDER BY id', { replacements: [id], type: QueryTypes.SELECT });
  const names = await userNames([row.authorId, row.reviewerId, ...commentRows.map((c) => c.authorId)]);

  // Integrity: recompute over what is stored now and compare with the stored HMAC.
  let integrity: IntegrityStatus;
  try {
    const content = reportContent(row, citations, commentRows.map((c) => ({ id: Number(c.id), authorId: String(c.authorId), action: c.action ?? null, body: String(c.body), createdAt: c.createdAt })));
    integrity = integrityOf(row.status, row.hmac ?? null, content, getSecret('REPORT_SIGNING_KEY'));
  } catch {
    integrity = row.hmac || row.status === 'approved' ? 'altered' : 'unsigned';
  }

  const cited = new Map<string, { name: string; status: string; synthetic: boolean; peaks: Peak[] }>();
  const versionRows = citations.length
    ? await s.query<Row>(
        `SELECT v.recordId, v.version, v.name, v.status, v.synthetic, r.synthetic AS recordSynthetic FROM spectrum_version v JOIN spectrum_record r ON r.id = v.recordId
          WHERE (v.recordId, v.version) IN (${citations.map(() => '(?,?)').join(',')})`,
        { replacements: citations.flatMap((c) => [c.recordId, c.version]), type: QueryTypes.SELECT },
      )
    : [];
  for (const v of versionRows) cited.set(`${v.recordId}/${v.version}`, { name: String(v.name), status: String(v.status), synthetic: !!Number(v.synthetic) || !!Number(v.recordSynthetic), peaks: [] });

  let selected: ReportView['selected'] = null;
  if (row.selectedRecordId) {
    const ref = await readCitedVersion(Number(row.selectedRecordId), Number(row.selectedVersion));
    if (ref) selected = { recordId: ref.recordId, version: ref.version, name: ref.name, status: ref.status, synthetic: ref.synthetic, peaks: ref.peaks };
  }

  const isAuthor = row.authorId === actor.id;
  const open = row.status === 'draft' || row.status === 'returned';
  const reviewable = row.status === 'submitted' && !isAuthor && can(actor.roles, 'approve');
  return {
    id,
    label: reportLabel(id),
    title: String(row.title),
    status: row.status,
    statusLabel: STATUS_LABELS[row.status as ReportStatus] ?? row.status,
    conclusion: row.conclusion ?? null,
    conclusionLabel: row.conclusion ? (CONCLUSION_LABELS[row.conclusion as Conclusion] ?? row.conclusion) : null,
    reasoning: row.reasoning ?? null,
    sample: jsonValue<SampleDetails>(row.sample, {}),
    referenceStandard: jsonValue<ReferenceStandard | null>(row.referenceStandard, null),
    snapshot: jsonValue<ReportSnapshot>(row.snapshot, { query: { peaks: [], sourceFileName: null }, search: { filters: {}, options: {}, limit: null }, hits: [], interpretation: null, riLadder: null, library: { version: 0, size: 0 }, appVersion: '', takenAt: '' }),
    selected,
    criteria: jsonValue<CriteriaEvaluation | null>(row.criteria, null),
    criteriaSettingsVersion: row.criteriaSettingsVersion === null ? null : Number(row.criteriaSettingsVersion),
    citations: citations.map((c) => {
      const v = cited.get(`${c.recordId}/${c.version}`);
      return { ...c, name: v?.name ?? null, status: v?.status ?? null, synthetic: v?.synthetic ?? false };
    }),
    comments: commentRows.map((c) => ({ id: Number(c.id), author: person(names, c.authorId), action: c.action ?? null, body: String(c.body), createdAt: iso(c.createdAt)! })),
    author: person(names, row.authorId),
    reviewer: person(names, row.reviewerId),
    signature: sig ? { signerId: String(sig.signerId), signerName: String(sig.signerName), meaning: String(sig.meaning), signedAt: iso(sig.signedAt)!, contentDigest: sig.contentDigest ?? null } : null,
    integrity: { status: integrity, hmac: row.hmac ?? null },
    supersedesReportId: row.supersedesReportId === null ? null : Number(row.supersedesReportId),
    supersededBy: later.filter((l) => canView(actor, l)).map((l) => Number(l.id)),
    createdAt: iso(row.createdAt)!,
    updatedAt: iso(row.updatedAt)!,
    submittedAt: iso(row.submittedAt),
    decidedAt: iso(row.decidedAt),
    permissions: {
      edit: isAuthor && open && can(actor.roles, 'report'),
      submit: isAuthor && open && can(actor.roles, 'report'),
      approve: reviewable,
      return: reviewable,
      comment: row.status !== 'approved' && can(actor.roles, 'report'),
    },
    caution: REPORT_CAUTION,
  };
}

export interface ReportListItem {
  id: number;
  label: string;
  title: string;
  status: ReportStatus;
  conclusion: Conclusion | null;
  author: Person;
  reviewer: Person;
  selected: { recordId: number; version: number; name: string | null } | null;
  supersedesReportId: number | null;
  createdAt: string;
  updatedAt: string;
  submittedAt: string | null;
  decidedAt: string | null;
}

type ListQuery = z.infer<typeof listReportsSchema>;

/** The reports the caller may see, filtered, newest first. */
export async function listReports(q: ListQuery, actor: Actor): Promise<{ items: ReportListItem[]; total: number; page: number; pageSize: number }> {
  const s = getSequelize();
  const vis = visibilityWhere(actor, 'r');
  const where = [vis.sql];
  const params: unknown[] = [...vis.params];
  if (q.status) {
    where.push('r.status = ?');
    params.push(q.status);
  }
  if (q.conclusion) {
    where.push('r.conclusion = ?');
    params.push(q.conclusion);
  }
  if (q.mine === '1' || q.mine === 'true') {
    where.push('r.authorId = ?');
    params.push(actor.id);
  }
  const like = (x: string) => `%${x.toLowerCase().replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
  if (q.author) {
    where.push('(r.authorId = ? OR LOWER(a.name) LIKE ? OR LOWER(a.email) LIKE ?)');
    params.push(q.author, like(q.author), like(q.author));
  }
  if (q.reviewer) {
    where.push('(r.reviewerId = ? OR LOWER(rv.name) LIKE ? OR LOWER(rv.email) LIKE ?)');
    params.push(q.reviewer, like(q.reviewer), like(q.reviewer));
  }
  if (q.q) {
    const idMatch = /^\s*(?:IR-)?0*(\d+)\s*$/i.exec(q.q);
    where.push(`(LOWER(r.title) LIKE ?${idMatch ? ' OR r.id = ?' : ''})`);
    params.push(like(q.q), ...(idMatch ? [Number(idMatch[1])] : []));
  }
  if (q.from) {
    where.push('r.createdAt >= ?');
    params.push(new Date(`${q.from}T00:00:00Z`));
  }
  if (q.to) {
    where.push('r.createdAt < ?');
    params.push(new Date(Date.parse(`${q.to}T00:00:00Z`) + 86_400_000));
  }
  const from = 'FROM report r LEFT JOIN `user` a ON a.id = r.authorId LEFT JOIN `user` rv ON rv.id = r.reviewerId';
  const [{ n }] = await s.query<Row>(`SELECT COUNT(*) AS n ${from} WHERE ${where.join(' AND ')}`, { replacements: params, type: QueryTypes.SELECT });
  const pageSize = q.pageSize ?? (q.format === 'csv' ? 1000 : 200);
  const page = q.page ?? 1;
  const rows = await s.query<Row>(
    `SELECT r.id, r.title, r.status, r.conclusion, r.authorId, r.reviewerId, r.selectedRecordId, r.selectedVersion, r.supersedesReportId,
            r.createdAt, r.updatedAt, r.submittedAt, r.decidedAt, a.name AS authorName, rv.name AS reviewerName,
            (SELECT v.name FROM spectrum_version v WHERE v.recordId = r.selectedRecordId AND v.version = r.selectedVersion) AS selectedName
       ${from} WHERE ${where.join(' AND ')} ORDER BY r.updatedAt DESC, r.id DESC LIMIT ? OFFSET ?`,
    { replacements: [...params, pageSize, (page - 1) * pageSize], type: QueryTypes.SELECT },
  );
  return {
    total: Number(n),
    page,
    pageSize,
    items: rows.map((r) => ({
      id: Number(r.id),
      label: reportLabel(Number(r.id)),
      title: String(r.title),
      status: r.status,
      conclusion: r.conclusion ?? null,
      author: r.authorId ? { id: String(r.authorId), name: String(r.authorName ?? r.authorId) } : null,
      reviewer: r.reviewerId ? { id: String(r.reviewerId), name: String(r.reviewerName ?? r.reviewerId) } : null,
      selected: r.selectedRecordId ? { recordId: Number(r.selectedRecordId), version: Number(r.selectedVersion), name: r.selectedName ?? null } : null,
      supersedesReportId: r.supersedesReportId === null ? null : Number(r.supersedesReportId),
      createdAt: iso(r.createdAt)!,
      updatedAt: iso(r.updatedAt)!,
      submittedAt: iso(r.submittedAt),
      decidedAt: iso(r.decidedAt),
    })),
  };
}

export const REPORT_CSV_HEADER = [
  'report', 'title', 'status', 'conclusion', 'author', 'reviewer', 'selected_record', 'selected_version', 'selected_name', 'supersedes', 'created_utc', 'submitted_utc', 'decided_utc',
] as const;

export function reportsCsv(items: ReportListItem[]): string {
  return toCsv(REPORT_CSV_HEADER, items.map((i) => [
    i.label, i.title, i.status, i.conclusion ? CONCLUSION_LABELS[i.conclusion] : '', i.author?.name ?? '', i.reviewer?.name ?? '',
    i.selected?.recordId ?? null, i.selected?.version ?? null, i.selected?.name ?? '', i.supersedesReportId ? reportLabel(i.supersedesReportId) : '',
    i.createdAt, i.submittedAt ?? '', i.decidedAt ?? '',
  ]));
}
