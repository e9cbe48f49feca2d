// Sessions and origin (issue 9, item 2): a cross-origin write with a valid
// session cookie is refused and changes nothing; the session cookie is
// HttpOnly and SameSite and invisible to page scripts; a deactivated user is
// refused on the very next request (session and API key); an API key reaches
// admin routes only while its owner is an admin.
import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import type { Browser } from 'playwright-core';
import { launchBrowser } from '../helpers/browser';
import { base, demoEmail, latestMail, linkIn, sessionFor, usersByEmail, issueKey, DEMO_PASSWORD } from '../helpers/auth';
import { call, signIn, uploadFiles } from '../../scripts/reliability/lib/client';
import { runFile } from '../../scripts/reliability/lib/jcamp';

const EVIL = 'http://evil.example';
let browser: Browser;
let admin: string;
let curator: string;
const fresh = { email: `sessions.${Date.now()}@lab.example`, password: 'sessions test password 1', id: '' };

/** Invite a new person through the admin API and accept through the mailed link. */
async function inviteAndAccept(email: string, password: string, roles: string[]) {
  const inv = await call(base(), '/api/admin/invitations', { cookie: admin, json: { email, name: 'Sessions Tester', roles } });
  expect(inv.status).toBe(201);
  const mail = await latestMail(admin, email);
  const token = decodeURIComponent(new URL(linkIn(mail.text, '/accept-invitation')).searchParams.get('token')!);
  const acc = await call(base(), '/api/invitations/accept', { json: { token, password }, origin: null });
  expect(acc.status).toBe(200);
  const users = await usersByEmail(admin);
  return users.get(email)!.id;
}

beforeAll(async () => {
  browser = await launchBrowser();
  admin = await sessionFor('admin');
  curator = await sessionFor('curator');
  fresh.id = await inviteAndAccept(fresh.email, fresh.password, ['curator']);
});
afterAll(async () => {
  await browser?.close();
});

describe('session cookie', () => {
  it('is HttpOnly, SameSite and path-wide, and page scripts cannot read it', async () => {
    // signed in through the browser context's own request API: the cookie
    // lands in the browser's jar with the attributes the server gave it
    const ctx = await browser.newContext();
    const r = await ctx.request.post(`${base()}/api/auth/sign-in/email`, { data: { email: demoEmail('analyst'), password: DEMO_PASSWORD }, headers: { origin: base() } });
    expect(r.status()).toBe(200);
    const session = r.headersArray().filter((h) => h.name.toLowerCase() === 'set-cookie').map((h) => h.value).find((c) => /session_token=/.test(c));
    expect(session).toBeDefined();
    expect(session).toMatch(/;\s*HttpOnly/i);
    expect(session).toMatch(/;\s*SameSite=(Lax|Strict)/i);
    expect(session).toMatch(/;\s*Path=\//i);

    const c = (await ctx.cookies()).find((x) => x.name.includes('session_token'));
    expect(c?.httpOnly).toBe(true);
    expect(['Lax', 'Strict']).toContain(c?.sameSite);
    const page = await ctx.newPage();
    expect((await page.goto(`${base()}/library`))?.status()).toBe(200);
    expect(new URL(page.url()).pathname).toBe('/library');
    expect(await page.evaluate(() => document.cookie)).not.toContain('session_token');
    await ctx.close();
  });
});

describe('cross-origin writes with a valid session cookie', () => {
  it('are refused on every kind of write and change nothing', async () => {
    const users = await usersByEmail(admin);
    const viewer = users.get(demoEmail('viewer'))!;
    const drafts = await call(base(), '/api/spectra?status=draft&pageSize=1', { cookie: curator });
    const draftId = drafts.body.items[0].id;
    const before = await call(base(), `/api/spectra/${draftId}`, { cookie: curator });
    const invitationsBefore = (await call(base(), '/api/admin/invitations', { cookie: admin })).body.total;
    const victim = `csrf.${Date.now()}@lab.example`;

    const writes: [string, string, string, unknown][] = [
      [curator, 'POST', '/api/search', { peaks: [[43, 999], [57, 400]] }],
      [curator, 'PATCH', `/api/spectra/${draftId}`, { notes: 'changed cross-site', baseVersion: before.body.version }],
      [curator, 'POST', `/api/spectra/${draftId}/review`, { action: 'submit' }],
      [admin, 'POST', '/api/admin/invitations', { email: victim, roles: ['admin'] }],
      [admin, 'PATCH', `/api/admin/users/${viewer.id}`, { roles: ['viewer', 'admin'] }],
      [admin, 'POST', '/api/admin/api-keys', { userId: viewer.id, name: 'cross-site key' }],
      [curator, 'POST', '/api/reports', { title: 'cross-site' }],
    ];
    for (const origin of [EVIL, 'null', null] as const) {
      for (const [cookie, method, path, json] of writes) {
        const r = await call(base(), path, { cookie, method, json, origin });
        expect(r.status, `${method} ${path} with Origin ${origin}`).toBe(403);
      }
      // a form post and a plain-text body, the kinds a foreign page can send without CORS
      const form = await call(base(), '/api/admin/invitations', {
        cookie: admin, method: 'POST', origin, body: `email=${encodeURIComponent(victim)}&roles=admin`, headers: { 'content-type': 'application/x-www-form-urlencoded' },
      });
      expect(form.status).toBe(403);
      const plain = await call(base(), '/api/search', { cookie: curator, method: 'POST', origin, body: '{"peaks":[[43,999]]}', headers: { 'content-type': 'text/plain' } });
      expect(plain.status).toBe(403);
      const upload = await call(base(), '/api/imports', {
        cookie: curator, method: 'POST', origin,
        body: (() => {
          const f = new FormData();
          const file = runFile('csrf', 1, 99);
          f.append('files', new Blob([file.text]), file.name);
          return f;
        })(),
      });
      expect(upload.status, `upload with Origin ${origin}`).toBe(403);
      const out = await call(base(), '/api/auth/sign-out', { cookie: curator, json: {}, origin });
      expect(out.status, `sign-out with Origin ${origin}`).toBe(403);
    }

    // nothing changed
    const after = await call(base(), `/api/spectra/${draftId}`, { cookie: curator });
    expect(after.body.version).toBe(before.body.version);
    expect(after.body.status).toBe(before.body.status);
    expect(after.body.metadata?.notes ?? null).toBe(before.body.metadata?.notes ?? null);
    expect((await call(base(), '/api/admin/invitations', { cookie: admin })).body.total).toBe(invitationsBefore);
    expect((await usersByEmail(admin)).get(demoEmail('viewer'))!.roles).toEqual(viewer.roles);
    const csrfFiles = await call(base(), '/api/spectra?q=csrf%20compound', { cookie: curator });
    expect(csrfFiles.body.items.filter((x: any) => x.name.startsWith('csrf compound'))).toEqual([]);

    // the same requests from our own origin work, and the sessions are still alive
    expect((await call(base(), '/api/search', { cookie: curator, json: { peaks: [[43, 999], [57, 400]] } })).status).toBe(200);
    expect((await call(base(), '/api/me', { cookie: curator })).status).toBe(200);
    expect((await call(base(), '/api/me', { cookie: admin })).status).toBe(200);
  });
});

describe('deactivation and API keys', () => {
  it('an API key reaches admin routes only when its owner is an admin, and only while they are', async () => {
    const users = await usersByEmail(admin);
    for (const who of ['viewer', 'analyst', 'curator', 'auditor']) {
      const { key } = await issueKey(admin, users.get(demoEmail(who))!.id, `sessions test ${who}`);
      for (const [method, path, json] of [
        ['GET', '/api/admin/users', undefined],
        ['GET', '/api/admin/api-keys', undefined],
        ['POST', '/api/admin/api-keys', { userId: users.get(demoEmail(who))!.id, name: 'self-issued' }],
        ['POST', '/api/admin/invitations', { email: `escalate.${who}@lab.example`, roles: ['admin'] }],
        ['PATCH', `/api/admin/users/${users.get(demoEmail(who))!.id}`, { roles: ['admin'] }],
        ['GET', '/api/admin/settings', undefined],
        ['GET', '/api/admin/mail', undefined],
      ] as const) {
        const r = await call(base(), path, { apiKey: key, method, json });
        expect(r.status, `${who} key: ${method} ${path}`).toBe(403);
      }
      // the audit trail needs "audit", which auditors have
      expect((await call(base(), '/api/admin/audit?pageSize=1', { apiKey: key })).status).toBe(who === 'auditor' ? 200 : 403);
    }
    expect((await usersByEmail(admin)).get(demoEmail('viewer'))!.roles).toEqual(['viewer']);

    // the fresh user: admin for a moment, then not
    const { key } = await issueKey(admin, fresh.id, 'sessions test fresh');
    expect((await call(base(), '/api/admin/users', { apiKey: key })).status).toBe(403);
    expect((await call(base(), `/api/admin/users/${fresh.id}`, { cookie: admin, method: 'PATCH', json: { roles: ['curator', 'admin'] } })).status).toBe(200);
    expect((await call(base(), '/api/admin/users', { apiKey: key })).status).toBe(200);
    expect((await call(base(), '/api/admin/users', { headers: { 'x-api-key': key } })).status).toBe(200);
    expect((await call(base(), `/api/admin/users/${fresh.id}`, { cookie: admin, method: 'PATCH', json: { roles: ['curator'] } })).status).toBe(200);
    expect((await call(base(), '/api/admin/users', { apiKey: key })).status).toBe(403);
    expect((await call(base(), '/api/spectra?pageSize=1', { apiKey: key })).status).toBe(200);
  });

  it('a deactivated user is refused on the next request, by session and by key, and cannot sign in', async () => {
    const s = await signIn(base(), fresh.email, fresh.password);
    expect(s.status).toBe(200);
    const cookie = s.cookie;
    const { key } = await issueKey(admin, fresh.id, 'sessions test before deactivation');
    expect((await call(base(), '/api/spectra?pageSize=1', { cookie })).status).toBe(200);
    expect((await call(base(), '/api/spectra?pageSize=1', { apiKey: key })).status).toBe(200);
    const ctx = await browser.newContext();
    await ctx.addCookies(cookie.split('; ').map((kv) => ({ name: kv.split('=')[0], value: kv.slice(kv.indexOf('=') + 1), url: base() })));
    const page = await ctx.newPage();
    expect((await page.goto(`${base()}/library`))?.status()).toBe(200);

    const off = await call(base(), `/api/admin/users/${fresh.id}`, { cookie: admin, method: 'PATCH', json: { active: false } });
    expect(off.status).toBe(200);
    expect((await call(base(), '/api/spectra?pageSize=1', { cookie })).status).toBe(401);
    expect((await call(base(), '/api/spectra?pageSize=1', { apiKey: key })).status).toBe(401);
    expect((await call(base(), '/api/me', { cookie })).status).toBe(401);
    const up = await uploadFiles(base(), { cookie }, [runFile('deactivated', 1, 98)]);
    expect(up.status).toBe(401);
    await page.goto(`${base()}/library`);
    expect(new URL(page.url()).pathname).toBe('/sign-in');
    await ctx.close();
    const again = await signIn(base(), fresh.email, fresh.password);
    expect(again.status).not.toBe(200);
    expect(again.cookie).not.toContain('session_token=');
  });
});
