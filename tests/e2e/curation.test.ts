// In Chromium against the built server: the curator drops three JCAMP-DX
// files on the import page, sees three progress bars reach the end and three
// report rows, and submits the drafts; the second curator approves them on
// the review page with the password re-entered (the first curator cannot, on
// screen or through the API); the analyst then finds the records. Also the
// HTTP round trip: export a record as JCAMP-DX, upload it again: duplicate.
import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import crypto from 'node:crypto';
import type { Browser, BrowserContext, Page } from 'playwright-core';
import { launchBrowser, baseUrl, islandsHydrated, signInAs, watchPage, screenshot } from '../helpers/browser';

let browser: Browser;
const contexts: BrowserContext[] = [];
beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(async () => {
  for (const c of contexts) await c.close().catch(() => {});
  await browser?.close();
});

async function pageAs(who: string): Promise<Page> {
  const context = await browser.newContext({ viewport: { width: 1400, height: 1000 } });
  contexts.push(context);
  const page = await context.newPage();
  try {
    await signInAs(page, who);
  } catch (e) {
    await screenshot(page, `curation-sign-in-${who}`);
    const alert = await page.locator('[role=alert]').allTextContents().catch(() => []);
    throw new Error(`signing in as ${who} failed (${alert.join(' ') || 'no message on screen'}): ${(e as Error).message}`);
  }
  return page;
}

const TAG = crypto.randomBytes(3).toString('hex');
/** Three small peak-table files of invented compounds with real-looking formulas (test data, not for identification). */
const FILES = [
  { name: `e2e-${TAG}-1.jdx`, compound: `Curation e2e ${TAG} alpha`, formula: 'C 8 H 10', peaks: [[51, 80], [77, 140], [91, 999], [105, 310], [106, 420]] },
  { name: `e2e-${TAG}-2.jdx`, compound: `Curation e2e ${TAG} beta`, formula: 'C 7 H 7 Cl', peaks: [[63, 110], [89, 150], [91, 999], [126, 560], [127, 45], [128, 180]] },
  { name: `e2e-${TAG}-3.jdx`, compound: `Curation e2e ${TAG} gamma`, formula: 'C 4 H 10 O', peaks: [[31, 999], [41, 300], [45, 120], [56, 420], [59, 60], [74, 35]] },
].map((f) => ({
  ...f,
  text: [
    `##TITLE= ${f.compound}`, '##JCAMP-DX= 5.01', '##DATA TYPE= MASS SPECTRUM', '##ORIGIN= e2e tests (invented)', '##OWNER= e2e',
    `##NAMES= ${f.compound}`, `##MOLFORM= ${f.formula}`, '##.IONIZATION ENERGY= 70', `##NPOINTS= ${f.peaks.length}`, '##PEAK TABLE= (XY..XY)',
    ...f.peaks.map(([m, i]) => `${m}, ${i}`), '##END=', '',
  ].join('\r\n'),
}));

describe('curation in the browser', () => {
  let recordIds: number[] = [];

  it('the curator drops three files: three progress bars reach the end, three report rows; then submits them', async () => {
    const page = await pageAs('curator');
    const problems = watchPage(page);
    await page.goto(`${baseUrl()}/import`);
    await page.waitForSelector('[data-testid=drop-zone]');
    // wait for the island to hydrate before dropping
    await islandsHydrated(page);
    // record every value each progress bar shows, to see them move to the end
    await page.evaluate(() => {
      (window as any).__progress = {};
      new MutationObserver(() => {
        document.querySelectorAll('[data-testid=upload-row]').forEach((row) => {
          const bar = row.querySelector('progress') as HTMLProgressElement;
          const key = row.getAttribute('data-file')!;
          ((window as any).__progress[key] ??= []).push(bar.value);
        });
      }).observe(document.body, { subtree: true, childList: true, attributes: true });
    });
    const dataTransfer = await page.evaluateHandle((files) => {
      const dt = new DataTransfer();
      for (const f of files) dt.items.add(new File([f.text], f.name, { type: 'application/octet-stream' }));
      return dt;
    }, FILES.map((f) => ({ name: f.name, text: f.text })));
    await page.dispatchEvent('[data-testid=drop-zone]', 'dragover', { dataTransfer });
    await page.dispatchEvent('[data-testid=drop-zone]', 'drop', { dataTransfer });

    await page.waitForFunction(() => document.querySelectorAll('[data-testid=upload-progress][data-complete=true]').length === 3, null, { timeout: 30_000 });
    const bars = await page.$$eval('[data-testid=upload-progress]', (els) => els.map((e) => ({ value: (e as HTMLProgressElement).value, max: (e as HTMLProgressElement).max })));
    expect(bars).toEqual([{ value: 100, max: 100 }, { value: 100, max: 100 }, { value: 100, max: 100 }]);
    const seen = await page.evaluate(() => (window as any).__progress as Record<string, number[]>);
    for (const f of FILES) expect(seen[f.name]?.at(-1)).toBe(100);

    const rows = page.locator('[data-testid=report-row]');
    await expect.poll(() => rows.count()).toBe(3);
    expect(await rows.evaluateAll((els) => els.map((e) => e.getAttribute('data-status')))).toEqual(['imported', 'imported', 'imported']);
    const links = await page.$$eval('[data-testid=record-link]', (els) => els.map((e) => Number((e as HTMLAnchorElement).href.split('/').pop())));
    expect(links).toHaveLength(3);
    recordIds = links;
    // the three files of one drop are one batch, which GET /api/imports/:batchId shows
    const batches = [...new Set(await rows.evaluateAll((els) => els.map((e) => e.getAttribute('data-batch'))))];
    expect(batches).toHaveLength(1);
    const batch = await (await page.request.get(`${baseUrl()}/api/imports/${batches[0]}`)).json();
    expect(batch.files.map((f: any) => f.status)).toEqual(['imported', 'imported', 'imported']);
    expect(batch.done).toBe(true);
    await screenshot(page, 'curation-import-report');

    await page.click('[data-testid=submit-all]');
    await page.waitForFunction(() => document.querySelectorAll('[data-testid=submitted]').length === 3, null, { timeout: 20_000 });
    expect(problems.pageErrors).toEqual([]);
  });

  it('the curator who submitted cannot approve, on screen or through the API', async () => {
    const page = await pageAs('curator');
    await page.goto(`${baseUrl()}/review`);
    for (const id of recordIds) {
      const card = page.locator(`[data-testid=review-item][data-record-id="${id}"]`);
      await expect.poll(() => card.count()).toBe(1);
      expect(await card.locator('[data-testid=review-blocked]').count()).toBe(1);
      expect(await card.locator('[data-testid=approve-open]').count()).toBe(0);
    }
    const res = await page.request.post(`${baseUrl()}/api/spectra/${recordIds[0]}/review`, {
      headers: { origin: baseUrl(), 'content-type': 'application/json' }, data: { action: 'approve', password: 'ionotheca-demo' },
    });
    expect(res.status()).toBe(403);
    expect((await res.json()).error.code).toBe('four_eyes');
  });

  it('the second curator approves with the password re-entered; without it the approval is refused', async () => {
    const page = await pageAs('curator2');
    const problems = watchPage(page);
    const noPassword = await page.request.post(`${baseUrl()}/api/spectra/${recordIds[0]}/review`, {
      headers: { origin: baseUrl(), 'content-type': 'application/json' }, data: { action: 'approve' },
    });
    expect(noPassword.status()).toBe(400);
    const wrong = await page.request.post(`${baseUrl()}/api/spectra/${recordIds[0]}/review`, {
      headers: { origin: baseUrl(), 'content-type': 'application/json' }, data: { action: 'approve', password: 'not-my-password-at-all' },
    });
    expect(wrong.status()).toBe(403);

    await page.goto(`${baseUrl()}/review`);
    await islandsHydrated(page);
    for (const id of recordIds) {
      const card = page.locator(`[data-testid=review-item][data-record-id="${id}"]`);
      await card.waitFor();
      expect(await card.locator('[data-testid=review-diff] [data-field=name]').count()).toBe(1);
      await card.locator('[data-testid=approve-open]').click();
      if (id === recordIds[0]) await card.screenshot({ path: 'tests/artifacts/curation-review-item.png' });
      await card.locator('[data-testid=approve-sign]').click();
      await expect.poll(() => card.locator('[data-testid=review-error]').textContent()).toMatch(/password/i);
      await card.locator('[data-testid=approve-password]').fill('ionotheca-demo');
      await card.locator('[data-testid=approve-sign]').click();
      await expect.poll(() => card.count(), { timeout: 15_000 }).toBe(0);
    }
    const done = await page.locator('[data-testid=review-done] li').allTextContents();
    expect(done.filter((t) => /released: signed by/.test(t))).toHaveLength(3);
    expect(problems.pageErrors).toEqual([]);
  });

  it('the analyst can then find the released records', async () => {
    const page = await pageAs('analyst');
    for (const f of FILES) {
      await expect.poll(async () => {
        const res = await page.request.get(`${baseUrl()}/api/spectra?q=${encodeURIComponent(f.compound)}`);
        const body = await res.json();
        return (body.items ?? []).filter((x: any) => x.name === f.compound).map((x: any) => x.status);
      }, { timeout: 10_000 }).toEqual(['released']);
    }
    const r = await page.request.get(`${baseUrl()}/api/spectra/${recordIds[0]}`);
    expect(r.status()).toBe(200);
    expect((await r.json()).status).toBe('released');
  });

  it('export as JCAMP-DX and upload again: reported as a duplicate of the record', async () => {
    const analyst = await pageAs('analyst');
    const exp = await analyst.request.get(`${baseUrl()}/api/spectra/${recordIds[1]}/jcamp`);
    expect(exp.status()).toBe(200);
    const text = await exp.text();
    expect(text).toContain('##JCAMP-DX=5.01');
    expect(text).toContain(FILES[1].compound);
    const curator = await pageAs('curator');
    const up = await curator.request.post(`${baseUrl()}/api/imports`, {
      headers: { origin: baseUrl() },
      multipart: { files: { name: 'exported.jdx', mimeType: 'image/png', buffer: Buffer.from(text) } },
    });
    expect(up.status()).toBe(200);
    const body = await up.json();
    expect(body.files[0]).toMatchObject({ file: 'exported.jdx', status: 'duplicate', duplicateOf: recordIds[1] });
    const batch = await curator.request.get(`${baseUrl()}/api/imports/${body.batchId}`);
    expect((await batch.json()).files[0].status).toBe('duplicate');
  });

  it('the record edit form shows live mass and IHD, field-level errors, and saves', async () => {
    const page = await pageAs('curator');
    const problems = watchPage(page);
    const text = FILES[2].text.replace(FILES[2].compound, `${FILES[2].compound} edit`).replace(FILES[2].compound, `${FILES[2].compound} edit`)
      .replace('31, 999', '31, 990').replace('41, 300', '41, 310');
    const up = await page.request.post(`${baseUrl()}/api/imports`, { headers: { origin: baseUrl() }, multipart: { files: { name: 'edit-me.jdx', mimeType: 'text/plain', buffer: Buffer.from(text) } } });
    const id = (await up.json()).files[0].spectra[0].id as number;
    await page.goto(`${baseUrl()}/library/${id}`);
    // a click before the editor's island hydrates is lost
    await islandsHydrated(page);
    await page.locator('[data-testid=record-edit] button').first().click();
    const form = page.locator('[data-testid=record-edit-form]');
    await form.waitFor();
    // bromobenzene: nominal mass 156 (79Br), IHD 4 (common practice, no source)
    await page.fill('#edit-formula', 'C6H5Br');
    await expect.poll(() => page.locator('[data-testid=formula-info]').textContent(), { timeout: 10_000 }).toMatch(/nominal 156.*IHD 4/);
    await page.fill('#edit-casRegistryNo', '108-86-2');
    await form.locator('button[type=submit]').click();
    await expect.poll(() => page.locator('[data-testid=error-casRegistryNo]').textContent()).toMatch(/check digit/);
    await page.fill('#edit-casRegistryNo', '108-86-1');
    await page.fill('#edit-referenceLot', 'LOT-E2E');
    await form.locator('button[type=submit]').click();
    await expect.poll(() => page.locator('[data-testid=edit-message]').textContent()).toMatch(/Saved/);
    const rec = await (await page.request.get(`${baseUrl()}/api/spectra/${id}`)).json();
    expect(rec.compound).toMatchObject({ formula: 'C6H5Br', casRegistryNo: '108-86-1', nominalMass: 156 });
    expect(rec.metadata.referenceLot).toBe('LOT-E2E');
    expect(problems.pageErrors).toEqual([]);
  });

  it('the server keeps answering mutated files with a report each', async () => {
    const page = await pageAs('curator');
    let seed = 7;
    const rand = () => ((seed = (seed * 1103515245 + 12345) % 2147483648) / 2147483648);
    const files = Array.from({ length: 60 }, (_, i) => {
      let t = FILES[i % 3].text;
      const at = Math.floor(rand() * t.length);
      t = i % 4 === 0 ? t.slice(0, at) : i % 4 === 1 ? t.slice(0, at) + 'NaN' + t.slice(at) : i % 4 === 2 ? t.replace('##END=', '') : t.slice(0, at) + '\u0001' + t.slice(at + 1);
      return { name: `mutant-${i}.jdx`, mimeType: 'application/octet-stream', buffer: Buffer.from(t) };
    });
    for (let k = 0; k < files.length; k += 20) {
      const form = new FormData();
      for (const f of files.slice(k, k + 20)) form.append('files', new Blob([f.buffer]), f.name);
      const cookies = await page.context().cookies();
      const res = await fetch(`${baseUrl()}/api/imports`, { method: 'POST', headers: { origin: baseUrl(), cookie: cookies.map((c) => `${c.name}=${c.value}`).join('; ') }, body: form });
      expect(res.status).toBe(200);
      const body = await res.json();
      expect(body.files).toHaveLength(20);
      for (const r of body.files) {
        expect(['imported', 'duplicate', 'rejected', 'needs_selection', 'needs_confirmation']).toContain(r.status);
        if (r.status === 'rejected') expect(r.error.length).toBeGreaterThan(5);
      }
    }
    const health = await (await fetch(`${baseUrl()}/api/health`)).json();
    expect(health.status).toBe('ok');
  });
});
