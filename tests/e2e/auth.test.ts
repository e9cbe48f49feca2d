// Sign-in, roles and navigation, sign-out, invitations and password reset
// through the local fake SMTP server, account lockout, shared-address sign-in
// throttling and API-key revocation, against the built server in Chromium.
import { describe, it, expect, beforeAll, afterAll, inject } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import mariadb from 'mariadb';
import { launchBrowser, islandsHydrated, watchPage, screenshot } from '../helpers/browser';
import { can, capabilitiesOf, type Role } from '../../src/lib/roles';
import { base, call, callJson, demoEmail, DEMO_PASSWORD, DEMO_USERS, issueKey, latestMail, linkIn, sessionFor, signIn, usersByEmail } from '../helpers/auth';

let browser: Browser;
let adminCookie: string;

/** The navigation the app shell must show for a set of roles (AppShell.astro's rule). */
function expectedNav(roles: Role[]): string[] {
  const items: [string, Parameters<typeof can>[1]][] = [
    ['Library', 'read'], ['Identify', 'search'], ['Import', 'curate'], ['Review', 'curate'], ['Reports', 'read'], ['Admin', 'admin'], ['Audit trail', 'audit'],
  ];
  return items.filter(([label, cap]) => can(roles, cap) && !(label === 'Audit trail' && can(roles, 'admin'))).map(([label]) => label);
}

async function navLabels(page: Page): Promise<string[]> {
  return (await page.locator('[data-testid=main-nav] a').allTextContents()).map((s) => s.trim());
}

async function signInThroughForm(page: Page, email: string, password: string) {
  await page.goto(`${base()}/sign-in`);
  await page.waitForSelector('[data-testid=sign-in-form]');
  await islandsHydrated(page);
  await page.fill('#email', email);
  await page.fill('#password', password);
  await Promise.all([page.waitForURL((u) => !u.pathname.startsWith('/sign-in'), { timeout: 20_000, waitUntil: 'domcontentloaded' }), page.click('button[type=submit]')]);
}

async function auditEvents(action: string, targetId: string): Promise<any[]> {
  const conn = await mariadb.createConnection({ host: '127.0.0.1', port: inject('serverDbPort'), user: 'root', database: 'ionotheca' });
  try {
    return await conn.query('SELECT action, targetId, details FROM audit_event WHERE action = ? AND targetId = ? ORDER BY id', [action, targetId]);
  } finally {
    await conn.end();
  }
}

async function auditEventsMentioning(action: string, text: string): Promise<any[]> {
  const conn = await mariadb.createConnection({ host: '127.0.0.1', port: inject('serverDbPort'), user: 'root', database: 'ionotheca' });
  try {
    return await conn.query("SELECT action, targetId, details FROM audit_event WHERE action = ? AND JSON_SEARCH(details, 'one', ?) IS NOT NULL", [action, text]);
  } finally {
    await conn.end();
  }
}

beforeAll(async () => {
  browser = await launchBrowser();
  adminCookie = await sessionFor('admin');
});
afterAll(async () => {
  await browser?.close();
});

describe('sign-in page', () => {
  it('loads without console errors and works signed out', async () => {
    const ctx = await browser.newContext();
    const page = await ctx.newPage();
    const problems = watchPage(page);
    const res = await page.goto(`${base()}/sign-in`);
    expect(res?.status()).toBe(200);
    await page.waitForSelector('[data-testid=sign-in-form]');
    await islandsHydrated(page);
    await page.waitForLoadState('networkidle');
    expect(problems.console).toEqual([]);
    expect(problems.pageErrors).toEqual([]);
    await ctx.close();
  });

  it('sends anonymous visitors of a page to sign-in, and API calls get 401 JSON', async () => {
    const r = await fetch(`${base()}/admin`, { redirect: 'manual' });
    expect(r.status).toBe(302);
    expect(r.headers.get('location')).toMatch(/^\/sign-in\?next=%2Fadmin/);
    const api = await fetch(`${base()}/api/me`);
    expect(api.status).toBe(401);
    expect((await api.json()).error.code).toBe('unauthenticated');
  });
});

describe('each demo user', () => {
  for (const who of DEMO_USERS) {
    it(`${who} signs in through the form and sees exactly the navigation their roles allow`, async () => {
      const ctx = await browser.newContext();
      const page = await ctx.newPage();
      await signInThroughForm(page, demoEmail(who), DEMO_PASSWORD);
      const me = await (await page.request.get(`${base()}/api/me`)).json();
      const roles = me.user.roles as Role[];
      expect(roles).toContain(who.replace(/\d+$/, ''));
      expect(me.capabilities.sort()).toEqual([...capabilitiesOf(roles)].sort());
      await page.waitForSelector('[data-testid=main-nav]');
      expect(await navLabels(page)).toEqual(expectedNav(roles));
      // Landed on the role's home page.
      expect(new URL(page.url()).pathname).toBe(me.home);
      await screenshot(page, `auth-home-${who}`);
      await ctx.close();
    });
  }

  it('viewer opening /import gets the 403 page with HTTP status 403', async () => {
    const ctx = await browser.newContext();
    const page = await ctx.newPage();
    await signInThroughForm(page, demoEmail('viewer'), DEMO_PASSWORD);
    const res = await page.goto(`${base()}/import`);
    expect(res?.status()).toBe(403);
    await expect(page.locator('[data-testid=page-403]').count()).resolves.toBe(1);
    const admin = await page.goto(`${base()}/admin`);
    expect(admin?.status()).toBe(403);
    await ctx.close();
  });

  it('signing out ends the session, also for a replayed cookie', async () => {
    const ctx = await browser.newContext();
    const page = await ctx.newPage();
    await signInThroughForm(page, demoEmail('analyst'), DEMO_PASSWORD);
    const cookie = (await ctx.cookies()).filter((c) => c.name.includes('session_token')).map((c) => `${c.name}=${c.value}`).join('; ');
    expect(cookie).not.toBe('');
    const sessionCookie = (await ctx.cookies()).find((c) => c.name.includes('session_token'))!;
    expect(sessionCookie.httpOnly).toBe(true);
    expect(sessionCookie.sameSite).toBe('Lax');
    expect((await call({ cookie }, 'GET', '/api/me')).status).toBe(200);
    await Promise.all([page.waitForURL((u) => u.pathname === '/sign-in'), page.click('[data-testid=sign-out]')]);
    expect((await page.request.get(`${base()}/api/me`)).status()).toBe(401);
    expect((await call({ cookie }, 'GET', '/api/me')).status).toBe(401);
    await ctx.close();
  });

  it('a JSON post with a session cookie from a foreign origin is refused', async () => {
    const r = await fetch(`${base()}/api/admin/lockouts/clear`, {
      method: 'POST',
      headers: { cookie: adminCookie, origin: 'http://evil.example', 'content-type': 'application/json' },
      body: JSON.stringify({ email: 'x@y.z' }),
    });
    expect(r.status).toBe(403);
  });
});

describe('pages that work signed out', () => {
  it('accept-invitation and reset-password open without a session', async () => {
    const ctx = await browser.newContext();
    const page = await ctx.newPage();
    const problems = watchPage(page);
    const a = await page.goto(`${base()}/accept-invitation`);
    expect(a?.status()).toBe(200);
    await page.waitForSelector('[data-testid=invitation-invalid]');
    const b = await page.goto(`${base()}/accept-invitation?token=not-a-real-token-at-all`);
    expect(b?.status()).toBe(200);
    await page.waitForSelector('[data-testid=invitation-invalid]');
    const c = await page.goto(`${base()}/reset-password`);
    expect(c?.status()).toBe(200);
    await page.waitForSelector('[data-testid=request-reset-form]');
    await islandsHydrated(page);
    expect(problems.pageErrors).toEqual([]);
    await ctx.close();
  });
});

describe('invitation and password reset through the local mailbox', () => {
  const email = `new.analyst.${Date.now()}@lab.example`;
  const password = 'a long enough password 1';
  let invitationLink = '';

  it('an admin invites through the users screen; the invitee sets a password and signs in with the new role', async () => {
    const ctx = await browser.newContext();
    const page = await ctx.newPage();
    const problems = watchPage(page);
    await signInThroughForm(page, demoEmail('admin'), DEMO_PASSWORD);
    await page.goto(`${base()}/admin`);
    await page.waitForSelector('[data-testid=users-table] [data-testid=user-row]');
    await islandsHydrated(page);
    await page.fill('#invite-email', email);
    await page.fill('#invite-name', 'Noor Analyst');
    await page.uncheck('#invite-viewer');
    await page.check('#invite-analyst');
    await page.click('[data-testid=send-invitation]');
    await expect(page.locator('[data-testid=admin-message]').textContent({ timeout: 10_000 })).resolves.toContain('Invitation sent');
    await page.fill('#user-filter', email);
    await page.waitForSelector(`[data-testid=user-row][data-email="${email}"]`);
    expect(await page.locator(`[data-testid=user-row][data-email="${email}"]`).textContent()).toContain('invited');
    await screenshot(page, 'auth-admin-users');
    expect(problems.pageErrors).toEqual([]);
    await ctx.close();

    const mail = await latestMail(adminCookie, email);
    expect(mail.subject).toMatch(/invitation/i);
    invitationLink = linkIn(mail.text, '/accept-invitation');

    const guest = await browser.newContext();
    const gp = await guest.newPage();
    await gp.goto(invitationLink);
    await gp.waitForSelector('[data-testid=accept-invitation-form]');
    await islandsHydrated(gp);
    expect(await gp.locator('#invite-email').inputValue()).toBe(email);
    await gp.fill('#new-password', 'too short');
    await gp.fill('#confirm-password', 'too short');
    await gp.click('button[type=submit]');
    await expect(gp.locator('[role=alert]').textContent()).resolves.toContain('12');
    await gp.fill('#new-password', password);
    await gp.fill('#confirm-password', password);
    await gp.click('button[type=submit]');
    await gp.waitForSelector('[data-testid=invitation-accepted]');
    await signInThroughForm(gp, email, password);
    const me = await (await gp.request.get(`${base()}/api/me`)).json();
    expect(me.user.roles).toEqual(['analyst']);
    expect(await navLabels(gp)).toEqual(expectedNav(['analyst']));
    await guest.close();

    const sent = await auditEventsMentioning('invitation.sent', email);
    expect(sent.length).toBe(1);
    expect((await auditEventsMentioning('invitation.accepted', 'analyst')).length).toBeGreaterThanOrEqual(1);
  });

  it('the invitation link works only once', async () => {
    const ctx = await browser.newContext();
    const page = await ctx.newPage();
    await page.goto(invitationLink);
    await page.waitForSelector('[data-testid=invitation-invalid]');
    const token = new URL(invitationLink).searchParams.get('token')!;
    const r = await callJson(null, 'POST', '/api/invitations/accept', { token, password: 'another long password' });
    expect(r.status).toBe(410);
    await ctx.close();
  });

  it('a password reset by e-mail sets a new password; the link works once', async () => {
    const ctx = await browser.newContext();
    const page = await ctx.newPage();
    const before = (await callJson({ cookie: adminCookie }, 'GET', `/api/admin/mail?to=${encodeURIComponent(email)}&limit=1`)).body.items[0]?.id ?? 0;
    await page.goto(`${base()}/reset-password`);
    await page.waitForSelector('[data-testid=request-reset-form]');
    await islandsHydrated(page);
    await page.fill('#reset-email', email);
    await page.click('button[type=submit]');
    await page.waitForSelector('[data-testid=reset-requested]');
    const mail = await latestMail(adminCookie, email, { after: before });
    const link = linkIn(mail.text, '/reset-password');
    await page.goto(link);
    await page.waitForSelector('[data-testid=new-password-form]');
    await islandsHydrated(page);
    const newPassword = 'an even longer new password 2';
    await page.fill('#new-password', newPassword);
    await page.fill('#confirm-password', newPassword);
    await page.click('button[type=submit]');
    await page.waitForSelector('[data-testid=reset-done]');
    expect((await signIn(email, password)).status).toBe(401);
    expect((await signIn(email, newPassword)).status).toBe(200);
    const token = new URL(link).searchParams.get('token')!;
    const again = await fetch(`${base()}/api/auth/reset-password`, { method: 'POST', headers: { 'content-type': 'application/json', origin: base() }, body: JSON.stringify({ token, newPassword: 'yet another long password' }) });
    expect(again.status).toBe(400);
    await ctx.close();
  });

  it('deactivating a user ends their sessions and keys at once; reactivating lets them sign in again', async () => {
    const users = await usersByEmail(adminCookie);
    const u = users.get(email)!;
    const s = await signIn(email, 'an even longer new password 2');
    const { key } = await issueKey(adminCookie, u.id, 'deactivation test');
    expect((await call({ cookie: s.cookie! }, 'GET', '/api/me')).status).toBe(200);
    expect((await call({ key }, 'GET', '/api/me')).status).toBe(200);
    const off = await callJson({ cookie: adminCookie }, 'PATCH', `/api/admin/users/${u.id}`, { active: false });
    expect(off.status).toBe(200);
    expect((await call({ cookie: s.cookie! }, 'GET', '/api/me')).status).toBe(401);
    expect((await call({ key }, 'GET', '/api/me')).status).toBe(401);
    expect((await signIn(email, 'an even longer new password 2')).status).toBe(403);
    expect((await auditEvents('user.deactivated', u.id)).length).toBe(1);
    const on = await callJson({ cookie: adminCookie }, 'PATCH', `/api/admin/users/${u.id}`, { active: true, roles: ['analyst', 'curator'] });
    expect(on.status).toBe(200);
    expect(on.body.user.roles).toEqual(['analyst', 'curator']);
    const back = await signIn(email, 'an even longer new password 2');
    expect(back.status).toBe(200);
    expect((await callJson({ cookie: back.cookie! }, 'GET', '/api/me')).body.user.roles).toEqual(['analyst', 'curator']);
    expect((await call({ key }, 'GET', '/api/me')).status).toBe(401);
    expect((await auditEvents('user.roles_changed', u.id)).length).toBe(1);
  });
});

describe('sign-in throttling', () => {
  it('ten wrong passwords lock the account (429 and an audit entry); an admin clears it and the right password works', async () => {
    const email = demoEmail('curator2');
    for (let i = 0; i < 10; i++) expect((await signIn(email, `wrong password ${i}`)).status).toBe(401);
    const locked = await signIn(email, DEMO_PASSWORD);
    expect(locked.status).toBe(429);
    const events = await auditEvents('auth.lockout', email);
    expect(events.length).toBe(1);
    expect((await auditEvents('auth.sign_in_failures', email)).length).toBe(1);

    // An unknown address gets the very same answer.
    const unknown = `nobody.${Date.now()}@lab.example`;
    for (let i = 0; i < 10; i++) expect((await signIn(unknown, `wrong password ${i}`)).status).toBe(401);
    const u = await signIn(unknown, 'whatever password');
    expect(u.status).toBe(429);
    expect(u.body).toEqual(locked.body);

    const users = await callJson({ cookie: adminCookie }, 'GET', '/api/admin/users');
    expect(users.body.lockouts.map((l: any) => l.email)).toContain(email);
    const clear = await callJson({ cookie: adminCookie }, 'POST', '/api/admin/lockouts/clear', { email });
    expect(clear.body).toEqual({ email, cleared: true });
    expect((await auditEvents('auth.lockout_cleared', email)).length).toBe(1);
    expect((await signIn(email, DEMO_PASSWORD)).status).toBe(200);
  });

  it('six different users signing in within ten seconds from one address all succeed', async () => {
    const t0 = Date.now();
    const results = await Promise.all(DEMO_USERS.map((who) => signIn(demoEmail(who))));
    const elapsed = Date.now() - t0;
    expect(results.map((r) => r.status)).toEqual(DEMO_USERS.map(() => 200));
    expect(elapsed).toBeLessThan(10_000);
  });
});

describe('API keys', () => {
  it('a key acts as its owner with the owner\'s roles; revoked, it gets 401 on its next request', async () => {
    const users = await usersByEmail(adminCookie);
    const viewer = users.get(demoEmail('viewer'))!;
    const { id, key } = await issueKey(adminCookie, viewer.id, 'revocation test');
    const me = await fetch(`${base()}/api/me`, { headers: { authorization: `Bearer ${key}` } });
    expect(me.status).toBe(200);
    expect((await me.json()).user.email).toBe(demoEmail('viewer'));
    expect((await fetch(`${base()}/api/me`, { headers: { 'x-api-key': key } })).status).toBe(200);
    expect((await call({ key }, 'GET', '/api/admin/users')).status).toBe(403);
    const list = await callJson({ cookie: adminCookie }, 'GET', '/api/admin/api-keys');
    const listed = list.body.items.find((k: any) => k.id === id);
    expect(listed.userEmail).toBe(demoEmail('viewer'));
    expect(JSON.stringify(list.body)).not.toContain(key);
    const del = await callJson({ cookie: adminCookie }, 'DELETE', `/api/admin/api-keys/${id}`);
    expect(del.status).toBe(200);
    expect((await call({ key }, 'GET', '/api/me')).status).toBe(401);
    expect((await auditEvents('apikey.issued', id)).length).toBe(1);
    expect((await auditEvents('apikey.revoked', id)).length).toBe(1);
  });

  it('the keys screen issues a key once and revokes it', async () => {
    const ctx = await browser.newContext();
    const page = await ctx.newPage();
    const pageErrors: string[] = [];
    page.on('pageerror', (e) => pageErrors.push(e.message));
    await signInThroughForm(page, demoEmail('admin'), DEMO_PASSWORD);
    await page.goto(`${base()}/admin/keys`);
    await page.waitForSelector('#key-user option:nth-child(2)', { state: 'attached' });
    await islandsHydrated(page);
    const analystOption = await page.locator('#key-user option', { hasText: demoEmail('analyst') }).getAttribute('value');
    await page.selectOption('#key-user', analystOption!);
    await page.fill('#key-name', 'screen test key');
    await page.click('[data-testid=issue-key]');
    const key = (await page.locator('[data-testid=issued-key-value]').textContent({ timeout: 10_000 }))!.trim();
    expect(key).toMatch(/^ion_/);
    expect((await call({ key }, 'GET', '/api/me')).status).toBe(200);
    await screenshot(page, 'auth-admin-keys');
    page.once('dialog', (d) => void d.accept());
    await page.locator('[data-testid=key-row]', { hasText: 'screen test key' }).locator('[data-testid=revoke-key]').click();
    await page.waitForSelector('[data-testid=key-row]:has-text("screen test key")', { state: 'detached' });
    expect((await call({ key }, 'GET', '/api/me')).status).toBe(401);
    expect(pageErrors).toEqual([]);
    await ctx.close();
  });

  it('the mailbox page is for admins only', async () => {
    const viewer = await sessionFor('viewer');
    const r = await call({ cookie: viewer }, 'GET', '/admin/mail');
    expect(r.status).toBe(403);
    const a = await call({ cookie: adminCookie }, 'GET', '/admin/mail');
    expect(a.status).toBe(200);
    expect(await a.text()).toContain('Local mailbox');
  });
});
