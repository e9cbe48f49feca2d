// Headless Debian Chromium through playwright-core, with a fresh profile, and
// a collector of console errors, page errors and dialogs.
import { chromium, type Browser, type Page } from 'playwright-core';
import fs from 'node:fs';
import path from 'node:path';
import { inject } from 'vitest';

export const CHROMIUM = process.env.CHROMIUM_PATH || '/usr/bin/chromium';
export const ARTIFACTS = path.resolve('tests/artifacts');

export async function launchBrowser(): Promise<Browser> {
  // playwright-core gives every launch a fresh, empty user-data dir of its own.
  return chromium.launch({
    executablePath: CHROMIUM,
    headless: true,
    args: [
      '--no-sandbox', '--disable-gpu', '--disable-background-networking', '--disable-component-update',
      '--disable-sync', '--no-first-run', '--disable-quic',
    ],
  });
}

export function baseUrl(): string {
  return inject('baseUrl');
}

export interface PageProblems { console: string[]; pageErrors: string[]; dialogs: string[] }

export function watchPage(page: Page): PageProblems {
  const p: PageProblems = { console: [], pageErrors: [], dialogs: [] };
  page.on('console', (m) => {
    if (m.type() === 'error') p.console.push(m.text());
  });
  page.on('pageerror', (e) => p.pageErrors.push(e.message));
  page.on('dialog', (d) => {
    p.dialogs.push(d.message());
    void d.dismiss();
  });
  return p;
}

export async function screenshot(page: Page, name: string) {
  fs.mkdirSync(ARTIFACTS, { recursive: true });
  await page.screenshot({ path: path.join(ARTIFACTS, `${name}.png`), fullPage: true });
}

/**
 * Wait until every island on the page has hydrated (Astro drops the `ssr` attribute then).
 * A click or a keystroke before that reaches only the server-rendered HTML: the click is
 * lost, and hydration may empty fields already typed into. Islands here are client:load,
 * client:idle or client:only, so this always ends.
 */
export async function islandsHydrated(page: Page, timeout = 20_000) {
  await page.waitForFunction(() => document.querySelectorAll('astro-island[ssr]').length === 0, undefined, { timeout });
}

/** Sign in through the API in this page's context (cookie lands in the browser). */
export async function signInAs(page: Page, who: string, password = 'ionotheca-demo') {
  await page.goto(`${baseUrl()}/sign-in`);
  // Wait until React has hydrated the form, or typing may be lost.
  await page.waitForSelector('[data-testid="sign-in-form"]', { timeout: 20000 });
  await islandsHydrated(page);
  await page.fill('#email', `${who}@demo.ionotheca.test`);
  await page.fill('#password', password);
  await Promise.all([page.waitForURL((u) => !u.pathname.startsWith('/sign-in'), { timeout: 20000 }), page.click('button[type=submit]')]);
}
