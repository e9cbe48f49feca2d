// StoredColumnsBuilder against the object path it replaces at start-up:
// storeSpectrum(decodePeaks(packed)) per spectrum, and SearchIndex.build over
// LibraryEntry objects. Equality is bit for bit (bytes of the typed arrays).
import { afterAll, describe, expect, it } from 'vitest';
import { StoredColumnsBuilder } from '../../src/lib/library-columns';
import { storeSpectrum } from '../../src/lib/search/prepare';
import { SearchIndex } from '../../src/lib/search/SearchIndex';
import { closeSearchPool } from '../../src/lib/search/pool';
import { SCORE_NAMES, type LibraryEntry, type Peak } from '../../src/lib/search/types';
import type { EntryMeta } from '../../src/lib/search/filters';
import { decodePeaks, encodePeaks } from '../../src/lib/spectra/index';
import { FILTER_CASES, noisyQuery, randomLibrary, rng } from './search/helpers';
import { packUnchecked } from '../helpers/packed-peaks';

afterAll(() => closeSearchPool());

/** At an odd offset of a larger buffer, as the database driver hands BLOBs out. */
function unaligned(b: Buffer): Buffer {
  const pool = Buffer.alloc(b.length + 5);
  b.copy(pool, 5);
  return pool.subarray(5);
}

function bytes(a: ArrayBufferView): Buffer {
  return Buffer.from(a.buffer, a.byteOffset, a.byteLength);
}

function expectSameArray(a: ArrayBufferView, b: ArrayBufferView, what: string): void {
  expect(a.constructor.name, what).toBe(b.constructor.name);
  expect(a.byteLength, what).toBe(b.byteLength);
  expect(bytes(a).equals(bytes(b)), what).toBe(true);
}

/** The builder's result for each spectrum against storeSpectrum(decodePeaks(packed)). */
function checkAgainstStoreSpectrum(list: Buffer[], tolerance: number, noiseFloor: number): void {
  const builder = new StoredColumnsBuilder(tolerance, noiseFloor);
  list.forEach((b, i) => builder.add(100 + i, 1 + (i % 7), unaligned(b)));
  const cols = builder.finish();
  expect(cols.count).toBe(list.length);
  expect(Array.from(cols.spectrumIds)).toEqual(list.map((_, i) => 100 + i));
  expect(Array.from(cols.recordIds)).toEqual(list.map((_, i) => 1 + (i % 7)));
  let at = 0;
  list.forEach((b, i) => {
    const want = storeSpectrum(decodePeaks(b), tolerance, noiseFloor);
    const s = cols.offsets[i];
    const e = cols.offsets[i + 1];
    expect(s, `offset of spectrum ${i}`).toBe(at);
    expectSameArray(Int32Array.from((cols.bins as Int32Array).subarray(s, e)), want.bins, `bins of spectrum ${i} (tolerance ${tolerance}, noise floor ${noiseFloor})`);
    expectSameArray(cols.rel.slice(s, e), want.rel, `rel of spectrum ${i} (tolerance ${tolerance}, noise floor ${noiseFloor})`);
    at = e;
  });
  expect(cols.offsets[list.length]).toBe(at);
  expect(cols.bins.length).toBe(at);
  expect(cols.rel.length).toBe(at);
}

/** Spectra that take the one-pass route: valid, sorted, centroided. */
function centroidedSpectra(seed: number, count: number): Peak[][] {
  const r = rng(seed);
  const out: Peak[][] = [];
  for (let k = 0; k < count; k++) {
    const n = 1 + Math.floor(r() * 90);
    const peaks: Peak[] = [];
    const accurate = r() < 0.3;
    for (let i = 0; i < n; i++) {
      const mz = accurate ? 20 + r() * 600 : 20 + Math.floor(r() ** 2 * 600);
      peaks.push([mz, r() < 0.05 ? 1e-3 : 1 + Math.floor(r() ** 3 * 9999)]);
    }
    peaks.sort((a, b) => a[0] - b[0]);
    // Spread out repeats so that most spectra are not profile data.
    out.push(peaks);
  }
  return out;
}

/** Hand-made cases for the checks the one-pass route makes and the general route covers. */
const EDGE_CASES: Record<string, Peak[]> = {
  empty: [],
  'one peak': [[77, 5]],
  'duplicate m/z': [[41, 10], [41, 30], [43, 100], [43, 100], [57, 3]],
  'duplicate m/z, unsorted': [[57, 3], [41, 10], [43, 100], [41, 30], [43, 7]],
  'non-integer m/z into one bin': [[76.6, 10], [77.0, 20], [77.4, 30], [77.5, 40], [78.49, 5], [105.0699, 80]],
  'half-way m/z': [[0.5, 1], [1.5, 2], [2.5, 3], [76.5, 4], [77.5, 5], [99.5, 6]],
  'accurate masses': [[39.0229, 120], [51.0229, 180], [77.0386, 999], [91.0542, 310], [105.0335, 12.5]],
  unsorted: [[91, 100], [39, 12], [65, 20], [92, 60], [63, 8], [51, 10]],
  'zero-intensity peaks': [[39, 0], [41, 12], [43, 0], [57, 100], [71, 0]],
  'negative intensity and m/z': [[-5, 10], [0, 20], [41, -3], [43, 50], [57, 100]],
  'only zero intensities': [[41, 0], [43, 0]],
  'NaN and Infinity': [[NaN, 10], [41, NaN], [43, Infinity], [Infinity, 5], [57, 100], [71, 20]],
  'm/z below one half (bin 0)': [[0.2, 10], [0.49, 20], [1, 30], [30, 100]],
  'profile data': Array.from({ length: 40 }, (_, i) => [50 + i * 0.1, 10 + 100 * Math.exp(-(((i % 10) - 5) ** 2) / 4)] as Peak),
  'profile data, unsorted': Array.from({ length: 30 }, (_, i) => [80 + ((i * 7) % 30) * 0.05, 1 + ((i * 13) % 30)] as Peak),
  'half the gaps close (centroided)': [[40, 10], [40.1, 20], [41, 30]],
  'more than half the gaps close (profile)': [[40, 10], [40.1, 20], [40.2, 30], [41, 5]],
  'two close points (too few for profile)': [[40, 10], [40.1, 20]],
  'tiny and huge intensities': [[41, 1e-30], [43, 3e38], [57, 2e38], [71, 1e-45]],
  'large m/z': [[1e6 + 0.25, 10], [2 ** 31 + 0.5, 20], [3e9, 30]],
};

const TOLERANCES = [1, 0.5, 0.1, 2.5];
const NOISE_FLOORS = [0, 0.01, 0.2];

describe('StoredColumnsBuilder', () => {
  it('equals storeSpectrum(decodePeaks(packed)) bit for bit on seeded centroided spectra, at every tolerance and noise floor', () => {
    const list = centroidedSpectra(7, 300).map((p) => encodePeaks(p));
    for (const tolerance of TOLERANCES) for (const noiseFloor of NOISE_FLOORS) checkAgainstStoreSpectrum(list, tolerance, noiseFloor);
  });

  it('equals storeSpectrum(decodePeaks(packed)) on the edge cases: duplicates, zero intensities, unsorted, non-integer m/z, profile data', () => {
    const list = Object.values(EDGE_CASES).map((p) => packUnchecked(p));
    for (const tolerance of TOLERANCES) for (const noiseFloor of NOISE_FLOORS) checkAgainstStoreSpectrum(list, tolerance, noiseFloor);
    // Each case alone too, so no case hides behind a neighbour's offsets.
    for (const [name, peaks] of Object.entries(EDGE_CASES)) {
      const b = new StoredColumnsBuilder();
      b.add(1, 1, packUnchecked(peaks));
      const cols = b.finish();
      const want = storeSpectrum(decodePeaks(packUnchecked(peaks)));
      expectSameArray(Int32Array.from(cols.bins as Int32Array), want.bins, name);
      expectSameArray(Float32Array.from(cols.rel), want.rel, name);
    }
  });

  it('equals storeSpectrum on seeded random spectra mixing every kind of oddity', () => {
    const r = rng(4242);
    const list: Buffer[] = [];
    for (let k = 0; k < 400; k++) {
      const n = Math.floor(r() * 40);
      const peaks: Peak[] = [];
      for (let i = 0; i < n; i++) {
        const kind = r();
        const mz = kind < 0.1 ? 30 + Math.floor(r() * 5) + Math.floor(r() * 4) * 0.1 : kind < 0.15 ? -r() * 5 : 20 + (r() < 0.5 ? Math.floor(r() * 300) : r() * 300);
        const y = r() < 0.1 ? 0 : r() < 0.03 ? -1 : Math.floor(r() * 1000) * (r() < 0.5 ? 1 : 0.001);
        peaks.push([mz, y]);
      }
      if (r() < 0.6) peaks.sort((a, b) => a[0] - b[0]);
      list.push(packUnchecked(peaks));
    }
    for (const tolerance of TOLERANCES) for (const noiseFloor of NOISE_FLOORS) checkAgainstStoreSpectrum(list, tolerance, noiseFloor);
  });

  it('joins its blocks in order past a million peaks', () => {
    const r = rng(99);
    const list: Buffer[] = [];
    let total = 0;
    while (total < 1.3e6) {
      const n = 60 + Math.floor(r() * 40);
      const peaks: Peak[] = Array.from({ length: n }, (_, i) => [30 + i * 3, 1 + Math.floor(r() * 999)] as Peak);
      // now and then one spectrum needs the general route
      if (r() < 0.02) peaks.reverse();
      list.push(encodePeaks(peaks));
      total += n;
    }
    checkAgainstStoreSpectrum(list, 1, 0);
  });

  it('rejects malformed buffers with the errors decodePeaks gives', () => {
    const good = encodePeaks([[41, 1], [43, 2]]);
    const wrongMagic = Buffer.from(good);
    wrongMagic.write('XPK1', 0, 'ascii');
    const short = good.subarray(0, good.length - 1);
    const tiny = good.subarray(0, 5);
    for (const bad of [wrongMagic, short, tiny, 'not bytes' as unknown as Uint8Array, null as unknown as Uint8Array]) {
      let want = '';
      try {
        decodePeaks(bad);
      } catch (e) {
        want = (e as Error).message;
      }
      expect(want).not.toBe('');
      const b = new StoredColumnsBuilder();
      expect(() => b.add(1, 1, bad)).toThrow(new RangeError(want));
    }
  });

  it('checks its options as the index does', () => {
    expect(() => new StoredColumnsBuilder(0)).toThrow(RangeError);
    expect(() => new StoredColumnsBuilder(1, 1)).toThrow(RangeError);
  });
});

function metaOf(e: LibraryEntry): EntryMeta {
  const { peaks: _peaks, ...meta } = e;
  return meta;
}

/** Every array of two segments, byte for byte (the segment id aside). */
function expectSameSegment(a: SearchIndex, b: SearchIndex): void {
  const sa = a.segment;
  const sb = b.segment;
  for (const k of ['n', 'nPeaks', 'nBins', 'tolerance', 'maxDocPeaks'] as const) expect(sa[k], k).toBe(sb[k]);
  expect(sa.weights).toEqual(sb.weights);
  for (const k of ['docStart', 'fBin', 'fW', 'fRel', 'docNorm', 'recordId', 'spectrumId', 'pStart', 'pDoc', 'pW', 'pE', 'binMaxW', 'binMaxE', 'live'] as const) {
    expectSameArray(sa[k], sb[k], k);
  }
}

describe('SearchIndex.fromColumns over StoredColumnsBuilder', () => {
  it('makes the same index as SearchIndex.build over the decoded entries: segment, metadata, search results', () => {
    for (let seed = 1; seed <= 3; seed++) {
      const entries = randomLibrary(seed, 500);
      // the edge cases join the library, with the peaks as decodePeaks gives them back
      Object.values(EDGE_CASES).forEach((peaks, i) => {
        entries.push({ ...entries[i], spectrumId: 90_000 + i, recordId: 5 + i * 3, peaks });
      });
      const packed = entries.map((e) => packUnchecked(e.peaks));
      const decoded = entries.map((e, i) => ({ ...e, peaks: decodePeaks(packed[i]) }));
      const old = SearchIndex.build(decoded);
      const builder = new StoredColumnsBuilder();
      entries.forEach((e, i) => builder.add(e.spectrumId, e.recordId, unaligned(packed[i])));
      const fast = SearchIndex.fromColumns(builder.finish(), {}, entries.map(metaOf));

      expectSameSegment(fast, old);
      expect(fast.size).toBe(old.size);
      for (const s of ['released', 'in_review', 'draft'] as const) expect(fast.countByStatus(s)).toBe(old.countByStatus(s));
      const metaAt = (ix: SearchIndex, d: number) => (ix as unknown as { metaAt(d: number): EntryMeta }).metaAt(d);
      for (let d = 0; d < old.segment.n; d++) expect(metaAt(fast, d)).toEqual(metaAt(old, d));

      const r = rng(seed * 31);
      for (let qi = 0; qi < 6; qi++) {
        const q = noisyQuery(r, decoded[Math.floor(r() * decoded.length)].peaks);
        for (const filters of FILTER_CASES) {
          for (const rankBy of SCORE_NAMES) {
            const options = { rankBy, limit: 40 };
            const a = fast.search(q, options, filters);
            const b = old.search(q, options, filters);
            expect(a.hits).toEqual(b.hits);
            expect(a.searched).toBe(b.searched);
          }
          // other weights and a low-mass cutoff re-preprocess the stored library side
          const a = fast.search(q, { weights: { mz: 1, intensity: 0.5 }, lowMassCutoff: 45, excludeIons: [73], noiseFloor: 0.02 }, filters);
          const b = old.search(q, { weights: { mz: 1, intensity: 0.5 }, lowMassCutoff: 45, excludeIons: [73], noiseFloor: 0.02 }, filters);
          expect(a.hits).toEqual(b.hits);
        }
      }
    }
  });
});
