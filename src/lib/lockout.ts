// Account lockout, the second layer of sign-in throttling (the first is
// better-auth's rate limit per client address). Counts consecutive failed
// sign-ins per e-mail address in the database, so it holds across server
// processes; known and unknown addresses are treated alike, so the answer
// says nothing about whether an account exists.
import { QueryTypes } from 'sequelize';
import { getSequelize } from './db/sequelize';
import { appendAudit } from './audit';

export const LOCKOUT_FAILURES = 10;
export const LOCKOUT_WINDOW_MS = 15 * 60 * 1000;
export const LOCKOUT_DURATION_MS = 15 * 60 * 1000;
/** A failure count at which the audit trail gets a "burst" entry before the lock. */
export const FAILURE_BURST_AUDIT_AT = 5;

export function normalizeEmail(email: string): string {
  return String(email ?? '').trim().toLowerCase().slice(0, 255);
}

/** When the address is locked, until when. */
export async function lockedUntil(email: string, now = new Date()): Promise<Date | null> {
  const [row] = await getSequelize().query<{ lockedUntil: Date | null }>('SELECT lockedUntil FROM sign_in_failure WHERE email = ?', {
    replacements: [normalizeEmail(email)],
    type: QueryTypes.SELECT,
  });
  const until = row?.lockedUntil ? new Date(row.lockedUntil) : null;
  return until && until > now ? until : null;
}

/** Count one failed sign-in; locks the address at the tenth within the window. */
export async function recordSignInFailure(email: string, clientAddress: string | null, now = new Date()): Promise<{ failures: number; locked: boolean }> {
  const e = normalizeEmail(email);
  if (!e) return { failures: 0, locked: false };
  const sequelize = getSequelize();
  const result = await sequelize.transaction(async (t) => {
    await sequelize.query('INSERT IGNORE INTO sign_in_failure (email, failures, firstFailureAt, lockedUntil) VALUES (?, 0, ?, NULL)', {
      replacements: [e, now],
      type: QueryTypes.INSERT,
      transaction: t,
    });
    const [row] = await sequelize.query<{ failures: number; firstFailureAt: Date; lockedUntil: Date | null }>(
      'SELECT failures, firstFailureAt, lockedUntil FROM sign_in_failure WHERE email = ? FOR UPDATE',
      { replacements: [e], type: QueryTypes.SELECT, transaction: t },
    );
    const first = new Date(row.firstFailureAt);
    const lockOver = row.lockedUntil && new Date(row.lockedUntil) <= now;
    const fresh = row.failures === 0 || now.getTime() - first.getTime() > LOCKOUT_WINDOW_MS || lockOver;
    const failures = fresh ? 1 : Number(row.failures) + 1;
    const locking = failures >= LOCKOUT_FAILURES && !(row.lockedUntil && new Date(row.lockedUntil) > now);
    const until = failures >= LOCKOUT_FAILURES ? (locking ? new Date(now.getTime() + LOCKOUT_DURATION_MS) : new Date(row.lockedUntil!)) : null;
    await sequelize.query('UPDATE sign_in_failure SET failures = ?, firstFailureAt = ?, lockedUntil = ? WHERE email = ?', {
      replacements: [failures, fresh ? now : first, until, e],
      type: QueryTypes.UPDATE,
      transaction: t,
    });
    if (failures === FAILURE_BURST_AUDIT_AT) {
      await appendAudit({ action: 'auth.sign_in_failures', targetType: 'email', targetId: e, details: { failures, windowMinutes: LOCKOUT_WINDOW_MS / 60000, clientAddress } }, t);
    }
    if (locking) {
      await appendAudit({ action: 'auth.lockout', targetType: 'email', targetId: e, details: { failures, lockedUntil: until!.toISOString(), clientAddress } }, t);
    }
    return { failures, locked: failures >= LOCKOUT_FAILURES };
  });
  return result;
}

/** A successful sign-in ends the run of failures. */
export async function clearSignInFailures(email: string): Promise<void> {
  await getSequelize().query('DELETE FROM sign_in_failure WHERE email = ?', { replacements: [normalizeEmail(email)], type: QueryTypes.DELETE });
}

/** An admin lifts a lock; returns whether there was anything to clear. */
export async function clearLockout(email: string, actor: { id: string; email: string }): Promise<boolean> {
  const e = normalizeEmail(email);
  const sequelize = getSequelize();
  return sequelize.transaction(async (t) => {
    const [row] = await sequelize.query<{ failures: number; lockedUntil: Date | null }>('SELECT failures, lockedUntil FROM sign_in_failure WHERE email = ? FOR UPDATE', {
      replacements: [e],
      type: QueryTypes.SELECT,
      transaction: t,
    });
    if (!row) return false;
    await sequelize.query('DELETE FROM sign_in_failure WHERE email = ?', { replacements: [e], type: QueryTypes.DELETE, transaction: t });
    await appendAudit({ actorId: actor.id, actorEmail: actor.email, action: 'auth.lockout_cleared', targetType: 'email', targetId: e, details: { failures: Number(row.failures), lockedUntil: row.lockedUntil ? new Date(row.lockedUntil).toISOString() : null } }, t);
    return true;
  });
}

/** Addresses locked right now (for the admin screen). */
export async function currentLockouts(now = new Date()): Promise<{ email: string; failures: number; lockedUntil: Date }[]> {
  const rows = await getSequelize().query<{ email: string; failures: number; lockedUntil: Date }>(
    'SELECT email, failures, lockedUntil FROM sign_in_failure WHERE lockedUntil > ? ORDER BY lockedUntil DESC',
    { replacements: [now], type: QueryTypes.SELECT },
  );
  return rows.map((r) => ({ email: r.email, failures: Number(r.failures), lockedUntil: new Date(r.lockedUntil) }));
}
