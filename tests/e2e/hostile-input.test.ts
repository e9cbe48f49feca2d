// Hostile input (issue 9, item 1), against the e2e server in Chromium:
//   - script payloads in every free-text field the API takes (compound name,
//     synonyms, tags, notes and other metadata through a crafted JCAMP-DX
//     file's TITLE, NAMES and `$` labels and through PATCH; report text; user
//     names through an invitation) render as text on every page that shows
//     them: no dialog, no injected element, no page error;
//   - SQL metacharacters in every filter and sort parameter give 200 or 400,
//     never 500, and change no row;
//   - oversized JSON bodies get 413; unknown fields are rejected or ignored,
//     never stored.
import { describe, it, expect, beforeAll, afterAll, inject } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import mariadb from 'mariadb';
import { launchBrowser, watchPage, screenshot } from '../helpers/browser';
import { base, demoEmail, latestMail, linkIn, sessionFor, usersByEmail } from '../helpers/auth';
import { call, uploadFiles, releaseRecord } from '../../scripts/reliability/lib/client';
import { makeJcamp, syntheticPeaks } from '../../scripts/reliability/lib/jcamp';

const P = {
  script: '<script>alert(1)</script>',
  img: '"><img src=x onerror=alert(1)>',
  js: 'javascript:alert(1)',
  tmpl: '{{7*7}}',
  svg: '<svg onload=alert(1)>',
};
const ALL = Object.values(P).join(' ');
const MARK = `Hostile${Date.now() % 100000}`;
const NAME = `${MARK} ${P.script}${P.img}`;

let browser: Browser;
let curator: string;
let curator2: string;
let analyst: string;
let admin: string;
let recordId = 0;
let reportId = 0;
const stored: Record<string, string | string[]> = {};

async function sql<T = any>(q: string, params: unknown[] = []): Promise<T[]> {
  const c = await mariadb.createConnection({ host: '127.0.0.1', port: inject('serverDbPort'), user: 'root', database: 'ionotheca', bigIntAsNumber: true });
  try {
    return await c.query(q, params);
  } finally {
    await c.end();
  }
}

/** Row counts of every table: what check-data counts and more. */
async function rowCounts(): Promise<Record<string, number>> {
  const tables = (await sql('SHOW TABLES')).map((r: any) => String(Object.values(r)[0]));
  const out: Record<string, number> = {};
  for (const t of tables) out[t] = Number((await sql(`SELECT COUNT(*) AS n FROM \`${t}\``))[0].n);
  return out;
}

/** What a page must not show: a dialog, a page error, or an element or attribute a payload made. */
async function expectNoInjection(page: Page, problems: ReturnType<typeof watchPage>, where: string) {
  await page.waitForLoadState('networkidle').catch(() => {});
  await page.waitForTimeout(300);
  const found = await page.evaluate(() => {
    const out: string[] = [];
    document.querySelectorAll('img').forEach((i) => {
      if (i.getAttribute('src') === 'x') out.push(`img[src=x]`);
    });
    document.querySelectorAll('script').forEach((s) => {
      if ((s.textContent ?? '').includes('alert(1)')) out.push('script with the payload');
    });
    document.querySelectorAll('*').forEach((el) => {
      for (const a of Array.from(el.attributes)) {
        if (a.name.startsWith('on') && a.value.includes('alert')) out.push(`${el.tagName.toLowerCase()}[${a.name}]`);
        if ((a.name === 'href' || a.name === 'src' || a.name === 'action' || a.name === 'xlink:href') && /^\s*javascript:/i.test(a.value)) out.push(`${el.tagName.toLowerCase()}[${a.name}=javascript:]`);
      }
    });
    return out;
  });
  expect(found, `${where}: injected elements`).toEqual([]);
  expect(problems.dialogs, `${where}: dialogs`).toEqual([]);
  expect(problems.pageErrors, `${where}: page errors`).toEqual([]);
}

const sessions: Record<string, string> = {};

async function visit(who: string, paths: string[], check: (page: Page, path: string) => Promise<void> = async () => {}) {
  const ctx = await browser.newContext();
  // signed in through the API: the session cookie goes into the browser
  const cookie = sessions[who];
  await ctx.addCookies(cookie.split('; ').map((kv) => ({ name: kv.slice(0, kv.indexOf('=')), value: kv.slice(kv.indexOf('=') + 1), url: base(), httpOnly: true, sameSite: 'Lax' as const })));
  const page = await ctx.newPage();
  const problems = watchPage(page);
  for (const path of paths) {
    const res = await page.goto(`${base()}${path}`);
    expect(res?.status(), path).toBe(200);
    await expectNoInjection(page, problems, `${who} ${path}`);
    await check(page, path);
    await screenshot(page, `hostile-${who}-${path.replace(/[^a-z0-9]+/gi, '_').slice(0, 60)}`);
  }
  await ctx.close();
}

beforeAll(async () => {
  browser = await launchBrowser();
  [curator, curator2, analyst, admin] = await Promise.all(['curator', 'curator2', 'analyst', 'admin'].map((w) => sessionFor(w)));
  Object.assign(sessions, { curator, curator2, analyst, admin });
});
afterAll(async () => {
  await browser?.close();
});

describe('script payloads are stored as text', () => {
  it('a crafted JCAMP-DX file with payloads in TITLE, NAMES and $ labels imports', async () => {
    const text = makeJcamp({
      title: `${MARK} title ${P.script}`,
      names: [NAME, P.svg, P.js, P.tmpl],
      formula: 'C8H10O',
      mw: 122,
      userLabels: {
        'ANALYZER TYPE': P.img,
        METHOD: P.svg,
        ANALYST: P.script,
        'REFERENCE LOT': P.tmpl,
        'PARENT COMPOUND': P.js,
        COMMENT: ALL,
        [`NOTE ${P.img}`]: 'label with a payload in its name',
      },
      peaks: syntheticPeaks(987_654, 122),
    });
    const up = await uploadFiles(base(), { cookie: curator }, [{ name: `${MARK}-hostile.jdx`, text }]);
    expect(up.status).toBe(200);
    const f = up.body.files[0];
    expect(f.status, JSON.stringify(f)).toBe('imported');
    recordId = f.spectra[0].id;
    const rec = await call(base(), `/api/spectra/${recordId}`, { cookie: curator });
    expect(rec.body.compound?.name ?? rec.body.name).toBe(NAME);
    stored.name = NAME;
  });

  it('PATCH stores payloads in synonyms, tags, notes and metadata as given (or rejects them with 400)', async () => {
    const rec = await call(base(), `/api/spectra/${recordId}`, { cookie: curator });
    const body = {
      baseVersion: rec.body.version,
      synonyms: [P.script, P.img, P.svg, P.js, P.tmpl],
      notes: `${ALL}\nsecond line ${P.script}`,
      instrument: P.img,
      acquiredBy: P.svg,
      saltForm: P.tmpl,
      casRegistryNo: null,
    };
    const r = await call(base(), `/api/spectra/${recordId}`, { cookie: curator, method: 'PATCH', json: body });
    expect(r.status, JSON.stringify(r.body)).toBe(200);
    const tagged = await call(base(), `/api/spectra/${recordId}`, { cookie: curator, method: 'PATCH', json: { baseVersion: rec.body.version, tags: [`${MARK}-tag`, P.script, P.img, P.tmpl] } });
    expect([200, 400]).toContain(tagged.status);
    const after = await call(base(), `/api/spectra/${recordId}`, { cookie: curator });
    expect(after.body.compound?.synonyms ?? after.body.synonyms).toEqual(body.synonyms);
    expect(JSON.stringify(after.body)).toContain(P.script);
    console.log(`tags with payloads: HTTP ${tagged.status}${tagged.status === 200 ? '' : ` ${JSON.stringify(tagged.body).slice(0, 200)}`}`);
    stored.tags = tagged.status === 200 ? after.body.tags.map((t: any) => (typeof t === 'string' ? t : t.name)) : [];
    if (tagged.status === 200) expect(stored.tags).toContain(P.script);
    await releaseRecord(base(), { cookie: curator }, { cookie: curator2 }, recordId);
  });

  it('a report and a user name carry payloads', async () => {
    const rec = await call(base(), `/api/spectra/${recordId}`, { cookie: analyst });
    const s = await call(base(), '/api/search', { cookie: analyst, json: { peaks: rec.body.peaks, limit: 5 } });
    expect(s.status).toBe(200);
    const hits = s.body.hits.map((h: any, i: number) => (i === 1 ? { ...h, name: `${P.img} forged hit name` } : h));
    const r = await call(base(), '/api/reports', {
      cookie: analyst,
      json: {
        title: `${MARK} report ${P.script}`,
        query: { peaks: rec.body.peaks, sourceFileName: `${P.img}.jdx` },
        hits,
        selected: { recordId: hits[0].spectrumId, version: hits[0].version },
        conclusion: 'tentative',
        reasoning: `${ALL}\n${P.script}`,
        sample: { sampleId: P.svg, notes: P.img, instrument: P.tmpl, method: P.js },
      },
    });
    expect(r.status, JSON.stringify(r.body)).toBe(201);
    reportId = r.body.id;
    const sub = await call(base(), `/api/reports/${reportId}/review`, { cookie: analyst, json: { action: 'submit' } });
    expect([200, 400, 409], JSON.stringify(sub.body)).toContain(sub.status);

    const email = `hostile.${Date.now()}@lab.example`;
    const inv = await call(base(), '/api/admin/invitations', { cookie: admin, json: { email, name: `${MARK} ${P.img}`, roles: ['viewer'] } });
    expect(inv.status).toBe(201);
    const mail = await latestMail(admin, email);
    const token = decodeURIComponent(new URL(linkIn(mail.text, '/accept-invitation')).searchParams.get('token')!);
    const acc = await call(base(), '/api/invitations/accept', { json: { token, password: 'hostile input password', name: `${MARK} ${P.script}${P.svg}` }, origin: null });
    expect(acc.status).toBe(200);
    const u = (await usersByEmail(admin)).get(email);
    expect(u).toBeDefined();
  });
});

describe('pages render the payloads as text', () => {
  it('library, record, identify, review and reports pages for the curator', async () => {
    await visit('curator', [
      `/library?q=${encodeURIComponent(MARK)}`,
      `/library?q=${encodeURIComponent(P.script)}&tags=${encodeURIComponent(P.img)}&formula=${encodeURIComponent(P.svg)}`,
      `/library/${recordId}`,
      `/library/${recordId}?version=1`,
      '/review',
      '/reports',
      `/reports/${reportId}`,
      `/reports/${reportId}/print`,
    ], async (page, path) => {
      if (path === `/library/${recordId}`) {
        const text = await page.locator('body').innerText();
        expect(text).toContain(P.script);
        expect(text).toContain(P.tmpl);
        // the stick plot with the record's name in hover labels and titles
        await page.waitForSelector('svg.main-svg', { timeout: 20_000 }).catch(() => {});
        const peak = page.locator('.plot .points path, .scatterlayer .point').first();
        if (await peak.count()) await peak.hover({ force: true }).catch(() => {});
        await page.waitForTimeout(300);
      }
      if (path.startsWith('/library?q=Hostile') || path === `/library?q=${encodeURIComponent(MARK)}`) {
        await page.waitForFunction((m) => document.body.innerText.includes(m), MARK, { timeout: 15_000 });
      }
      if (path === `/reports/${reportId}` || path === `/reports/${reportId}/print`) {
        expect(await page.locator('body').innerText()).toContain(P.script);
      }
    });
  });

  it('identify with the record as the query, for the analyst', async () => {
    await visit('analyst', [`/identify?spectrumId=${recordId}`, '/reports', `/reports/${reportId}`], async (page, path) => {
      if (path.startsWith('/identify')) {
        await page.waitForSelector('[data-testid=hit-row]', { timeout: 30_000 });
        expect(await page.locator('[data-testid=hit-name]').first().innerText()).toContain(MARK);
        await page.locator('[data-testid=hit-row]').first().click().catch(() => {});
        await page.waitForTimeout(1500);
      }
    });
  });

  it('admin users and the mailbox, for the admin', async () => {
    await visit('admin', ['/admin', '/admin/mail', '/admin/keys'], async (page, path) => {
      if (path === '/admin') await page.waitForFunction((m) => document.body.innerText.includes(m), MARK, { timeout: 15_000 });
      if (path === '/admin/mail') expect(await page.locator('body').innerText()).toContain(`${MARK} report ${P.script}`);
    });
  });

  it('the e-mails themselves: their HTML parts render the payloads as text', async () => {
    const mails = await call(base(), '/api/admin/mail?limit=100', { cookie: admin });
    const ours = (mails.body.items as any[]).filter((m) => `${m.subject}\n${m.text}`.includes(MARK));
    expect(ours.length).toBeGreaterThan(0);
    const ctx = await browser.newContext({ javaScriptEnabled: true });
    for (const m of ours) {
      const page = await ctx.newPage();
      const problems = watchPage(page);
      await page.setContent(String(m.html ?? ''), { waitUntil: 'load' });
      await expectNoInjection(page, problems, `mail "${m.subject}"`);
      expect(await page.locator('body').innerText()).toContain(MARK);
      await page.close();
    }
    await ctx.close();
  });

  it('the audit trail export keeps payloads as quoted text', async () => {
    const csv = await call(base(), `/api/admin/audit?format=csv&record=${recordId}`, { cookie: admin });
    expect(csv.status).toBe(200);
    expect(String(csv.body)).toContain('spectrum.approve');
  });
});

describe('SQL metacharacters in filters and sort parameters', () => {
  const META = [`' OR 1=1 --`, `"; DROP TABLE user; --`, '%', '_', '\\', "'", `1) OR (1=1`, `%' OR '1'='1`, '`', '0x27', 'name; DROP TABLE spectrum_record'];

  it('answer 200 or 400, never 500, and change no row', async () => {
    const before = await rowCounts();
    const spectraParams = ['q', 'formula', 'elements', 'excludeElements', 'ihdMin', 'ihdMax', 'massMin', 'massMax', 'tags', 'status', 'synthetic', 'page', 'pageSize', 'sort', 'unknownParam'];
    const reportParams = ['status', 'conclusion', 'author', 'reviewer', 'mine', 'q', 'from', 'to', 'format', 'page', 'pageSize', 'sort'];
    const auditParams = ['actor', 'record', 'version', 'action', 'targetType', 'targetId', 'from', 'to', 'page', 'pageSize', 'sort', 'format'];
    const seen: Record<number, number> = {};
    const wildcardLeaks: string[] = [];
    for (const m of META) {
      for (const [path, params, cookie] of [['/api/spectra', spectraParams, curator], ['/api/spectra/export.csv', ['q', 'formula', 'tags', 'sort'], curator], ['/api/reports', reportParams, curator], ['/api/admin/audit', auditParams, admin]] as const) {
        for (const p of params) {
          const r = await call(base(), `${path}?${p}=${encodeURIComponent(m)}`, { cookie });
          seen[r.status] = (seen[r.status] ?? 0) + 1;
          expect([200, 400], `${path}?${p}=${m} → ${r.status} ${JSON.stringify(r.body).slice(0, 200)}`).toContain(r.status);
          // exact-match filters must not act as wildcards
          if (r.status === 200 && path === '/api/spectra' && ['formula', 'tags'].includes(p) && (m === '%' || m === '_')) {
            if (r.body.total !== 0) wildcardLeaks.push(`${p}=${m} matched ${r.body.total}`);
          }
          if (r.status === 200 && path === '/api/admin/audit' && ['actor', 'targetId'].includes(p) && (m === '%' || m === '_') && r.body.total !== 0) wildcardLeaks.push(`audit ${p}=${m} matched ${r.body.total}`);
        }
      }
      const filters: Record<string, unknown>[] = [
        { formula: m }, { elements: m }, { excludeElements: m }, { elements: [m] }, { tags: [m] }, { status: [m] },
        { ri: { value: 1000, window: 50, phase: m } }, { [m]: 1 },
      ];
      for (const f of filters) {
        const r = await call(base(), '/api/search', { cookie: curator, json: { peaks: [[43, 999], [57, 500], [71, 200]], filters: f, limit: 10 } });
        seen[r.status] = (seen[r.status] ?? 0) + 1;
        expect([200, 400], `search filters ${JSON.stringify(f)} → ${r.status}`).toContain(r.status);
        if (r.status === 200 && 'tags' in f) expect(r.body.hits.length, `tags ${m} must match no tag`).toBe(0);
      }
      for (const o of [{ rankBy: m }, { excludeIons: [m] }, { [m]: true }]) {
        const r = await call(base(), '/api/search', { cookie: curator, json: { peaks: [[43, 999]], options: o } });
        expect([200, 400], `search options ${JSON.stringify(o)} → ${r.status}`).toContain(r.status);
      }
    }
    expect(wildcardLeaks).toEqual([]);
    const after = await rowCounts();
    // the rate-limit table counts sign-in attempts; nothing here signs in
    expect(after).toEqual(before);
    expect(seen[500] ?? 0).toBe(0);
  });

  it('sort fields come from an allow-list', async () => {
    for (const s of ['name; DROP TABLE user', 'name DESC, (SELECT 1)', 'password', '-(id)', 'id`']) {
      expect((await call(base(), `/api/spectra?sort=${encodeURIComponent(s)}`, { cookie: curator })).status).toBe(400);
      expect((await call(base(), `/api/admin/audit?sort=${encodeURIComponent(s)}`, { cookie: admin })).status).toBe(400);
    }
    expect((await call(base(), '/api/spectra?sort=-nominalMass', { cookie: curator })).status).toBe(200);
    expect((await call(base(), '/api/admin/audit?sort=-at', { cookie: admin })).status).toBe(200);
  });
});

describe('bodies and fields', () => {
  it('oversized JSON bodies get 413', async () => {
    const big = (n: number) => JSON.stringify({ peaks: [[43, 999]], pad: 'x'.repeat(n) });
    const cases: [string, string, string, number][] = [
      [curator, 'POST', '/api/search', 3 * 1024 * 1024],
      [curator, 'POST', '/api/interpret', 3 * 1024 * 1024],
      [curator, 'PATCH', `/api/spectra/${recordId}`, 3 * 1024 * 1024],
      [admin, 'POST', '/api/admin/invitations', 100 * 1024],
      [admin, 'PATCH', `/api/admin/users/x`, 100 * 1024],
      [analyst, 'POST', '/api/reports', 9 * 1024 * 1024],
    ];
    for (const [cookie, method, path, n] of cases) {
      const r = await call(base(), path, { cookie, method, body: big(n), headers: { 'content-type': 'application/json' } });
      expect(r.status, `${method} ${path} with ${n} bytes`).toBe(413);
      expect(r.body?.error?.message).toMatch(/limit/i);
    }
    // without a Content-Length (chunked), the limit still holds
    const stream = new ReadableStream({
      start(c) {
        for (let i = 0; i < 6; i++) c.enqueue(new TextEncoder().encode(i === 0 ? '{"peaks":[[43,999]],"pad":"' : 'y'.repeat(600 * 1024)));
        c.enqueue(new TextEncoder().encode('"}'));
        c.close();
      },
    });
    const r = await fetch(`${base()}/api/search`, { method: 'POST', headers: { cookie: curator, origin: base(), 'content-type': 'application/json' }, body: stream, duplex: 'half' } as RequestInit);
    expect(r.status).toBe(413);
  });

  it('unknown fields are rejected or ignored, never stored', async () => {
    const rec = await call(base(), `/api/spectra/${recordId}`, { cookie: curator });
    const patch = await call(base(), `/api/spectra/${recordId}`, {
      cookie: curator, method: 'PATCH',
      json: { baseVersion: rec.body.version, reason: 'unknown fields', notes: 'x', status: 'released', approvedBy: 'someone', synthetic: false, hostileField: P.script },
    });
    expect(patch.status).toBe(400);
    const after = await call(base(), `/api/spectra/${recordId}`, { cookie: curator });
    expect(after.body.latestVersion).toBe(rec.body.latestVersion);
    expect(JSON.stringify(after.body)).not.toContain('hostileField');

    const users = await usersByEmail(admin);
    const viewer = users.get(demoEmail('viewer'))!;
    const u = await call(base(), `/api/admin/users/${viewer.id}`, { cookie: admin, method: 'PATCH', json: { roles: ['viewer'], email: 'taken@lab.example', emailVerified: false } });
    expect(u.status).toBe(400);
    expect((await usersByEmail(admin)).get(demoEmail('viewer'))).toBeDefined();

    expect((await call(base(), '/api/search', { cookie: curator, json: { peaks: [[43, 999]], sql: 'DROP TABLE user' } })).status).toBe(400);

    const report = await call(base(), '/api/reports', {
      cookie: analyst,
      json: { title: `${MARK} unknown`, query: { peaks: [[43, 999]] }, hits: [], status: 'approved', hmac: 'forged', approvedBy: 'me' },
    });
    if (report.status === 201) {
      const got = await call(base(), `/api/reports/${report.body.id}`, { cookie: analyst });
      expect(got.body.status ?? got.body.report?.status).toBe('draft');
      expect(JSON.stringify(got.body)).not.toContain('forged');
    } else expect(report.status).toBe(400);

    const email = `unknown.${Date.now()}@lab.example`;
    const inv = await call(base(), '/api/admin/invitations', { cookie: admin, json: { email, roles: ['viewer'], active: false, roles2: ['admin'], isAdmin: true } });
    expect([201, 400]).toContain(inv.status);
    const rows = await sql('SELECT * FROM invitation WHERE email = ?', [email]);
    for (const row of rows) expect(JSON.stringify(row)).not.toMatch(/isAdmin|roles2/);
    if (rows.length) expect(String(rows[0].roles)).toBe('viewer');
  });
});
