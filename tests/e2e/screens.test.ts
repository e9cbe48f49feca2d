// The screens analysts and viewers live in, in Chromium against the built
// server with the demo scenario: Identify (peak list → hits → overlay →
// interpretation), the Library (fuzzy search, shareable filters) and the
// record page, the viewer's navigation and 403, and no console errors or
// missing assets on any of them. Screenshots land in tests/artifacts/.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import path from 'node:path';
import type { Browser, Page, Response } from 'playwright-core';
import { baseUrl, islandsHydrated, launchBrowser, screenshot, signInAs, watchPage, type PageProblems } from '../helpers/browser';

let browser: Browser;
let analyst: Page;
let viewer: Page;
let analystProblems: PageProblems;
let viewerProblems: PageProblems;
const failedAssets: string[] = [];
/** The one response the tests ask to fail on purpose: the viewer's /identify. */
const deliberate = new Set<string>();

interface RecordAnswer {
  id: number;
  version: number;
  compound: { name: string; formula: string; nominalMass: number };
  peaks: [number, number][];
  synthetic: boolean;
}
let toluene: RecordAnswer;

function watchAssets(page: Page) {
  page.on('response', (r: Response) => {
    if (r.status() >= 400 && !deliberate.has(r.url())) failedAssets.push(`${r.status()} ${r.url()}`);
  });
}


async function newSignedInPage(who: string): Promise<[Page, PageProblems]> {
  const context = await browser.newContext({ viewport: { width: 1280, height: 900 } });
  const page = await context.newPage();
  const problems = watchPage(page);
  watchAssets(page);
  await signInAs(page, who);
  return [page, problems];
}

beforeAll(async () => {
  browser = await launchBrowser();
  [analyst, analystProblems] = await newSignedInPage('analyst');
  [viewer, viewerProblems] = await newSignedInPage('viewer');
  // A demo record with a clear molecular ion: toluene, C7H8, M = 92.
  const found = await analyst.evaluate(async () => (await fetch('/api/spectra?q=toluene&pageSize=10')).json());
  const item = found.items.find((i: { name: string }) => i.name.toLowerCase() === 'toluene');
  expect(item, 'the demo scenario holds a released toluene record').toBeTruthy();
  toluene = await analyst.evaluate(async (id) => (await fetch(`/api/spectra/${id}`)).json(), item.id);
  expect(toluene.peaks.length).toBeGreaterThan(3);
});

afterAll(async () => {
  await browser?.close();
});

describe('Identify', () => {
  it('finds the demo record at rank 1 from its pasted peak list', async () => {
    await analyst.goto(`${baseUrl()}/identify`);
    await analyst.waitForSelector('#peak-list');
    await islandsHydrated(analyst);
    expect(await analyst.locator('label[for=peak-list]').textContent()).toBe('Peak list');
    await analyst.fill('#peak-list', toluene.peaks.map(([mz, i]) => `${mz} ${i}`).join('\n'));
    await analyst.getByRole('button', { name: 'Search', exact: true }).click();
    await analyst.waitForSelector('[data-testid=hit-row]', { timeout: 20_000 });
    const first = analyst.locator('[data-testid=hit-row]').first();
    expect(await first.getAttribute('data-record-id')).toBe(String(toluene.id));
    expect((await first.locator('[data-testid=hit-rank]').textContent())?.trim()).toBe('1');
    expect((await first.locator('[data-testid=hit-name]').textContent())?.trim()).toBe(toluene.compound.name);
    // scores 0..1 with three decimals under their plain names, and the caution
    const header = (await analyst.locator('[data-testid=hit-table] thead').textContent()) ?? '';
    for (const name of ['cosine', 'reverse cosine', 'composite (Stein & Scott 1994)', 'spectral entropy similarity']) expect(header).toContain(name);
    const cells = await first.locator('td.font-mono').allTextContents();
    expect(cells.filter((c) => /^[01]\.\d{3}$/.test(c.trim())).length).toBeGreaterThanOrEqual(4);
    expect(await analyst.locator('[data-testid=hit-caution]').textContent()).toContain('confirm it with an authentic reference standard');
    if (toluene.synthetic) expect(await first.locator('.badge-synthetic').count()).toBe(1);
    await screenshot(analyst, 'identify-hits');
  });

  it('shows that record’s molecular ion in the interpretation panel', async () => {
    await analyst.waitForSelector('[data-testid=molecular-ion]', { timeout: 20_000 });
    const text = (await analyst.locator('[data-testid=molecular-ion]').textContent()) ?? '';
    expect(text).toContain(`m/z ${toluene.compound.nominalMass}`);
    // the top hit's formula agrees with that molecular ion: no conflict flag on it
    expect(await analyst.locator('[data-testid=hit-row]').first().locator('[data-testid=formula-flag]').count()).toBe(0);
  });

  it('opens the head-to-tail overlay with both traces in the plot SVG', async () => {
    await analyst.locator('[data-testid=compare-hit]').first().click();
    await analyst.waitForSelector('[data-testid=overlay] svg.main-svg .barlayer .trace', { timeout: 30_000 });
    const traces = analyst.locator('[data-testid=overlay] svg.main-svg .barlayer .trace');
    expect(await traces.count()).toBeGreaterThanOrEqual(2);
    const legend = await analyst.locator('[data-testid=overlay] .legendtext').allTextContents();
    expect(legend.some((l) => l.startsWith('query'))).toBe(true);
    expect(legend.some((l) => l.startsWith(`reference: ${toluene.compound.name}`))).toBe(true);
    // both traces drew bars (paths) in the SVG
    for (const i of [0, 1]) expect(await traces.nth(i).locator('path').count()).toBeGreaterThan(0);
    await screenshot(analyst, 'identify-overlay');
  });

  it('searches with a record’s spectrum when arriving from the record page', async () => {
    await analyst.goto(`${baseUrl()}/identify?spectrumId=${toluene.id}`);
    await analyst.waitForSelector('[data-testid=hit-row]', { timeout: 20_000 });
    expect(await analyst.locator('[data-testid=source-note]').textContent()).toContain(`record ${toluene.id}`);
    expect(await analyst.locator('[data-testid=hit-row]').first().getAttribute('data-record-id')).toBe(String(toluene.id));
  });

  it('reads an uploaded JCAMP-DX file into the peak list', async () => {
    await analyst.goto(`${baseUrl()}/identify`);
    await analyst.waitForSelector('#peak-list');
    await islandsHydrated(analyst);
    await analyst.getByRole('tab', { name: 'JCAMP-DX file' }).click();
    await analyst.setInputFiles('#jcamp-file', path.resolve('tests/fixtures/jcamp/peak-table-xy.jdx'));
    await analyst.waitForFunction(() => (document.querySelector('#peak-list') as HTMLTextAreaElement | null)?.value.includes('78'));
    expect(await analyst.locator('[data-testid=source-note]').textContent()).toContain('peak-table-xy.jdx');
    await analyst.getByRole('button', { name: 'Search', exact: true }).click();
    await analyst.waitForSelector('[data-testid=hit-row], [data-testid=no-hits]', { timeout: 20_000 });
    await analyst.waitForSelector('[data-testid=molecular-ion]', { timeout: 20_000 });
    expect(await analyst.locator('[data-testid=molecular-ion]').textContent()).toContain('m/z 78');
  });

  it('points a peak-list error at its line', async () => {
    await analyst.fill('#peak-list', '91 100\n92 sixty\n65 12');
    await analyst.getByRole('button', { name: 'Search', exact: true }).click();
    const errors = await analyst.locator('[data-testid=peak-list-errors]').textContent();
    expect(errors).toContain('Line 2');
    expect(errors).toContain('"sixty"');
  });
});

describe('Library', () => {
  it('finds a record from a misspelt name', async () => {
    await analyst.goto(`${baseUrl()}/library`);
    await analyst.waitForSelector('[data-testid=library-row]');
    await islandsHydrated(analyst);
    await analyst.fill('#lib-q', 'tolune');
    await analyst.waitForFunction(() => new URL(location.href).searchParams.get('q') === 'tolune');
    await analyst.waitForFunction(() => {
      const first = document.querySelector('[data-testid=library-row] [data-testid=record-link]');
      return first?.textContent?.trim() === 'Toluene';
    }, undefined, { timeout: 10_000 });
    await screenshot(analyst, 'library-fuzzy');
  });

  it('restores its filters, sort and columns from a shared link', async () => {
    const link = `${baseUrl()}/library?elements=Cl&massMax=150&sort=-nominalMass&hide=ihd`;
    await analyst.goto(link);
    await analyst.waitForSelector('[data-testid=library-row]');
    expect(await analyst.inputValue('#lib-elements')).toBe('Cl');
    expect(await analyst.inputValue('#lib-massmax')).toBe('150');
    const headers = (await analyst.locator('[data-testid=library-table] thead th').allTextContents()).map((h) => h.replace(/[▲▼↕]/g, '').trim());
    expect(headers).not.toContain('IHD');
    expect(await analyst.locator('th[aria-sort=descending]').textContent()).toContain('Nominal mass');
    const rows = analyst.locator('[data-testid=library-row]');
    const n = await rows.count();
    expect(n).toBeGreaterThan(0);
    const formulas = await rows.locator('td:nth-child(2)').allTextContents();
    const masses = (await rows.locator('td:nth-child(3)').allTextContents()).map(Number);
    for (const f of formulas) expect(f).toMatch(/Cl/);
    for (const m of masses) expect(m).toBeLessThanOrEqual(150);
    expect([...masses].sort((a, b) => b - a)).toEqual(masses);
    // a change made on the page lands in the URL, and that URL restores it
    await islandsHydrated(analyst);
    await analyst.fill('#lib-massmin', '100');
    await analyst.waitForFunction(() => new URL(location.href).searchParams.get('massMin') === '100');
    const shared = analyst.url();
    const other = await analyst.context().newPage();
    watchPage(other);
    await other.goto(shared);
    await other.waitForSelector('[data-testid=library-total]');
    expect(await other.inputValue('#lib-massmin')).toBe('100');
    expect(await other.inputValue('#lib-elements')).toBe('Cl');
    await screenshot(other, 'library-shared-link');
    await other.close();
  });

  it('shows a record with its stick plot, structure and synthetic badge', async () => {
    await analyst.goto(`${baseUrl()}/library/${toluene.id}`);
    await analyst.waitForSelector('[data-testid=record-plot] svg.main-svg', { timeout: 30_000 });
    expect(await analyst.locator('[data-testid=record-name]').textContent()).toBe(toluene.compound.name);
    expect(await analyst.locator('[data-testid=structure] svg').count()).toBe(1);
    expect(await analyst.locator('[data-testid=peak-table] tbody tr').count()).toBe(toluene.peaks.length);
    if (toluene.synthetic) expect(await analyst.locator('[data-testid=synthetic-badge]').textContent()).toBe('synthetic demo');
    expect(await analyst.locator('[data-testid=search-with-this]').getAttribute('href')).toBe(`/identify?spectrumId=${toluene.id}`);
    await screenshot(analyst, 'record-page');
  });
});

describe('viewer', () => {
  it('sees the Library but no Identify in the navigation', async () => {
    await viewer.goto(`${baseUrl()}/library`);
    await viewer.waitForSelector('[data-testid=library-row]');
    const nav = (await viewer.locator('[data-testid=main-nav] a').allTextContents()).map((s) => s.trim());
    expect(nav).toContain('Library');
    expect(nav).not.toContain('Identify');
    await screenshot(viewer, 'viewer-library');
  });

  it('gets the 403 page with HTTP status 403 at /identify', async () => {
    const url = `${baseUrl()}/identify`;
    deliberate.add(url);
    const res = await viewer.goto(url);
    expect(res?.status()).toBe(403);
    await viewer.waitForSelector('[data-testid=page-403]');
    await screenshot(viewer, 'viewer-identify-403');
  });
});

describe('every page', () => {
  it('has a favicon, every asset, and no console errors', async () => {
    const icon = await analyst.evaluate(async () => {
      const href = document.querySelector('link[rel=icon]')?.getAttribute('href');
      return { href, status: href ? (await fetch(href)).status : 0 };
    });
    expect(icon).toEqual({ href: '/favicon.svg', status: 200 });
    expect(failedAssets).toEqual([]);
    expect(analystProblems.pageErrors).toEqual([]);
    expect(analystProblems.console).toEqual([]);
    expect(viewerProblems.pageErrors).toEqual([]);
    // Chromium logs the deliberate 403 document itself; nothing else may show up.
    expect(viewerProblems.console.filter((m) => !/status of 403/.test(m))).toEqual([]);
    expect(viewerProblems.console.filter((m) => /status of 403/.test(m)).length).toBeLessThanOrEqual(1);
  });
});
