// A static head-to-tail plot (query up, reference down) as SVG text, drawn on
// the server for the print view and the PDF, where no script runs.
import { unitRelative } from './evaluateCriteria';
import type { Peak } from './types';

export interface HeadToTailOptions {
  /** @default 720 */ width?: number;
  /** @default 340 */ height?: number;
  /** @default 'Query' */ queryLabel?: string;
  /** @default 'Reference' */ referenceLabel?: string;
  /** @default '#1f7a7a' */ queryColour?: string;
  /** @default '#b85c25' */ referenceColour?: string;
  /** How many of the most intense ions of each side get an m/z label. @default 6 */
  labelCount?: number;
}

const esc = (s: string) => s.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!);

function niceStep(range: number, target: number): number {
  const raw = range / target;
  const p = 10 ** Math.floor(Math.log10(raw));
  for (const m of [1, 2, 5, 10]) if (raw <= m * p) return m * p;
  return 10 * p;
}

export function headToTailSvg(query: readonly Peak[], reference: readonly Peak[] | null, options: HeadToTailOptions = {}): string {
  const W = options.width ?? 720;
  const H = options.height ?? 340;
  const qc = options.queryColour ?? '#1f7a7a';
  const rc = options.referenceColour ?? '#b85c25';
  const labels = options.labelCount ?? 6;
  const q = [...unitRelative(query).entries()];
  const r = [...unitRelative(reference ?? []).entries()];
  const all = [...q, ...r].map(([m]) => m);
  const lo = all.length ? Math.max(0, Math.floor((Math.min(...all) - 5) / 10) * 10) : 0;
  const hi = all.length ? Math.ceil((Math.max(...all) + 5) / 10) * 10 : 100;
  const left = 46, right = 12, top = 22, bottom = 34;
  const plotW = W - left - right;
  const half = (H - top - bottom) / 2;
  const mid = top + half;
  const x = (m: number) => left + ((m - lo) / Math.max(1, hi - lo)) * plotW;
  const parts: string[] = [];
  parts.push(`<svg xmlns="http://www.w3.org/2000/svg" viewBox="0 0 ${W} ${H}" width="100%" role="img" aria-label="Head-to-tail overlay of the query and the selected reference spectrum" font-family="Source Sans 3, sans-serif" font-size="11">`);
  parts.push(`<rect x="0" y="0" width="${W}" height="${H}" fill="#ffffff"/>`);
  // axes and grid
  for (const v of [100, 50]) {
    parts.push(`<line x1="${left}" x2="${W - right}" y1="${mid - (v / 100) * half}" y2="${mid - (v / 100) * half}" stroke="#ece8de"/>`);
    parts.push(`<line x1="${left}" x2="${W - right}" y1="${mid + (v / 100) * half}" y2="${mid + (v / 100) * half}" stroke="#ece8de"/>`);
    parts.push(`<text x="${left - 6}" y="${mid - (v / 100) * half + 4}" text-anchor="end" fill="#5f6b6d">${v}</text>`);
    parts.push(`<text x="${left - 6}" y="${mid + (v / 100) * half + 4}" text-anchor="end" fill="#5f6b6d">${v}</text>`);
  }
  const step = niceStep(hi - lo, 10);
  for (let t = Math.ceil(lo / step) * step; t <= hi; t += step) {
    parts.push(`<line x1="${x(t)}" x2="${x(t)}" y1="${H - bottom}" y2="${H - bottom + 4}" stroke="#12343b"/>`);
    parts.push(`<text x="${x(t)}" y="${H - bottom + 16}" text-anchor="middle" fill="#12343b">${t}</text>`);
  }
  parts.push(`<line x1="${left}" x2="${W - right}" y1="${H - bottom}" y2="${H - bottom}" stroke="#12343b"/>`);
  parts.push(`<text x="${left + plotW / 2}" y="${H - 4}" text-anchor="middle" fill="#12343b">m/z</text>`);
  // sticks
  const stick = (m: number, v: number, up: boolean, colour: string) =>
    `<line x1="${x(m).toFixed(2)}" x2="${x(m).toFixed(2)}" y1="${mid}" y2="${(up ? mid - (v / 100) * half : mid + (v / 100) * half).toFixed(2)}" stroke="${colour}" stroke-width="1.6"/>`;
  for (const [m, v] of q) parts.push(stick(m, v, true, qc));
  for (const [m, v] of r) parts.push(stick(m, v, false, rc));
  const labelTop = (list: [number, number][], up: boolean, colour: string) => {
    for (const [m, v] of [...list].sort((a, b) => b[1] - a[1]).slice(0, labels)) {
      const y = up ? mid - (v / 100) * half - 3 : mid + (v / 100) * half + 11;
      parts.push(`<text x="${x(m).toFixed(2)}" y="${y.toFixed(2)}" text-anchor="middle" fill="${colour}" font-weight="600">${m}</text>`);
    }
  };
  labelTop(q, true, qc);
  labelTop(r, false, rc);
  parts.push(`<line x1="${left}" x2="${W - right}" y1="${mid}" y2="${mid}" stroke="#12343b" stroke-width="0.8"/>`);
  parts.push(`<text x="${left + 4}" y="${top - 8}" fill="${qc}" font-weight="700">▲ ${esc(options.queryLabel ?? 'Query')}</text>`);
  parts.push(`<text x="${left + 4}" y="${H - bottom - 6}" fill="${rc}" font-weight="700">▼ ${esc(options.referenceLabel ?? 'Reference')}</text>`);
  if (!reference) parts.push(`<text x="${left + plotW / 2}" y="${mid + half / 2}" text-anchor="middle" fill="#5f6b6d">No reference selected</text>`);
  parts.push('</svg>');
  return parts.join('');
}
