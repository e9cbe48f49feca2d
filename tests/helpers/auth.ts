// HTTP helpers for the e2e tests: sign in through better-auth's route, call
// the API with a session cookie or an API key, read the local mailbox.
import { inject } from 'vitest';

export const DEMO_PASSWORD = 'ionotheca-demo';
export const DEMO_USERS = ['admin', 'curator', 'curator2', 'analyst', 'viewer', 'auditor'] as const;
export const demoEmail = (who: string) => `${who}@demo.ionotheca.test`;

export function base(): string {
  return inject('baseUrl');
}

/** Sign in with e-mail and password; returns the status and, on success, the Cookie header value. */
export async function signIn(email: string, password = DEMO_PASSWORD): Promise<{ status: number; cookie: string | null; body: any }> {
  const res = await fetch(`${base()}/api/auth/sign-in/email`, {
    method: 'POST',
    headers: { 'content-type': 'application/json', origin: base() },
    body: JSON.stringify({ email, password }),
  });
  const body = await res.json().catch(() => null);
  const cookie = res.headers.getSetCookie().map((c) => c.split(';')[0]).filter((c) => c.includes('session_token')).join('; ') || null;
  return { status: res.status, cookie, body };
}

export async function sessionFor(who: string): Promise<string> {
  const r = await signIn(demoEmail(who));
  if (r.status !== 200 || !r.cookie) throw new Error(`sign-in of ${who} failed: ${r.status} ${JSON.stringify(r.body)}`);
  return r.cookie;
}

export type Credential = { cookie: string } | { key: string } | null;

export async function call(cred: Credential, method: string, path: string, body?: unknown, raw?: string): Promise<Response> {
  const headers: Record<string, string> = {};
  if (cred && 'cookie' in cred) {
    headers.cookie = cred.cookie;
    headers.origin = base();
  }
  if (cred && 'key' in cred) headers.authorization = `Bearer ${cred.key}`;
  let payload: string | undefined;
  // Astro refuses a body-less write without Origin or Content-Type (its origin check); API clients send a content type.
  if (!(cred && 'cookie' in cred) && method !== 'GET' && method !== 'HEAD') headers['content-type'] = 'application/json';
  if (raw !== undefined) {
    headers['content-type'] = 'application/json';
    payload = raw;
  } else if (body !== undefined) {
    headers['content-type'] = 'application/json';
    payload = JSON.stringify(body);
  }
  return fetch(`${base()}${path}`, { method, headers, body: payload, redirect: 'manual' });
}

export async function callJson(cred: Credential, method: string, path: string, body?: unknown): Promise<{ status: number; body: any }> {
  const r = await call(cred, method, path, body);
  return { status: r.status, body: await r.json().catch(() => null) };
}

/** Users by e-mail, as the admin API lists them. */
export async function usersByEmail(adminCookie: string): Promise<Map<string, { id: string; roles: string[] }>> {
  const r = await callJson({ cookie: adminCookie }, 'GET', '/api/admin/users');
  if (r.status !== 200) throw new Error(`listing users failed: ${r.status}`);
  return new Map(r.body.items.map((u: any) => [u.email, { id: u.id, roles: u.roles }]));
}

export async function issueKey(adminCookie: string, userId: string, name: string): Promise<{ id: string; key: string }> {
  const r = await callJson({ cookie: adminCookie }, 'POST', '/api/admin/api-keys', { userId, name });
  if (r.status !== 201) throw new Error(`issuing a key failed: ${r.status} ${JSON.stringify(r.body)}`);
  return { id: r.body.apiKey.id, key: r.body.apiKey.key };
}

/** The newest captured message to an address, waiting a little for delivery. */
export async function latestMail(adminCookie: string, to: string, { after = 0, timeoutMs = 10_000 } = {}): Promise<{ id: number; subject: string; text: string }> {
  const end = Date.now() + timeoutMs;
  for (;;) {
    const r = await callJson({ cookie: adminCookie }, 'GET', `/api/admin/mail?to=${encodeURIComponent(to)}&limit=5`);
    const m = r.body?.items?.find((x: any) => x.id > after);
    if (m) return m;
    if (Date.now() > end) throw new Error(`no mail to ${to} arrived (last answer ${r.status})`);
    await new Promise((res) => setTimeout(res, 200));
  }
}

export function linkIn(text: string, path: string): string {
  const m = text.match(new RegExp(`https?://\\S+${path.replace(/[/]/g, '\\/')}\\?token=[A-Za-z0-9_%-]+`));
  if (!m) throw new Error(`no ${path} link in the message:\n${text}`);
  return m[0];
}
