// The build's page weight (scripts/page-weight.ts): the Library and Identify
// pages load under 300 KB of gzipped JavaScript before any interaction, and
// Plotly is never part of that: it loads when a plot is first shown.
import { describe, expect, it } from 'vitest';
import { measurePageWeights } from '../../scripts/page-weight';

const LIMIT = 300 * 1024;

describe('page weight of the build', () => {
  const pages = measurePageWeights();
  const page = (route: string) => {
    const p = pages.find((x) => x.route === route);
    expect(p, `${route} is a page of the build`).toBeTruthy();
    return p!;
  };

  it('reports every page with its initial scripts', () => {
    expect(pages.length).toBeGreaterThan(5);
    for (const p of pages) for (const f of p.initial) expect(f.gzip).toBeGreaterThan(0);
    console.log(pages.map((p) => `${p.route}: ${(p.initialGzip / 1024).toFixed(1)} KB initial, ${(p.lazyGzip / 1024).toFixed(1)} KB lazy`).join('\n'));
  });

  it('keeps /library and /identify under 300 KB gzipped, without Plotly', () => {
    for (const route of ['/library', '/identify']) {
      const p = page(route);
      expect(p.initial.length).toBeGreaterThan(0);
      expect(p.initialGzip).toBeLessThan(LIMIT);
      expect(p.initial.some((f) => /plotly/i.test(f.file))).toBe(false);
    }
  });

  it('loads Plotly lazily where plots are drawn', () => {
    for (const route of ['/identify', '/library/[id]']) {
      const p = page(route);
      expect(p.initial.some((f) => /plotly/i.test(f.file))).toBe(false);
      expect(p.lazy.some((f) => /plotly/i.test(f.file))).toBe(true);
    }
  });
});
