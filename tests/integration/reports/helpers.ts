// Set-up of the report integration tests: people, records and versions of our
// own (the database is shared with other test files), and a way to call the
// report routes as the middleware would after its guard.
import crypto from 'node:crypto';
import { QueryTypes, type Sequelize } from 'sequelize';
import { hashPassword } from 'better-auth/crypto';
import { encodePeaks } from '../../../src/lib/spectra/encodePeaks';
import type { Role } from '../../../src/lib/roles';
import type { Actor } from '../../../src/lib/reports/types';

export const PASSWORD = 'reports-test-password-1';
export const RUN = crypto.randomBytes(4).toString('hex');

export async function createUser(sequelize: Sequelize, label: string, roles: Role[]): Promise<Actor> {
  const id = crypto.randomUUID();
  const email = `${label}-${RUN}@reports.test`;
  const now = new Date();
  const name = `${label} ${RUN}`;
  await sequelize.query('INSERT INTO `user` (id, name, email, emailVerified, roles, active, createdAt, updatedAt) VALUES (?,?,?,?,?,?,?,?)', {
    replacements: [id, name, email, 1, roles.join(','), 1, now, now], type: QueryTypes.INSERT,
  });
  await sequelize.query('INSERT INTO account (id, accountId, providerId, userId, password, createdAt, updatedAt) VALUES (?,?,?,?,?,?,?)', {
    replacements: [crypto.randomUUID(), id, 'credential', id, await hashPassword(PASSWORD), now, now], type: QueryTypes.INSERT,
  });
  return { id, email, name, roles };
}

/** A released record (version 1) with an optional retention index on the non-polar phase. */
export async function createReleasedRecord(sequelize: Sequelize, name: string, formula: string, peaks: [number, number][], ri?: number): Promise<number> {
  const now = new Date();
  const [compoundId] = await sequelize.query('INSERT INTO compound (name, nameKey, formula, createdAt, updatedAt) VALUES (?,?,?,?,?)', {
    replacements: [name, name.toLowerCase(), formula, now, now], type: QueryTypes.INSERT,
  });
  const [recordId] = await sequelize.query('INSERT INTO spectrum_record (compoundId, latestVersion, releasedVersion, synthetic, createdAt, updatedAt) VALUES (?,1,1,0,?,?)', {
    replacements: [compoundId, now, now], type: QueryTypes.INSERT,
  });
  await insertVersion(sequelize, Number(recordId), 1, name, formula, peaks, 'released', ri);
  return Number(recordId);
}

export async function insertVersion(sequelize: Sequelize, recordId: number, version: number, name: string, formula: string, peaks: [number, number][], status: string, ri?: number) {
  const now = new Date();
  const [vid] = await sequelize.query(
    `INSERT INTO spectrum_version (recordId, version, status, name, synonyms, formula, technique, metadata, peaks, peakCount, basePeakMz, contentHash, editors, createdAt, updatedAt)
     VALUES (?,?,?,?,'[]',?,'EI-MS','{}',?,?,?,?,'[]',?,?)`,
    {
      replacements: [recordId, version, status, name, formula, encodePeaks(peaks), peaks.length, [...peaks].sort((a, b) => b[1] - a[1])[0][0],
        crypto.createHash('sha256').update(JSON.stringify(peaks)).update(String(Math.random())).digest('hex'), now, now],
      type: QueryTypes.INSERT,
    },
  );
  if (ri !== undefined) {
    await sequelize.query("INSERT INTO retention_index (spectrumVersionId, phase, value) VALUES (?, 'non-polar', ?)", { replacements: [vid, ri], type: QueryTypes.INSERT });
  }
  return Number(vid);
}

/** Release version n+1 with other peaks; version n becomes superseded. */
export async function releaseNewVersion(sequelize: Sequelize, recordId: number, name: string, formula: string, peaks: [number, number][]) {
  const [r] = await sequelize.query<{ latestVersion: number }>('SELECT latestVersion FROM spectrum_record WHERE id = ?', { replacements: [recordId], type: QueryTypes.SELECT });
  const next = Number(r.latestVersion) + 1;
  await sequelize.query("UPDATE spectrum_version SET status = 'superseded' WHERE recordId = ? AND status = 'released'", { replacements: [recordId] });
  await insertVersion(sequelize, recordId, next, name, formula, peaks, 'released');
  await sequelize.query('UPDATE spectrum_record SET latestVersion = ?, releasedVersion = ? WHERE id = ?', { replacements: [next, next, recordId] });
  return next;
}

/** Call an endpoint as the middleware would, after its guard: `locals.user` is the actor. */
export async function route(
  fn: (ctx: any) => Promise<Response> | Response,
  actor: Actor,
  { method = 'GET', path = '/api/reports', body, params = {} }: { method?: string; path?: string; body?: unknown; params?: Record<string, string> } = {},
): Promise<{ status: number; body: any; headers: Headers; text: string }> {
  const url = `http://127.0.0.1:4321${path}`;
  const request = new Request(url, {
    method,
    headers: body === undefined ? {} : { 'content-type': 'application/json' },
    body: body === undefined ? undefined : JSON.stringify(body),
  });
  const res = await fn({ request, url: new URL(url), locals: { user: actor, session: null, apiKeyId: null }, params });
  const text = await res.text();
  let parsed: any = null;
  try {
    parsed = JSON.parse(text);
  } catch {
    parsed = null;
  }
  return { status: res.status, body: parsed, headers: res.headers, text };
}

export async function mailsTo(sequelize: Sequelize, email: string, afterId = 0) {
  return sequelize.query<{ id: number; to: string; subject: string; text: string; html: string | null }>(
    'SELECT id, `to`, subject, text, html FROM mail_message WHERE id > ? AND `to` LIKE ? ORDER BY id',
    { replacements: [afterId, `%${email}%`], type: QueryTypes.SELECT },
  );
}

export async function lastMailId(sequelize: Sequelize): Promise<number> {
  const [r] = await sequelize.query<{ m: number | null }>('SELECT MAX(id) AS m FROM mail_message', { type: QueryTypes.SELECT });
  return Number(r.m ?? 0);
}

/** A hit as the search route answers it. */
export function hit(rank: number, recordId: number, name: string, score: number, version = 1) {
  return { rank, spectrumId: recordId, version, name, formula: null, nominalMass: null, ihd: null, scores: { cosine: score, reverseCosine: score, composite: score, entropy: score }, score };
}
