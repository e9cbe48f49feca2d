// Integrity of approved reports: an HMAC-SHA-256 over the canonical JSON
// (sorted keys) of the report's stored fields, the record versions it cites
// and its review thread, keyed with REPORT_SIGNING_KEY, which lives outside the database, so
// that whoever can change rows cannot recompute it.
import crypto from 'node:crypto';
import { canonicalJson } from '../audit';
import type { IntegrityStatus } from './types';

/** The stored fields an approval covers (everything but the HMAC itself and updatedAt). */
export const SIGNED_FIELDS = [
  'id', 'title', 'status', 'authorId', 'reviewerId', 'conclusion', 'reasoning', 'sample', 'snapshot',
  'selectedRecordId', 'selectedVersion', 'criteria', 'criteriaSettingsVersion', 'referenceStandard',
  'supersedesReportId', 'submittedAt', 'decidedAt', 'createdAt',
] as const;
const JSON_FIELDS = new Set(['sample', 'snapshot', 'criteria', 'referenceStandard']);
const DATE_FIELDS = new Set(['submittedAt', 'decidedAt', 'createdAt']);
const INT_FIELDS = new Set(['id', 'selectedRecordId', 'selectedVersion', 'criteriaSettingsVersion', 'supersedesReportId']);

function normalize(field: string, v: unknown): unknown {
  if (v === undefined || v === null) return null;
  if (JSON_FIELDS.has(field)) return typeof v === 'string' ? JSON.parse(v) : v;
  if (DATE_FIELDS.has(field)) return new Date(v as string | Date).toISOString();
  if (INT_FIELDS.has(field)) return Number(v);
  return v;
}

/** The canonical content of a report row (as read from the database) and its citations. */
export function reportContent(
  row: Record<string, unknown>,
  citations: readonly { recordId: number; version: number; role: string }[],
  comments: readonly { id: number; authorId: string; action: string | null; body: string; createdAt: Date | string }[] = [],
): string {
  const body: Record<string, unknown> = {};
  for (const f of SIGNED_FIELDS) body[f] = normalize(f, row[f]);
  body.citations = [...citations]
    .map((c) => ({ recordId: Number(c.recordId), version: Number(c.version), role: String(c.role) }))
    .sort((a, b) => a.recordId - b.recordId || a.version - b.version || a.role.localeCompare(b.role));
  // The review thread as it stood at approval is part of what was signed.
  body.comments = [...comments]
    .map((c) => ({ id: Number(c.id), authorId: String(c.authorId), action: c.action ?? null, body: String(c.body), createdAt: new Date(c.createdAt).toISOString() }))
    .sort((a, b) => a.id - b.id);
  return canonicalJson(body);
}

export function reportHmac(content: string, key: string): string {
  if (!key) throw new RangeError('key must not be empty');
  return crypto.createHmac('sha256', key).update(content, 'utf8').digest('hex');
}

/** SHA-256 of the content: what the reviewer's electronic signature records. */
export function contentDigest(content: string): string {
  return crypto.createHash('sha256').update(content, 'utf8').digest('hex');
}

/**
 * "intact" when an approved report's HMAC matches its content, "altered" when
 * it does not (or an approved report has none, or a non-approved one has one),
 * "unsigned" for reports not yet approved.
 */
export function integrityOf(status: string, storedHmac: string | null, content: string, key: string): IntegrityStatus {
  if (!storedHmac) return status === 'approved' ? 'altered' : 'unsigned';
  const expected = Buffer.from(reportHmac(content, key), 'hex');
  const given = Buffer.from(String(storedHmac).trim(), 'hex');
  const ok = given.length === expected.length && crypto.timingSafeEqual(given, expected);
  return ok && status === 'approved' ? 'intact' : 'altered';
}
