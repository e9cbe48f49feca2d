// better-auth's server configuration: e-mail and password, sessions and API
// keys in MariaDB through our Sequelize adapter, the rate limit stored in the
// database, the account lockout around the sign-in route, and the resolver
// that turns a request into a Principal for the middleware.
import { betterAuth } from 'better-auth';
import { APIError } from 'better-auth/api';
import { apiKey } from '@better-auth/api-key';
import { QueryTypes } from 'sequelize';
import { getConfig, getSecret, type AppConfig } from './config';
import { sequelizeAdapter } from './db/auth-adapter';
import { getSequelize } from './db/sequelize';
import { parseRoles } from './roles';
import { setPrincipalResolver, type Principal } from './principal';
import { sendMail } from './mail';
import { passwordResetMail } from './mail/templates';
import { apiError } from './http';
import { clearSignInFailures, lockedUntil, normalizeEmail, recordSignInFailure } from './lockout';
import { appendAudit } from './audit';

export const MIN_PASSWORD_LENGTH = 12;
export const MAX_PASSWORD_LENGTH = 256;
/**
 * Sign-ins per minute from one client address (better-auth's database-stored
 * limit). A lab's people often share one address, so it is generous; the
 * per-account lockout is the guard against guessing. SIGN_IN_RATE_LIMIT
 * overrides it (the browser tests, which all sign in from 127.0.0.1, raise it).
 */
export const SIGN_INS_PER_MINUTE = Math.max(30, Number(process.env.SIGN_IN_RATE_LIMIT) || 60);
/** Set by scripts/serve.ts from the socket, overwriting what a client sent. */
export const CLIENT_ADDRESS_HEADER = 'x-ionotheca-client-address';
export const API_KEY_HEADER = 'x-api-key';

export function trustedOrigins(cfg: AppConfig = getConfig()): string[] {
  return [...new Set([cfg.publicOrigin.replace(/\/$/, ''), `http://127.0.0.1:${cfg.port}`, `http://localhost:${cfg.port}`])];
}

function createAuth() {
  const cfg = getConfig();
  const secure = cfg.publicOrigin.startsWith('https://');
  return betterAuth({
    appName: 'Ionotheca',
    baseURL: cfg.publicOrigin,
    basePath: '/api/auth',
    secret: getSecret('AUTH_SECRET', cfg),
    trustedOrigins: trustedOrigins(cfg),
    database: sequelizeAdapter(),
    emailAndPassword: {
      enabled: true,
      // People join by invitation only (src/lib/invitations.ts).
      disableSignUp: true,
      minPasswordLength: MIN_PASSWORD_LENGTH,
      maxPasswordLength: MAX_PASSWORD_LENGTH,
      autoSignIn: false,
      resetPasswordTokenExpiresIn: 3600,
      revokeSessionsOnPasswordReset: true,
      sendResetPassword: async ({ user, token }) => {
        const url = `${cfg.publicOrigin.replace(/\/$/, '')}/reset-password?token=${encodeURIComponent(token)}`;
        await sendMail({ to: user.email, ...passwordResetMail({ url, name: user.name }) });
      },
      onPasswordReset: async ({ user }) => {
        await clearSignInFailures(user.email);
        await appendAudit({ actorId: user.id, actorEmail: user.email, action: 'user.password_reset', targetType: 'user', targetId: user.id });
      },
    },
    user: {
      additionalFields: {
        roles: { type: 'string', required: false, defaultValue: 'viewer', input: false },
        active: { type: 'boolean', required: false, defaultValue: true, input: false },
      },
    },
    session: {
      expiresIn: 60 * 60 * 12,
      updateAge: 60 * 60,
      // No cookie cache: every request reads the session row, so a revoked
      // session or a deactivated user stops working at once.
      cookieCache: { enabled: false },
    },
    rateLimit: {
      enabled: true,
      storage: 'database',
      modelName: 'rateLimit',
      window: 60,
      max: 600,
      customRules: {
        '/sign-in/email': { window: 60, max: SIGN_INS_PER_MINUTE },
        '/request-password-reset': { window: 60, max: 10 },
        '/reset-password': { window: 60, max: 20 },
      },
    },
    advanced: {
      // better-auth turns its own Origin check off when NODE_ENV is "test"
      // (vitest sets it, and the e2e server inherits it): keep it on always,
      // so the tests see the origin rules production has.
      disableOriginCheck: false,
      useSecureCookies: secure,
      defaultCookieAttributes: { httpOnly: true, sameSite: 'lax', secure, path: '/' },
      ipAddress: { ipAddressHeaders: [CLIENT_ADDRESS_HEADER] },
    },
    databaseHooks: {
      session: {
        create: {
          before: async (session) => {
            const [u] = await getSequelize().query<{ active: number }>('SELECT active FROM `user` WHERE id = ?', {
              replacements: [session.userId],
              type: QueryTypes.SELECT,
            });
            if (!u || !Number(u.active)) throw new APIError('FORBIDDEN', { message: 'This account is deactivated', code: 'ACCOUNT_DEACTIVATED' });
            return { data: session };
          },
        },
      },
    },
    plugins: [
      apiKey({
        apiKeyHeaders: [API_KEY_HEADER],
        defaultPrefix: 'ion_',
        requireName: true,
        maximumNameLength: 80,
        // Instruments and scripts call often; limits belong to the routes, not the key.
        rateLimit: { enabled: false },
        keyExpiration: { defaultExpiresIn: null, minExpiresIn: 1, maxExpiresIn: 730 },
      }),
    ],
  });
}

export type Auth = ReturnType<typeof createAuth>;
let instance: Auth | null = null;

export function getAuth(): Auth {
  if (!instance) instance = createAuth();
  return instance;
}

/** The key a request carries: `Authorization: Bearer <key>` or the plugin's header. */
export function apiKeyFrom(headers: Headers): string | null {
  const h = headers.get(API_KEY_HEADER);
  if (h && h.trim()) return h.trim();
  const a = headers.get('authorization');
  const m = a?.match(/^Bearer\s+(\S+)\s*$/i);
  return m ? m[1] : null;
}

interface UserRow {
  id: string;
  email: string;
  name: string;
  roles: string;
  active: number | boolean;
}

async function loadUser(id: string): Promise<UserRow | null> {
  const [u] = await getSequelize().query<UserRow>('SELECT id, email, name, roles, active FROM `user` WHERE id = ?', {
    replacements: [id],
    type: QueryTypes.SELECT,
  });
  return u ?? null;
}

function principalUser(u: UserRow): Principal['user'] {
  return { id: u.id, email: u.email, name: u.name, roles: parseRoles(u.roles) };
}

/** Session cookie or API key → who is calling; deactivated users resolve to null. */
export async function resolveRequestPrincipal(request: Request): Promise<Principal | null> {
  const auth = getAuth();
  const key = apiKeyFrom(request.headers);
  if (key) {
    const r: any = await auth.api.verifyApiKey({ body: { key } });
    if (!r?.valid || !r.key) return null;
    const u = await loadUser(r.key.referenceId ?? r.key.userId);
    if (!u || !Number(u.active)) return null;
    return { user: principalUser(u), session: null, apiKeyId: String(r.key.id) };
  }
  const cookie = request.headers.get('cookie');
  if (!cookie || !cookie.includes('session_token')) return null;
  const s: any = await auth.api.getSession({ headers: request.headers });
  if (!s?.session || !s.user) return null;
  // Roles and the active flag are read fresh from the user row on every request.
  const u = await loadUser(s.user.id);
  if (!u || !Number(u.active)) return null;
  return { user: principalUser(u), session: { id: String(s.session.id), expiresAt: new Date(s.session.expiresAt) }, apiKeyId: null };
}

setPrincipalResolver(resolveRequestPrincipal);

/** better-auth's routes that are reachable over HTTP; everything else under /api/auth answers 404. */
const EXPOSED = [
  /^\/sign-in\/email$/,
  /^\/sign-out$/,
  /^\/get-session$/,
  /^\/request-password-reset$/,
  /^\/reset-password$/,
  /^\/ok$/,
  /^\/error$/,
];

/** A copy of the request with the client address in our header (from Astro's clientAddress when the server did not set it). */
function withClientAddress(request: Request, clientAddress: string | undefined, body: BodyInit | null): Request {
  const headers = new Headers(request.headers);
  if (!headers.get(CLIENT_ADDRESS_HEADER) && clientAddress) headers.set(CLIENT_ADDRESS_HEADER, clientAddress);
  return new Request(request.url, { method: request.method, headers, body, redirect: 'manual' });
}

const LOCKED_MESSAGE = 'Too many failed sign-ins for this address. Try again in 15 minutes, or ask an administrator to clear the lock.';

/** The handler behind /api/auth/*: better-auth's own, with the account lockout around e-mail sign-in. */
export async function handleAuthRequest(request: Request, clientAddress?: string): Promise<Response> {
  const url = new URL(request.url);
  const sub = url.pathname.replace(/^\/api\/auth/, '') || '/';
  if (!EXPOSED.some((r) => r.test(sub))) return apiError(404, 'not_found', `No such route: ${request.method} ${url.pathname}`);
  const hasBody = request.method !== 'GET' && request.method !== 'HEAD';
  const raw = hasBody ? await request.text() : null;
  const req = withClientAddress(request, clientAddress, raw);
  if (!(request.method === 'POST' && sub === '/sign-in/email')) return getAuth().handler(req);

  let email = '';
  try {
    email = normalizeEmail(JSON.parse(raw || '{}')?.email ?? '');
  } catch {
    /* better-auth answers the malformed body */
  }
  if (email && (await lockedUntil(email))) {
    return new Response(JSON.stringify({ code: 'TOO_MANY_ATTEMPTS', message: LOCKED_MESSAGE, error: { code: 'too_many_attempts', message: LOCKED_MESSAGE } }), {
      status: 429,
      headers: { 'content-type': 'application/json; charset=utf-8', 'retry-after': String(15 * 60), 'cache-control': 'no-store' },
    });
  }
  const res = await getAuth().handler(req);
  if (email) {
    if (res.status === 401) await recordSignInFailure(email, req.headers.get(CLIENT_ADDRESS_HEADER));
    else if (res.ok) await clearSignInFailures(email);
  }
  return res;
}

/** End the session the request carries; returns the Set-Cookie headers that clear it. */
export async function signOutRequest(request: Request): Promise<string[]> {
  const res = await getAuth().api.signOut({ headers: request.headers, asResponse: true });
  return res.headers.getSetCookie?.() ?? [];
}
