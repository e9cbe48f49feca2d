// Invitations by e-mail: an admin invites an address with roles; the mail
// carries a link with a random token (only its SHA-256 is stored) that
// expires and works once; accepting it creates the user with a better-auth
// credential account and the invited roles.
import crypto from 'node:crypto';
import { QueryTypes } from 'sequelize';
import { hashPassword } from 'better-auth/crypto';
import { getSequelize } from './db/sequelize';
import { getConfig } from './config';
import { appendAudit } from './audit';
import { HttpError } from './http';
import { parseRoles, type Role } from './roles';
import { sendMail } from './mail';
import { invitationMail } from './mail/templates';
import { MAX_PASSWORD_LENGTH, MIN_PASSWORD_LENGTH } from './auth';
import type { Actor } from './accounts';

export const INVITATION_TTL_MS = 72 * 3600 * 1000;

const sha256 = (s: string) => crypto.createHash('sha256').update(s).digest('hex');

export interface InvitationListItem {
  id: number;
  email: string;
  name: string | null;
  roles: Role[];
  status: 'pending' | 'expired' | 'accepted';
  expiresAt: string;
  usedAt: string | null;
  createdAt: string;
  invitedBy: string | null;
}

function status(r: { usedAt: Date | null; expiresAt: Date }, now = new Date()): InvitationListItem['status'] {
  if (r.usedAt) return 'accepted';
  return new Date(r.expiresAt) <= now ? 'expired' : 'pending';
}

export async function listInvitations(): Promise<InvitationListItem[]> {
  const rows = await getSequelize().query<any>(
    'SELECT i.*, u.email AS inviterEmail FROM invitation i LEFT JOIN `user` u ON u.id = i.invitedBy ORDER BY i.createdAt DESC',
    { type: QueryTypes.SELECT },
  );
  return rows.map((r: any) => ({
    id: Number(r.id), email: r.email, name: r.name, roles: parseRoles(r.roles), status: status(r),
    expiresAt: new Date(r.expiresAt).toISOString(), usedAt: r.usedAt ? new Date(r.usedAt).toISOString() : null,
    createdAt: new Date(r.createdAt).toISOString(), invitedBy: r.inviterEmail ?? null,
  }));
}

function invitationUrl(token: string) {
  return `${getConfig().publicOrigin.replace(/\/$/, '')}/accept-invitation?token=${encodeURIComponent(token)}`;
}

async function mailInvitation(email: string, roles: Role[], token: string, expiresAt: Date, actor: Actor) {
  await sendMail({ to: email, ...invitationMail({ url: invitationUrl(token), roles, invitedBy: actor.email, expiresAt }) });
}

export async function createInvitation(input: { email: string; name?: string | null; roles: Role[] }, actor: Actor) {
  const email = input.email.trim().toLowerCase();
  const roles = parseRoles(input.roles);
  if (!roles.length) throw new HttpError(400, 'invalid_input', 'roles: choose at least one role');
  const sequelize = getSequelize();
  const [existing] = await sequelize.query<any>('SELECT id FROM `user` WHERE LOWER(email) = ?', { replacements: [email], type: QueryTypes.SELECT });
  if (existing) throw new HttpError(409, 'user_exists', `${email} already has an account`);
  const token = crypto.randomBytes(32).toString('base64url');
  const now = new Date();
  const expiresAt = new Date(now.getTime() + INVITATION_TTL_MS);
  const id = await sequelize.transaction(async (t) => {
    // A new invitation replaces any pending one for the same address.
    await sequelize.query('UPDATE invitation SET expiresAt = ?, updatedAt = ? WHERE email = ? AND usedAt IS NULL AND expiresAt > ?', {
      replacements: [now, now, email, now], type: QueryTypes.UPDATE, transaction: t,
    });
    const [insertId] = await sequelize.query(
      'INSERT INTO invitation (email, name, roles, tokenHash, expiresAt, usedAt, invitedBy, createdAt, updatedAt) VALUES (?,?,?,?,?,NULL,?,?,?)',
      { replacements: [email, input.name?.trim() || null, roles.join(','), sha256(token), expiresAt, actor.id, now, now], type: QueryTypes.INSERT, transaction: t },
    );
    await appendAudit({ actorId: actor.id, actorEmail: actor.email, action: 'invitation.sent', targetType: 'invitation', targetId: Number(insertId), details: { email, roles, expiresAt: expiresAt.toISOString() } }, t);
    return Number(insertId);
  });
  await mailInvitation(email, roles, token, expiresAt, actor);
  return { id, email, roles, expiresAt: expiresAt.toISOString() };
}

/** A fresh link (the old one stops working) and a fresh expiry. */
export async function resendInvitation(id: number, actor: Actor) {
  const sequelize = getSequelize();
  const token = crypto.randomBytes(32).toString('base64url');
  const now = new Date();
  const expiresAt = new Date(now.getTime() + INVITATION_TTL_MS);
  const inv = await sequelize.transaction(async (t) => {
    const [r] = await sequelize.query<any>('SELECT * FROM invitation WHERE id = ? FOR UPDATE', { replacements: [id], type: QueryTypes.SELECT, transaction: t });
    if (!r) throw new HttpError(404, 'not_found', 'No such invitation');
    if (r.usedAt) throw new HttpError(409, 'already_accepted', 'This invitation has already been accepted');
    await sequelize.query('UPDATE invitation SET tokenHash = ?, expiresAt = ?, updatedAt = ? WHERE id = ?', { replacements: [sha256(token), expiresAt, now, id], type: QueryTypes.UPDATE, transaction: t });
    await appendAudit({ actorId: actor.id, actorEmail: actor.email, action: 'invitation.resent', targetType: 'invitation', targetId: id, details: { email: r.email, expiresAt: expiresAt.toISOString() } }, t);
    return r;
  });
  await mailInvitation(inv.email, parseRoles(inv.roles), token, expiresAt, actor);
  return { id, email: inv.email as string, expiresAt: expiresAt.toISOString() };
}

/** What a token stands for, for the acceptance page (null when unknown, used or expired). */
export async function peekInvitation(token: string): Promise<{ email: string; name: string | null; roles: Role[] } | null> {
  if (!token) return null;
  const [r] = await getSequelize().query<any>('SELECT email, name, roles, expiresAt, usedAt FROM invitation WHERE tokenHash = ?', {
    replacements: [sha256(token)], type: QueryTypes.SELECT,
  });
  if (!r || r.usedAt || new Date(r.expiresAt) <= new Date()) return null;
  return { email: r.email, name: r.name, roles: parseRoles(r.roles) };
}

/** Accept: create the user and its credential account; the link works once. */
export async function acceptInvitation(input: { token: string; name?: string | null; password: string }) {
  if (input.password.length < MIN_PASSWORD_LENGTH) throw new HttpError(400, 'password_too_short', `The password needs at least ${MIN_PASSWORD_LENGTH} characters`);
  if (input.password.length > MAX_PASSWORD_LENGTH) throw new HttpError(400, 'password_too_long', `The password may have at most ${MAX_PASSWORD_LENGTH} characters`);
  const sequelize = getSequelize();
  const hash = await hashPassword(input.password);
  return sequelize.transaction(async (t) => {
    const [r] = await sequelize.query<any>('SELECT * FROM invitation WHERE tokenHash = ? FOR UPDATE', { replacements: [sha256(input.token)], type: QueryTypes.SELECT, transaction: t });
    const now = new Date();
    if (!r || r.usedAt || new Date(r.expiresAt) <= now) throw new HttpError(410, 'invitation_invalid', 'This invitation link has expired or has already been used. Ask your administrator for a new one.');
    const [existing] = await sequelize.query<any>('SELECT id FROM `user` WHERE LOWER(email) = ?', { replacements: [r.email], type: QueryTypes.SELECT, transaction: t });
    if (existing) throw new HttpError(409, 'user_exists', `${r.email} already has an account`);
    const userId = crypto.randomUUID();
    const name = input.name?.trim() || r.name || r.email.split('@')[0];
    await sequelize.query('INSERT INTO `user` (id, name, email, emailVerified, image, roles, active, createdAt, updatedAt) VALUES (?,?,?,1,NULL,?,1,?,?)', {
      replacements: [userId, name, r.email, r.roles, now, now], type: QueryTypes.INSERT, transaction: t,
    });
    await sequelize.query("INSERT INTO account (id, accountId, providerId, userId, password, createdAt, updatedAt) VALUES (?,?,'credential',?,?,?,?)", {
      replacements: [crypto.randomUUID(), userId, userId, hash, now, now], type: QueryTypes.INSERT, transaction: t,
    });
    await sequelize.query('UPDATE invitation SET usedAt = ?, updatedAt = ? WHERE id = ?', { replacements: [now, now, r.id], type: QueryTypes.UPDATE, transaction: t });
    await appendAudit({ actorId: userId, actorEmail: r.email, action: 'invitation.accepted', targetType: 'user', targetId: userId, details: { invitationId: Number(r.id), roles: parseRoles(r.roles) } }, t);
    return { userId, email: r.email as string, roles: parseRoles(r.roles) };
  });
}
