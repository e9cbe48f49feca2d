// GET /api/reports/:id/pdf: the print view rendered by headless Chromium
// (playwright-core), as the caller: their cookies and API key are passed on,
// so the print page applies the same visibility rule.
import fs from 'node:fs';
import { getConfig } from '../config';
import { HttpError } from '../http';

export const CHROMIUM_PATH = () => process.env.CHROMIUM_PATH || '/usr/bin/chromium';
export type Paper = 'A4' | 'Letter';

const MAX_CONCURRENT = 2;
let running = 0;
const waiting: (() => void)[] = [];

async function slot<T>(fn: () => Promise<T>): Promise<T> {
  if (running >= MAX_CONCURRENT) await new Promise<void>((r) => waiting.push(r));
  running++;
  try {
    return await fn();
  } finally {
    running--;
    waiting.shift()?.();
  }
}

/** Where this server answers on loopback (the PDF renderer calls back into it). */
export function loopbackOrigin(): string {
  const cfg = getConfig();
  const host = cfg.host === '0.0.0.0' || cfg.host === '::' ? '127.0.0.1' : cfg.host;
  return `http://${host.includes(':') ? `[${host}]` : host}:${cfg.port}`;
}

function parseCookies(header: string | null): { name: string; value: string }[] {
  if (!header) return [];
  return header.split(';').map((p) => p.trim()).filter(Boolean).map((p) => {
    const i = p.indexOf('=');
    return i < 0 ? { name: p, value: '' } : { name: p.slice(0, i), value: p.slice(i + 1) };
  }).filter((c) => c.name);
}

export async function renderReportPdf(id: number, request: Request, paper: Paper = 'A4'): Promise<Buffer> {
  const exe = CHROMIUM_PATH();
  if (!fs.existsSync(exe)) {
    throw new HttpError(503, 'pdf_unavailable', `PDF printing needs Chromium at ${exe}, which is not installed on this server (Debian: apt-get install chromium). Open /reports/${id}/print and print it from the browser instead.`);
  }
  const { chromium } = await import('playwright-core');
  const origin = loopbackOrigin();
  return slot(async () => {
    const browser = await chromium.launch({
      executablePath: exe,
      headless: true,
      args: ['--no-sandbox', '--disable-gpu', '--disable-background-networking', '--disable-component-update', '--disable-sync', '--no-first-run'],
    });
    try {
      const headers: Record<string, string> = {};
      const auth = request.headers.get('authorization');
      const key = request.headers.get('x-api-key');
      if (auth) headers.authorization = auth;
      if (key) headers['x-api-key'] = key;
      const context = await browser.newContext({ extraHTTPHeaders: headers });
      const cookies = parseCookies(request.headers.get('cookie'));
      if (cookies.length) await context.addCookies(cookies.map((c) => ({ ...c, url: origin })));
      const page = await context.newPage();
      const res = await page.goto(`${origin}/reports/${id}/print?paper=${paper.toLowerCase()}`, { waitUntil: 'load', timeout: 30_000 });
      if (!res || res.status() !== 200) {
        const st = res?.status() ?? 0;
        if (st === 404) throw new HttpError(404, 'not_found', `There is no report ${id}`);
        throw new HttpError(502, 'pdf_failed', `The print view answered ${st}; no PDF was made`);
      }
      await page.evaluate(() => document.fonts.ready);
      const pdf = await page.pdf({ format: paper, printBackground: true, preferCSSPageSize: false, margin: { top: '14mm', bottom: '16mm', left: '14mm', right: '14mm' } });
      return Buffer.from(pdf);
    } finally {
      await browser.close().catch(() => {});
    }
  });
}
