// In Chromium against the built server: an analyst searches on Identify,
// picks a hit, saves the report, lands on the report page, and prints it to
// PDF through GET /api/reports/:id/pdf (at least one page, carrying the report
// id). The demo's approved report shows "intact", and "altered" once a row is
// changed behind the application.
import { describe, it, expect, beforeAll, afterAll, inject } from 'vitest';
import zlib from 'node:zlib';
import type { Browser, BrowserContext, Page } from 'playwright-core';
import { QueryTypes } from 'sequelize';
import { launchBrowser, baseUrl, islandsHydrated, signInAs, watchPage, screenshot } from '../helpers/browser';
import { createSequelize } from '../../src/lib/db/sequelize';

let browser: Browser;
beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
});

interface PdfObject { dict: string; stream: Buffer | null }

/** The PDF's objects by number, streams inflated where Flate-compressed (Chromium writes no object streams). */
function pdfObjects(pdf: Buffer): Map<number, PdfObject> {
  const text = pdf.toString('latin1');
  const out = new Map<number, PdfObject>();
  const re = /(\d+)\s+0\s+obj\b/g;
  let m: RegExpExecArray | null;
  while ((m = re.exec(text))) {
    const bodyStart = m.index + m[0].length;
    const streamAt = text.indexOf('stream', bodyStart);
    const endObj = text.indexOf('endobj', bodyStart);
    if (endObj < 0) break;
    let stream: Buffer | null = null;
    let dict = text.slice(bodyStart, endObj);
    if (streamAt >= 0 && streamAt < endObj) {
      dict = text.slice(bodyStart, streamAt);
      const len = /\/Length\s+(\d+)(?!\s+\d+\s+R)/.exec(dict);
      const dataStart = streamAt + 'stream'.length + (text[streamAt + 6] === '\r' ? 2 : 1);
      if (len) {
        const raw = pdf.subarray(dataStart, dataStart + Number(len[1]));
        try {
          stream = /FlateDecode/.test(dict) ? zlib.inflateSync(raw) : raw;
        } catch {
          stream = raw;
        }
        re.lastIndex = dataStart + Number(len[1]);
      }
    }
    out.set(Number(m[1]), { dict, stream });
  }
  return out;
}

function parseCMap(cmap: string): Map<string, string> {
  const map = new Map<string, string>();
  const toText = (hex: string) => Buffer.from(hex, 'hex').swap16().toString('utf16le');
  for (const block of cmap.matchAll(/beginbfchar([\s\S]*?)endbfchar/g)) {
    for (const [, g, u] of block[1].matchAll(/<([0-9A-Fa-f]+)>\s*<([0-9A-Fa-f]+)>/g)) map.set(g.toUpperCase(), toText(u));
  }
  for (const block of cmap.matchAll(/beginbfrange([\s\S]*?)endbfrange/g)) {
    for (const [, a, b, u] of block[1].matchAll(/<([0-9A-Fa-f]+)>\s*<([0-9A-Fa-f]+)>\s*<([0-9A-Fa-f]+)>/g)) {
      const lo = parseInt(a, 16), hi = parseInt(b, 16), base = parseInt(u, 16);
      for (let g = lo; g <= hi; g++) map.set(g.toString(16).toUpperCase().padStart(4, '0'), String.fromCodePoint(base + g - lo));
    }
  }
  return map;
}

/**
 * The text Chromium drew, recovered the way a PDF reader does: Skia writes
 * glyph ids as hex strings, and each font's ToUnicode CMap maps them back.
 */
function pdfText(pdf: Buffer): string {
  const objects = pdfObjects(pdf);
  const fontMaps = new Map<string, Map<string, string>>();
  for (const o of objects.values()) {
    for (const [, body] of o.dict.matchAll(/\/Font\s*<<([^>]*)>>/g)) {
      for (const [, name, ref] of body.matchAll(/\/(\S+)\s+(\d+)\s+0\s+R/g)) {
        const font = objects.get(Number(ref));
        const tu = font && /\/ToUnicode\s+(\d+)\s+0\s+R/.exec(font.dict);
        const cmap = tu && objects.get(Number(tu[1]))?.stream;
        if (cmap) fontMaps.set(name, parseCMap(cmap.toString('latin1')));
      }
    }
  }
  const parts: string[] = [];
  for (const o of objects.values()) {
    const content = o.stream?.toString('latin1') ?? '';
    if (!/\bBT\b/.test(content)) continue;
    let font: Map<string, string> | undefined;
    for (const t of content.matchAll(/\/(\S+)\s+[\d.]+\s+Tf|<([0-9A-Fa-f]+)>|\b(ET)\b/g)) {
      if (t[1]) font = fontMaps.get(t[1]);
      else if (t[2]) parts.push((t[2].toUpperCase().match(/.{4}/g) ?? []).map((g) => font?.get(g) ?? '').join(''));
      else parts.push(' ');
    }
    parts.push('\n');
  }
  return parts.join('').replace(/ +/g, ' ');
}

async function newSignedInPage(who: string): Promise<{ context: BrowserContext; page: Page }> {
  const context = await browser.newContext();
  const page = await context.newPage();
  await signInAs(page, who);
  return { context, page };
}

describe('identification reports in the browser', () => {
  let reportId = 0;

  it('saves a report from the Identify view and shows it', async () => {
    const { context, page } = await newSignedInPage('analyst');
    const problems = watchPage(page);
    try {
      // the query: a released demo record's own peaks
      const list = await page.request.get(`${baseUrl()}/api/spectra?pageSize=20`);
      expect(list.status()).toBe(200);
      const items = (await list.json()).items as { id: number; peakCount: number }[];
      const pick = items.find((i) => i.peakCount >= 8) ?? items[0];
      const rec = await (await page.request.get(`${baseUrl()}/api/spectra/${pick.id}`)).json();
      const peakText = (rec.peaks as [number, number][]).map(([mz, i]) => `${mz} ${Math.round(i * 100) / 100}`).join('\n');

      await page.goto(`${baseUrl()}/identify`);
      await islandsHydrated(page);
      await page.fill('#peak-list', peakText);
      await page.click('[data-testid=search-button]');
      await page.waitForSelector('[data-testid=hit-row]', { timeout: 30_000 });
      await page.locator('[data-testid=compare-hit]').first().click();
      const title = `E2E report ${Date.now()}`;
      await page.fill('#report-title', title);
      await Promise.all([page.waitForURL(/\/reports\/\d+$/, { timeout: 30_000 }), page.click('[data-testid=save-report]')]);
      reportId = Number(new URL(page.url()).pathname.split('/').pop());
      expect(reportId).toBeGreaterThan(0);

      await page.waitForSelector('[data-testid=report]');
      expect(await page.textContent('h1')).toContain(title);
      expect(await page.textContent('[data-testid=report-label]')).toBe(`IR-${String(reportId).padStart(5, '0')}`);
      expect(await page.textContent('[data-testid=report-status]')).toBe('Draft');
      expect(await page.textContent('[data-testid=report-caution]')).toMatch(/reference standard/);
      expect(await page.locator('[data-testid=hit-table] tbody tr').count()).toBeGreaterThan(0);
      expect(await page.locator('[data-testid=criteria] [data-criterion]').count()).toBe(5);
      await page.waitForSelector('[data-testid=overlay] svg.main-svg', { timeout: 30_000 });
      await page.waitForSelector('[data-testid=edit-report]');
      await screenshot(page, 'report-page');

      const api = await (await page.request.get(`${baseUrl()}/api/reports/${reportId}`)).json();
      expect(api.snapshot.hits.length).toBeGreaterThan(0);
      expect(api.selected.recordId).toBe(api.snapshot.hits[0].spectrumId);
      expect(api.snapshot.query.peaks.length).toBe(rec.peaks.length);
      expect(problems.pageErrors).toEqual([]);
    } finally {
      await context.close();
    }
  });

  it('the analyst concludes and submits it on the page; the second curator signs it there', async () => {
    expect(reportId).toBeGreaterThan(0);
    const a = await newSignedInPage('analyst');
    try {
      const page = a.page;
      const api = await (await page.request.get(`${baseUrl()}/api/reports/${reportId}`)).json();
      const alternatives = (api.criteria.alternatives as { name: string }[]).map((x) => x.name);
      await page.goto(`${baseUrl()}/reports/${reportId}`);
      await islandsHydrated(page);
      await page.click('[data-testid=edit-report]');
      await page.selectOption('select[name=conclusion]', 'tentative');
      await page.fill('textarea[name=reasoning]', `Closest library match; no standard run yet.${alternatives.length ? ` Also considered: ${alternatives.join(', ')}.` : ''}`);
      await Promise.all([page.waitForEvent('load'), page.click('[data-testid=edit-form] button[type=submit]')]);
      expect(await page.textContent('[data-testid=conclusion-text]')).toBe('Tentative');
      await page.fill('[data-testid=review-comment]', 'Please review.');
      await Promise.all([page.waitForEvent('load'), page.click('[data-testid=submit-report]')]);
      expect(await page.textContent('[data-testid=report-status]')).toBe('Submitted for review');
    } finally {
      await a.context.close();
    }
    const c = await newSignedInPage('curator2');
    try {
      const page = c.page;
      await page.goto(`${baseUrl()}/reports/${reportId}`);
      await islandsHydrated(page);
      await page.fill('[data-testid=sign-password]', 'not-the-password');
      await page.click('[data-testid=approve-report]');
      await page.waitForSelector('[data-testid=action-error]');
      expect(await page.textContent('[data-testid=action-error]')).toMatch(/password/i);
      await page.fill('[data-testid=sign-password]', 'ionotheca-demo');
      await Promise.all([page.waitForEvent('load'), page.click('[data-testid=approve-report]')]);
      expect(await page.textContent('[data-testid=report-status]')).toBe('Approved');
      expect(await page.textContent('[data-testid=integrity]')).toBe('Integrity: intact');
      expect(await page.textContent('[data-testid=signature]')).toMatch(/Tobiah Quennell.*reviewed and approved/);
      expect(await page.textContent('[data-testid=report-reviewer]')).toBe('Tobiah Quennell');
    } finally {
      await c.context.close();
    }
  });

  it('prints it to PDF through Chromium: at least one page, with the report id in its text', async () => {
    expect(reportId).toBeGreaterThan(0);
    const { context, page } = await newSignedInPage('analyst');
    try {
      const res = await page.request.get(`${baseUrl()}/api/reports/${reportId}/pdf`, { timeout: 60_000 });
      expect(res.status()).toBe(200);
      expect(res.headers()['content-type']).toBe('application/pdf');
      const pdf = Buffer.from(await res.body());
      expect(pdf.subarray(0, 5).toString('latin1')).toBe('%PDF-');
      const pages = pdf.toString('latin1').match(/\/Type\s*\/Page(?!s)/g) ?? [];
      expect(pages.length).toBeGreaterThanOrEqual(1);
      const label = `IR-${String(reportId).padStart(5, '0')}`;
      const text = pdfText(pdf);
      expect(text).toContain(label);
      expect(text).toMatch(/confirmed\s*with\s*an\s*authentic\s*reference\s*standard/);

      const letter = await page.request.get(`${baseUrl()}/api/reports/${reportId}/pdf?paper=letter`, { timeout: 60_000 });
      expect(letter.status()).toBe(200);
      // Letter is 612 pt wide, A4 595 pt
      expect(Buffer.from(await letter.body()).toString('latin1')).toMatch(/\/MediaBox\s*\[\s*0\s+0\s+612/);
      expect(pdf.toString('latin1')).toMatch(/\/MediaBox\s*\[\s*0\s+0\s+59[45]/);

      // another analyst may not print someone else's draft
      const other = await page.request.get(`${baseUrl()}/api/reports/999999/pdf`);
      expect(other.status()).toBe(404);
    } finally {
      await context.close();
    }
  });

  it('shows the demo approved report as intact to a viewer, and as altered once a row is changed behind the app', async () => {
    const { context, page } = await newSignedInPage('viewer');
    const db = createSequelize(`mariadb://root@127.0.0.1:${inject('serverDbPort')}/ionotheca`);
    try {
      const list = await (await page.request.get(`${baseUrl()}/api/reports`)).json();
      expect(list.items.length).toBeGreaterThan(0);
      expect(list.items.every((i: any) => i.status === 'approved')).toBe(true);
      const id = list.items.find((i: any) => i.title.includes('PCL-2291'))?.id ?? list.items[list.items.length - 1].id;
      await page.goto(`${baseUrl()}/reports`);
      await page.waitForSelector(`[data-testid=reports-table] tr[data-report-id="${id}"]`);
      expect(await page.locator('[data-testid=reports-table] tbody tr[data-report-id]').count()).toBe(list.items.length);
      await page.goto(`${baseUrl()}/reports/${id}`);
      expect(await page.textContent('[data-testid=integrity]')).toBe('Integrity: intact');
      expect(await page.textContent('[data-testid=signature]')).toMatch(/reviewed and approved/);
      expect(await page.locator('[data-testid=report-actions]').count()).toBe(0);

      const [row] = await db.query<{ reasoning: string }>('SELECT reasoning FROM report WHERE id = ?', { replacements: [id], type: QueryTypes.SELECT });
      await db.query('UPDATE report SET reasoning = ? WHERE id = ?', { replacements: [`${row.reasoning} (edited)`, id] });
      try {
        await page.reload();
        expect(await page.textContent('[data-testid=integrity]')).toBe('Integrity: altered');
        await page.waitForSelector('[data-testid=integrity-alert]');
        await page.goto(`${baseUrl()}/reports/${id}/print`);
        expect(await page.textContent('[data-testid=print-sheet]')).toMatch(/Integrity check failed/);
      } finally {
        await db.query('UPDATE report SET reasoning = ? WHERE id = ?', { replacements: [row.reasoning, id] });
      }
      await page.goto(`${baseUrl()}/reports/${id}`);
      expect(await page.textContent('[data-testid=integrity]')).toBe('Integrity: intact');
      await screenshot(page, 'report-approved');
      await page.goto(`${baseUrl()}/reports/${id}/print`);
      expect(await page.textContent('[data-testid=print-caution]')).toMatch(/reference standard/);
      expect(await page.locator('[data-testid=print-overlay] svg').count()).toBe(1);
      await screenshot(page, 'report-print');
      // the viewer does not see drafts
      const all = await db.query<{ id: number }>("SELECT id FROM report WHERE status = 'draft' LIMIT 1", { type: QueryTypes.SELECT });
      if (all[0]) expect((await page.goto(`${baseUrl()}/reports/${all[0].id}`))!.status()).toBe(404);
    } finally {
      await db.close();
      await context.close();
    }
  });
});
