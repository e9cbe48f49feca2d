// Administration of people: list users, change roles, deactivate and
// reactivate (which ends their sessions and disables their keys at once),
// and API keys issued by an admin for a user. Every change lands in the
// audit trail with its actor.
import { QueryTypes, type Transaction } from 'sequelize';
import { getSequelize } from './db/sequelize';
import { appendAudit } from './audit';
import { HttpError } from './http';
import { parseRoles, type Role } from './roles';
import { getAuth } from './auth';

export interface Actor {
  id: string;
  email: string;
}

export interface UserListItem {
  id: string;
  email: string;
  name: string;
  roles: Role[];
  active: boolean;
  createdAt: string;
  lockedUntil: string | null;
  activeSessions: number;
  apiKeys: number;
}

export async function listUsers(): Promise<UserListItem[]> {
  const rows = await getSequelize().query<any>(
    `SELECT u.id, u.email, u.name, u.roles, u.active, u.createdAt,
            (SELECT COUNT(*) FROM session s WHERE s.userId = u.id AND s.expiresAt > UTC_TIMESTAMP(3)) AS activeSessions,
            (SELECT COUNT(*) FROM apikey k WHERE k.referenceId = u.id AND k.enabled = 1) AS apiKeys,
            (SELECT f.lockedUntil FROM sign_in_failure f WHERE f.email = LOWER(u.email) AND f.lockedUntil > UTC_TIMESTAMP(3)) AS lockedUntil
       FROM \`user\` u ORDER BY u.email`,
    { type: QueryTypes.SELECT },
  );
  return rows.map((r: any) => ({
    id: r.id,
    email: r.email,
    name: r.name,
    roles: parseRoles(r.roles),
    active: !!Number(r.active),
    createdAt: new Date(r.createdAt).toISOString(),
    lockedUntil: r.lockedUntil ? new Date(r.lockedUntil).toISOString() : null,
    activeSessions: Number(r.activeSessions),
    apiKeys: Number(r.apiKeys),
  }));
}

async function lockUser(id: string, t: Transaction) {
  const [u] = await getSequelize().query<any>('SELECT id, email, name, roles, active FROM `user` WHERE id = ? FOR UPDATE', {
    replacements: [id],
    type: QueryTypes.SELECT,
    transaction: t,
  });
  if (!u) throw new HttpError(404, 'not_found', 'No such user');
  return { ...u, roles: parseRoles(u.roles), active: !!Number(u.active) } as { id: string; email: string; name: string; roles: Role[]; active: boolean };
}

async function countOtherActiveAdmins(exceptId: string, t: Transaction): Promise<number> {
  const rows = await getSequelize().query<any>("SELECT id, roles FROM `user` WHERE active = 1 AND id <> ?", { replacements: [exceptId], type: QueryTypes.SELECT, transaction: t });
  return rows.filter((r: any) => parseRoles(r.roles).includes('admin')).length;
}

/** Change roles and/or the active flag of one user. */
export async function updateUser(id: string, change: { roles?: Role[]; active?: boolean }, actor: Actor) {
  const sequelize = getSequelize();
  return sequelize.transaction(async (t) => {
    const u = await lockUser(id, t);
    const now = new Date();
    if (change.roles) {
      const roles = parseRoles(change.roles);
      if (roles.length === 0) throw new HttpError(400, 'invalid_input', 'roles: a user needs at least one role');
      const before = u.roles;
      const changed = before.join(',') !== roles.join(',');
      if (changed) {
        if (before.includes('admin') && !roles.includes('admin') && (await countOtherActiveAdmins(id, t)) === 0) {
          throw new HttpError(409, 'last_admin', 'This is the last active admin; give another person the admin role first');
        }
        await sequelize.query('UPDATE `user` SET roles = ?, updatedAt = ? WHERE id = ?', { replacements: [roles.join(','), now, id], type: QueryTypes.UPDATE, transaction: t });
        await appendAudit({ actorId: actor.id, actorEmail: actor.email, action: 'user.roles_changed', targetType: 'user', targetId: id, details: { email: u.email, before, after: roles } }, t);
        u.roles = roles;
      }
    }
    if (change.active !== undefined && change.active !== u.active) {
      if (!change.active) {
        if (id === actor.id) throw new HttpError(409, 'self_deactivation', 'You cannot deactivate your own account');
        if (u.roles.includes('admin') && (await countOtherActiveAdmins(id, t)) === 0) throw new HttpError(409, 'last_admin', 'This is the last active admin');
        await sequelize.query('UPDATE `user` SET active = 0, updatedAt = ? WHERE id = ?', { replacements: [now, id], type: QueryTypes.UPDATE, transaction: t });
        // End sessions and disable keys at once; the resolver also refuses inactive users.
        const sessions: any = await sequelize.query('DELETE FROM session WHERE userId = ?', { replacements: [id], type: QueryTypes.RAW, transaction: t });
        const keys: any = await sequelize.query('UPDATE apikey SET enabled = 0, updatedAt = ? WHERE referenceId = ? AND enabled = 1', { replacements: [now, id], type: QueryTypes.RAW, transaction: t });
        await appendAudit({
          actorId: actor.id, actorEmail: actor.email, action: 'user.deactivated', targetType: 'user', targetId: id,
          details: { email: u.email, sessionsEnded: Number(sessions?.[0]?.affectedRows ?? 0), keysDisabled: Number(keys?.[0]?.affectedRows ?? 0) },
        }, t);
      } else {
        await sequelize.query('UPDATE `user` SET active = 1, updatedAt = ? WHERE id = ?', { replacements: [now, id], type: QueryTypes.UPDATE, transaction: t });
        await appendAudit({ actorId: actor.id, actorEmail: actor.email, action: 'user.reactivated', targetType: 'user', targetId: id, details: { email: u.email, note: 'API keys stay disabled; issue new ones' } }, t);
      }
      u.active = change.active;
    }
    return { id: u.id, email: u.email, name: u.name, roles: u.roles, active: u.active };
  });
}

export interface ApiKeyListItem {
  id: string;
  name: string | null;
  start: string | null;
  userId: string;
  userEmail: string | null;
  userName: string | null;
  enabled: boolean;
  createdAt: string;
  expiresAt: string | null;
  lastRequest: string | null;
}

export async function listApiKeys(): Promise<ApiKeyListItem[]> {
  const rows = await getSequelize().query<any>(
    `SELECT k.id, k.name, k.start, k.referenceId, k.enabled, k.createdAt, k.expiresAt, k.lastRequest, u.email, u.name AS userName
       FROM apikey k LEFT JOIN \`user\` u ON u.id = k.referenceId ORDER BY k.createdAt DESC`,
    { type: QueryTypes.SELECT },
  );
  const iso = (d: any) => (d ? new Date(d).toISOString() : null);
  return rows.map((r: any) => ({
    id: r.id, name: r.name, start: r.start, userId: r.referenceId, userEmail: r.email ?? null, userName: r.userName ?? null,
    enabled: !!Number(r.enabled), createdAt: iso(r.createdAt)!, expiresAt: iso(r.expiresAt), lastRequest: iso(r.lastRequest),
  }));
}

/** Issue a key that acts as `userId` with that user's roles; the secret is returned once and only its hash is kept. */
export async function issueApiKey(input: { userId: string; name: string; expiresInDays?: number | null }, actor: Actor) {
  const [u] = await getSequelize().query<any>('SELECT id, email, active FROM `user` WHERE id = ?', { replacements: [input.userId], type: QueryTypes.SELECT });
  if (!u) throw new HttpError(404, 'not_found', 'No such user');
  if (!Number(u.active)) throw new HttpError(409, 'user_inactive', 'The user is deactivated; reactivate them first');
  const created: any = await getAuth().api.createApiKey({
    body: { userId: input.userId, name: input.name, expiresIn: input.expiresInDays ? input.expiresInDays * 86400 : null },
  });
  await appendAudit({
    actorId: actor.id, actorEmail: actor.email, action: 'apikey.issued', targetType: 'apikey', targetId: created.id,
    details: { name: input.name, userId: u.id, userEmail: u.email, start: created.start ?? null, expiresAt: created.expiresAt ?? null },
  });
  return { id: String(created.id), key: String(created.key), name: created.name, start: created.start ?? null, userId: u.id, expiresAt: created.expiresAt ?? null };
}

export async function revokeApiKey(id: string, actor: Actor) {
  const sequelize = getSequelize();
  return sequelize.transaction(async (t) => {
    const [k] = await sequelize.query<any>('SELECT k.id, k.name, k.referenceId, u.email FROM apikey k LEFT JOIN `user` u ON u.id = k.referenceId WHERE k.id = ? FOR UPDATE', {
      replacements: [id],
      type: QueryTypes.SELECT,
      transaction: t,
    });
    if (!k) throw new HttpError(404, 'not_found', 'No such API key');
    await sequelize.query('DELETE FROM apikey WHERE id = ?', { replacements: [id], type: QueryTypes.DELETE, transaction: t });
    await appendAudit({ actorId: actor.id, actorEmail: actor.email, action: 'apikey.revoked', targetType: 'apikey', targetId: id, details: { name: k.name, userId: k.referenceId, userEmail: k.email ?? null } }, t);
    return { id };
  });
}
