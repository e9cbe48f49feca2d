// The audit trail: append-only and hash-chained. Each event stores the digest
// of the one before it, so a changed or deleted row breaks the chain, which
// `npm run check-data` verifies. This module only ever inserts.
import crypto from 'node:crypto';
import { QueryTypes, type Transaction } from 'sequelize';
import { getSequelize } from './db/sequelize';

export interface AuditInput {
  actorId?: string | null;
  actorEmail?: string | null;
  action: string;
  targetType?: string | null;
  targetId?: string | number | null;
  recordId?: number | null;
  version?: number | null;
  reason?: string | null;
  details?: unknown;
}

export const GENESIS_HASH = '0'.repeat(64);

function canonical(value: unknown): string {
  if (value === null || typeof value !== 'object') return JSON.stringify(value ?? null);
  if (Array.isArray(value)) return `[${value.map(canonical).join(',')}]`;
  const keys = Object.keys(value as Record<string, unknown>).filter((k) => (value as Record<string, unknown>)[k] !== undefined).sort();
  return `{${keys.map((k) => `${JSON.stringify(k)}:${canonical((value as Record<string, unknown>)[k])}`).join(',')}}`;
}
export { canonical as canonicalJson };

/** The digest of one event, given the digest before it. */
export function auditEventHash(prevHash: string, e: {
  at: Date | string; actorId: string | null; actorEmail: string | null; action: string; targetType: string | null;
  targetId: string | null; recordId: number | null; version: number | null; reason: string | null; details: unknown;
}): string {
  const at = (e.at instanceof Date ? e.at : new Date(e.at)).toISOString();
  const body = canonical({
    at, actorId: e.actorId ?? null, actorEmail: e.actorEmail ?? null, action: e.action, targetType: e.targetType ?? null,
    targetId: e.targetId ?? null, recordId: e.recordId ?? null, version: e.version ?? null, reason: e.reason ?? null,
    details: e.details ?? null,
  });
  return crypto.createHash('sha256').update(prevHash).update('\n').update(body).digest('hex');
}

/** Append one event; joins the caller's transaction when given one. */
export async function appendAudit(input: AuditInput, transaction?: Transaction): Promise<{ id: number; hash: string }> {
  const sequelize = getSequelize();
  const run = async (t: Transaction) => {
    const [head] = await sequelize.query<{ lastHash: string }>('SELECT lastHash FROM audit_head WHERE id = 1 FOR UPDATE', {
      type: QueryTypes.SELECT,
      transaction: t,
    });
    const prevHash = head?.lastHash ?? GENESIS_HASH;
    // Millisecond precision: what DATETIME(3) stores is what gets hashed.
    const at = new Date(Math.floor(Date.now()));
    const row = {
      at,
      actorId: input.actorId ?? null,
      actorEmail: input.actorEmail ?? null,
      action: input.action,
      targetType: input.targetType ?? null,
      targetId: input.targetId === undefined || input.targetId === null ? null : String(input.targetId),
      recordId: input.recordId ?? null,
      version: input.version ?? null,
      reason: input.reason ?? null,
      details: input.details === undefined ? null : JSON.parse(JSON.stringify(input.details)),
    };
    const hash = auditEventHash(prevHash, row);
    const [id] = await sequelize.query(
      'INSERT INTO audit_event (`at`, actorId, actorEmail, action, targetType, targetId, recordId, version, reason, details, prevHash, hash) VALUES (?,?,?,?,?,?,?,?,?,?,?,?)',
      {
        replacements: [row.at, row.actorId, row.actorEmail, row.action, row.targetType, row.targetId, row.recordId, row.version, row.reason,
          row.details === null ? null : JSON.stringify(row.details), prevHash, hash],
        type: QueryTypes.INSERT,
        transaction: t,
      },
    );
    await sequelize.query('UPDATE audit_head SET lastId = ?, lastHash = ? WHERE id = 1', {
      replacements: [id, hash],
      type: QueryTypes.UPDATE,
      transaction: t,
    });
    return { id: Number(id), hash };
  };
  return transaction ? run(transaction) : sequelize.transaction(run);
}

/** Walk the whole chain; returns the first broken link, if any. */
export async function verifyAuditChain(): Promise<{ ok: boolean; events: number; brokenAt?: number; message?: string }> {
  const sequelize = getSequelize();
  let prev = GENESIS_HASH;
  let lastId = 0;
  let count = 0;
  for (;;) {
    const rows = await sequelize.query<Record<string, any>>(
      'SELECT * FROM audit_event WHERE id > ? ORDER BY id LIMIT 5000',
      { replacements: [lastId], type: QueryTypes.SELECT },
    );
    if (rows.length === 0) break;
    for (const r of rows) {
      const details = typeof r.details === 'string' ? JSON.parse(r.details) : r.details;
      if (r.prevHash !== prev) return { ok: false, events: count, brokenAt: Number(r.id), message: `event ${r.id} does not follow the event before it (a row was removed or changed)` };
      const expect = auditEventHash(prev, { ...r, details } as any);
      if (expect !== r.hash) return { ok: false, events: count, brokenAt: Number(r.id), message: `event ${r.id} was changed after it was written` };
      prev = r.hash;
      lastId = Number(r.id);
      count++;
    }
  }
  const [head] = await sequelize.query<{ lastHash: string }>('SELECT lastHash FROM audit_head WHERE id = 1', { type: QueryTypes.SELECT });
  if (head && head.lastHash !== prev) return { ok: false, events: count, message: 'the newest audit events are missing (the chain ends early)' };
  return { ok: true, events: count };
}
