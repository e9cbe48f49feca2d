// Reading the audit trail for GET /api/admin/audit: filters by actor, record,
// action, target and time; a page of events as JSON, or every matching event
// as CSV. Read-only: the trail itself is only ever appended to (src/lib/audit.ts).
import { z } from 'zod';
import { QueryTypes } from 'sequelize';
import { getSequelize } from '../db/sequelize';
import { toCsv } from '../records/toCsv';

/** Sort keys a caller may ask for (`-key` descending); nothing else reaches the SQL. */
export const AUDIT_SORT_KEYS = ['id', 'at', 'action', 'actorEmail', 'recordId'] as const;
const SORT_COLUMNS: Record<(typeof AUDIT_SORT_KEYS)[number], string> = {
  id: 'id', at: '`at`', action: 'action', actorEmail: 'actorEmail', recordId: 'recordId',
};
export const AUDIT_MAX_PAGE_SIZE = 500;
/** CSV exports stop here and say so in a header. */
export const AUDIT_MAX_EXPORT_ROWS = 100_000;

const time = z
  .string()
  .trim()
  .optional()
  .transform((s, ctx) => {
    if (!s) return undefined;
    const d = new Date(s);
    if (Number.isNaN(d.getTime())) {
      ctx.addIssue({ code: 'custom', message: 'a date or time such as 2025-01-31 or 2025-01-31T12:00:00Z' });
      return z.NEVER;
    }
    return d;
  });

const optionalInt = (max: number) =>
  z
    .string()
    .optional()
    .transform((s) => (s === undefined || s.trim() === '' ? undefined : Number(s)))
    .pipe(z.number().int().min(1).max(max).optional());
const intWithDefault = (max: number, fallback: number) =>
  z
    .string()
    .optional()
    .transform((s) => (s === undefined || s.trim() === '' ? fallback : Number(s)))
    .pipe(z.number().int().min(1).max(max));

export const auditQuerySchema = z
  .object({
    /** user id or e-mail address of who acted */
    actor: z.string().trim().max(255).optional().transform((s) => s || undefined),
    /** spectrum record id */
    record: optionalInt(2 ** 31 - 1),
    version: optionalInt(2 ** 31 - 1),
    action: z.string().trim().max(64).regex(/^[a-z0-9_.*-]*$/i, 'an action such as record.approved (a trailing * matches a prefix)').optional().transform((s) => s || undefined),
    targetType: z.string().trim().max(32).regex(/^[a-z0-9_]*$/i, 'a target type such as record, report or user').optional().transform((s) => s || undefined),
    targetId: z.string().trim().max(64).optional().transform((s) => s || undefined),
    from: time,
    to: time,
    page: intWithDefault(1_000_000, 1),
    pageSize: intWithDefault(AUDIT_MAX_PAGE_SIZE, 100),
    sort: z
      .string()
      .trim()
      .optional()
      .transform((s) => s || undefined)
      .refine((s) => s === undefined || (AUDIT_SORT_KEYS as readonly string[]).includes(s.replace(/^-/, '')), {
        message: `sort must be one of ${AUDIT_SORT_KEYS.join(', ')} (prefix "-" for descending)`,
      }),
    format: z.enum(['json', 'csv']).optional().default('json'),
  })
  .strict();

export type AuditQuery = z.infer<typeof auditQuerySchema>;

export interface AuditEventView {
  id: number;
  at: string;
  actorId: string | null;
  actorEmail: string | null;
  action: string;
  targetType: string | null;
  targetId: string | null;
  recordId: number | null;
  version: number | null;
  reason: string | null;
  details: unknown;
  prevHash: string;
  hash: string;
}

function whereOf(q: AuditQuery): { sql: string; replacements: unknown[] } {
  const parts: string[] = [];
  const replacements: unknown[] = [];
  if (q.actor) {
    parts.push('(actorId = ? OR actorEmail = ?)');
    replacements.push(q.actor, q.actor.toLowerCase());
  }
  if (q.record !== undefined) {
    parts.push('recordId = ?');
    replacements.push(q.record);
  }
  if (q.version !== undefined) {
    parts.push('version = ?');
    replacements.push(q.version);
  }
  if (q.action) {
    if (q.action.endsWith('*')) {
      parts.push("action LIKE ? ESCAPE '\\\\'");
      replacements.push(`${q.action.slice(0, -1).replace(/[\\%_]/g, (c) => `\\${c}`)}%`);
    } else {
      parts.push('action = ?');
      replacements.push(q.action);
    }
  }
  if (q.targetType) {
    parts.push('targetType = ?');
    replacements.push(q.targetType);
  }
  if (q.targetId) {
    parts.push('targetId = ?');
    replacements.push(q.targetId);
  }
  if (q.from) {
    parts.push('`at` >= ?');
    replacements.push(q.from);
  }
  if (q.to) {
    parts.push('`at` <= ?');
    replacements.push(q.to);
  }
  return { sql: parts.length ? `WHERE ${parts.join(' AND ')}` : '', replacements };
}

function orderOf(q: AuditQuery): string {
  const key = (q.sort?.replace(/^-/, '') ?? 'id') as keyof typeof SORT_COLUMNS;
  const dir = !q.sort || q.sort.startsWith('-') ? 'DESC' : 'ASC';
  return `ORDER BY ${SORT_COLUMNS[key]} ${dir}${key === 'id' ? '' : `, id ${dir}`}`;
}

function view(r: Record<string, any>): AuditEventView {
  let details = r.details;
  if (typeof details === 'string') {
    try {
      details = JSON.parse(details);
    } catch {
      /* keep the text */
    }
  }
  return {
    id: Number(r.id), at: new Date(r.at).toISOString(), actorId: r.actorId ?? null, actorEmail: r.actorEmail ?? null, action: String(r.action),
    targetType: r.targetType ?? null, targetId: r.targetId ?? null, recordId: r.recordId === null ? null : Number(r.recordId),
    version: r.version === null ? null : Number(r.version), reason: r.reason ?? null, details: details ?? null, prevHash: r.prevHash, hash: r.hash,
  };
}

export async function listAuditEvents(q: AuditQuery): Promise<{ items: AuditEventView[]; total: number; page: number; pageSize: number }> {
  const s = getSequelize();
  const w = whereOf(q);
  const [c] = await s.query<{ n: number }>(`SELECT COUNT(*) AS n FROM audit_event ${w.sql}`, { replacements: w.replacements, type: QueryTypes.SELECT });
  const rows = await s.query<Record<string, any>>(`SELECT * FROM audit_event ${w.sql} ${orderOf(q)} LIMIT ? OFFSET ?`, {
    replacements: [...w.replacements, q.pageSize, (q.page - 1) * q.pageSize],
    type: QueryTypes.SELECT,
  });
  return { items: rows.map(view), total: Number(c?.n ?? 0), page: q.page, pageSize: q.pageSize };
}

export const AUDIT_CSV_HEADER = ['id', 'at', 'actorId', 'actorEmail', 'action', 'targetType', 'targetId', 'recordId', 'version', 'reason', 'details', 'prevHash', 'hash'] as const;

/** Every matching event (up to AUDIT_MAX_EXPORT_ROWS) as CSV, read in chunks. */
export async function exportAuditCsv(q: AuditQuery): Promise<{ csv: string; rows: number; truncated: boolean }> {
  const s = getSequelize();
  const w = whereOf(q);
  const out: unknown[][] = [];
  const chunk = 5000;
  let truncated = false;
  for (let offset = 0; ; offset += chunk) {
    const rows = await s.query<Record<string, any>>(`SELECT * FROM audit_event ${w.sql} ${orderOf(q)} LIMIT ? OFFSET ?`, {
      replacements: [...w.replacements, chunk, offset],
      type: QueryTypes.SELECT,
    });
    for (const r of rows) {
      if (out.length >= AUDIT_MAX_EXPORT_ROWS) {
        truncated = true;
        break;
      }
      const e = view(r);
      out.push([e.id, e.at, e.actorId, e.actorEmail, e.action, e.targetType, e.targetId, e.recordId, e.version, e.reason, e.details === null ? null : JSON.stringify(e.details), e.prevHash, e.hash]);
    }
    if (truncated || rows.length < chunk) break;
  }
  return { csv: toCsv(AUDIT_CSV_HEADER, out), rows: out.length, truncated };
}
