// The electronic-signature check and the account lockout, against the test MariaDB.
import { describe, it, expect, afterAll, beforeAll } from 'vitest';
import crypto from 'node:crypto';
import { QueryTypes } from 'sequelize';
import { hashPassword } from 'better-auth/crypto';
import { useTestDatabase } from '../helpers/db';
import { closeSequelize } from '../../src/lib/db/sequelize';
import { verifySignature } from '../../src/lib/signature';
import { HttpError } from '../../src/lib/http';
import { clearLockout, lockedUntil, recordSignInFailure, LOCKOUT_FAILURES, LOCKOUT_WINDOW_MS } from '../../src/lib/lockout';
import { apiKeyFrom } from '../../src/lib/auth';

const db = useTestDatabase();
const userId = crypto.randomUUID();
afterAll(() => closeSequelize());

beforeAll(async () => {
  const now = new Date();
  await db.query('INSERT INTO `user` (id, name, email, emailVerified, roles, active, createdAt, updatedAt) VALUES (?,?,?,1,?,1,?,?)', {
    replacements: [userId, 'Signe Signer', `signer.${Date.now()}@protections.test`, 'curator', now, now], type: QueryTypes.INSERT,
  });
  await db.query("INSERT INTO account (id, accountId, providerId, userId, password, createdAt, updatedAt) VALUES (?,?,'credential',?,?,?,?)", {
    replacements: [crypto.randomUUID(), userId, userId, await hashPassword('the right password 1'), now, now], type: QueryTypes.INSERT,
  });
});

describe('verifySignature', () => {
  it('stores a signature with meaning, subject, digest and UTC time when the password is right', async () => {
    const before = Date.now();
    const s = await verifySignature({ userId, password: 'the right password 1', meaning: 'approved for release', subjectType: 'spectrum_version', subjectId: 42, contentDigest: 'a'.repeat(64) });
    expect(s.signerName).toBe('Signe Signer');
    expect(s.signedAt.getTime()).toBeGreaterThanOrEqual(before - 1);
    const [row] = await db.query<any>('SELECT * FROM signature WHERE id = ?', { replacements: [s.id], type: QueryTypes.SELECT });
    expect(row).toMatchObject({ signerId: userId, meaning: 'approved for release', subjectType: 'spectrum_version', subjectId: 42, contentDigest: 'a'.repeat(64) });
    expect(new Date(row.signedAt).toISOString()).toBe(s.signedAt.toISOString());
  });

  it('refuses a wrong password with 403 signature_failed and stores nothing', async () => {
    const [{ n: before }] = await db.query<any>('SELECT COUNT(*) AS n FROM signature', { type: QueryTypes.SELECT });
    const err = await verifySignature({ userId, password: 'wrong password here', meaning: 'approved', subjectType: 'report', subjectId: 1 }).catch((e) => e);
    expect(err).toBeInstanceOf(HttpError);
    expect(err.status).toBe(403);
    expect(err.code).toBe('signature_failed');
    const err2 = await verifySignature({ userId: 'no-such-user', password: 'x', meaning: 'approved', subjectType: 'report', subjectId: 1 }).catch((e) => e);
    expect(err2.code).toBe('signature_failed');
    const [{ n: after }] = await db.query<any>('SELECT COUNT(*) AS n FROM signature', { type: QueryTypes.SELECT });
    expect(Number(after)).toBe(Number(before));
  });

  it('joins the caller\'s transaction, so a rollback removes the signature', async () => {
    let id = 0;
    await expect(db.transaction(async (t) => {
      id = (await verifySignature({ userId, password: 'the right password 1', meaning: 'approved', subjectType: 'report', subjectId: 7 }, t)).id;
      throw new Error('later step failed');
    })).rejects.toThrow('later step failed');
    expect(await db.query('SELECT id FROM signature WHERE id = ?', { replacements: [id], type: QueryTypes.SELECT })).toEqual([]);
  });
});

describe('account lockout', () => {
  it(`locks after ${LOCKOUT_FAILURES} failures within the window and audits it; an admin clears it`, async () => {
    const email = `Locked.${Date.now()}@Protections.test`;
    const t0 = new Date();
    for (let i = 1; i < LOCKOUT_FAILURES; i++) expect((await recordSignInFailure(email, '127.0.0.1', new Date(t0.getTime() + i * 1000))).locked).toBe(false);
    expect(await lockedUntil(email)).toBeNull();
    const last = await recordSignInFailure(email, '127.0.0.1', new Date(t0.getTime() + 20_000));
    expect(last).toEqual({ failures: LOCKOUT_FAILURES, locked: true });
    expect(await lockedUntil(email.toLowerCase())).toBeInstanceOf(Date);
    const events = await db.query<any>("SELECT action FROM audit_event WHERE targetId = ? ORDER BY id", { replacements: [email.toLowerCase()], type: QueryTypes.SELECT });
    expect(events.map((e: any) => e.action)).toEqual(['auth.sign_in_failures', 'auth.lockout']);
    expect(await clearLockout(email, { id: 'admin-id', email: 'admin@protections.test' })).toBe(true);
    expect(await lockedUntil(email)).toBeNull();
  });

  it('starts counting afresh when the failures are spread over more than the window', async () => {
    const email = `spread.${Date.now()}@protections.test`;
    const t0 = Date.now() - 2 * LOCKOUT_WINDOW_MS;
    for (let i = 0; i < LOCKOUT_FAILURES - 1; i++) await recordSignInFailure(email, null, new Date(t0 + i * 1000));
    const r = await recordSignInFailure(email, null, new Date());
    expect(r).toEqual({ failures: 1, locked: false });
  });
});

describe('API key from headers', () => {
  it('reads Authorization: Bearer and x-api-key', () => {
    expect(apiKeyFrom(new Headers({ authorization: 'Bearer ion_abc' }))).toBe('ion_abc');
    expect(apiKeyFrom(new Headers({ 'x-api-key': 'ion_def' }))).toBe('ion_def');
    expect(apiKeyFrom(new Headers({ authorization: 'Basic xyz' }))).toBeNull();
  });
});
