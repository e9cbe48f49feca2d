// Shared helpers for the search tests: a seeded PRNG, random libraries, the two kernels compared.
import { expect } from 'vitest';
import type { PreparedSpectrum } from '../../../src/lib/search/prepare';
import { searchSegment, type KernelParams } from '../../../src/lib/search/searchSegment';
import type { Segment } from '../../../src/lib/search/segment';
import type { LibraryEntry, Peak, SearchFilters, SpectrumStatus } from '../../../src/lib/search/types';
import { setSearchKernel } from '../../../src/lib/search/wasmKernel';

// The benchmark's seeded PRNG (mulberry32), one copy for both.
export { rng } from '../../../bench/synthetic';
import { rng } from '../../../bench/synthetic';

const STATUSES: SpectrumStatus[] = ['released', 'released', 'released', 'in_review', 'draft'];
const TAGS = ['solvent', 'impurity', 'flavour'];

/** A random library with families of similar spectra, coarse intensities (so ties occur) and varied metadata. */
export function randomLibrary(seed: number, count: number): LibraryEntry[] {
  const r = rng(seed);
  const entries: LibraryEntry[] = [];
  let parent: Peak[] = [];
  for (let i = 0; i < count; i++) {
    let peaks: Peak[];
    if (i > 0 && r() < 0.4) {
      peaks = parent.map(([mz, v]) => [mz, r() < 0.2 ? Math.max(1, Math.round(v * (0.5 + r()))) : v] as Peak);
      if (r() < 0.5) peaks.push([30 + Math.floor(r() * 200), 1 + Math.floor(r() * 50)]);
    } else {
      peaks = [];
      const n = 1 + Math.floor(r() * 30);
      for (let j = 0; j < n; j++) peaks.push([30 + Math.floor(r() ** 2 * 250) + (r() < 0.1 ? 0.3 : 0), 1 + Math.floor(r() ** 2 * 20) * 50]);
      parent = peaks;
    }
    entries.push({
      spectrumId: 1000 + i,
      recordId: 1 + Math.floor(r() * count * 0.8),
      version: 1,
      name: `spectrum ${i}`,
      formula: r() < 0.5 ? 'C6H6' : r() < 0.5 ? 'C7H8' : null,
      nominalMass: r() < 0.9 ? 40 + Math.floor(r() * 200) : null,
      ihd: r() < 0.9 ? Math.floor(r() * 6) : null,
      elements: r() < 0.3 ? ['C', 'H', 'Cl'] : ['C', 'H'],
      tags: TAGS.filter(() => r() < 0.3),
      status: STATUSES[Math.floor(r() * STATUSES.length)],
      ri: r() < 0.7 ? [{ phase: 'non-polar', value: 800 + Math.floor(r() * 800) }] : [],
      peaks,
    });
  }
  return entries;
}

/** A query made from a library spectrum with noise and an extra peak. */
export function noisyQuery(r: () => number, peaks: Peak[]): Peak[] {
  const q: Peak[] = peaks.filter(() => r() > 0.1).map(([mz, v]) => [mz, v * (0.6 + 0.8 * r())]);
  q.push([30 + Math.floor(r() * 250), 5 + r() * 100]);
  return q;
}

/** Hits as comparable strings: id and exact score. */
export function keyOf(hits: { spectrumId: number; score: number }[]): string[] {
  return hits.map((h) => `${h.spectrumId}:${h.score}`);
}

/** Filter sets that exercise every pre-filter, RI penalty included (for randomLibrary entries). */
export const FILTER_CASES: (SearchFilters | undefined)[] = [
  undefined,
  { status: ['released', 'in_review', 'draft'] },
  { formula: 'C6H6' },
  { elements: ['Cl'] },
  { excludeElements: ['Cl'], ihdMin: 1, ihdMax: 4 },
  { massMin: 60, massMax: 180, tags: ['solvent'] },
  { ri: { value: 1200, window: 150, phase: 'non-polar' } },
  { ri: { value: 1200, window: 150, phase: 'non-polar', penalty: 0.2 } },
];

/**
 * Runs the JavaScript kernels on `seg` and the compiled ones on `compiledSeg`
 * (the same segment unless a test swaps its memory) and expects the same hits
 * to the bit, postings read and docs rescored. Returns the compiled result.
 */
export function sameFromBothKernels(seg: Segment, q: PreparedSpectrum, params: KernelParams, compiledSeg: Segment = seg) {
  setSearchKernel('js');
  const js = searchSegment(seg, q, params);
  setSearchKernel('wasm');
  const wasm = searchSegment(compiledSeg, q, params);
  expect(Array.from(wasm.docs)).toEqual(Array.from(js.docs));
  expect(Array.from(wasm.rank)).toEqual(Array.from(js.rank));
  expect(Array.from(wasm.scores)).toEqual(Array.from(js.scores));
  expect([wasm.postings, wasm.evaluated]).toEqual([js.postings, js.evaluated]);
  return wasm;
}
