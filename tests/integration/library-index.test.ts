// The start-up load of the search index (src/lib/library-index.ts) against
// the test database: the columnar rebuild makes the same index as building
// from LibraryEntry objects (the way it was done before), on versions seeded
// here with every status, tags, retention indices, missing metadata and odd
// peak lists; and the polling sync still applies changes on top of it. The
// database is shared across test files, so comparisons are scoped to the
// records made here (they all carry this run's tag).
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import crypto from 'node:crypto';
import { QueryTypes } from 'sequelize';
import { useTestDatabase } from '../helpers/db';
import { packUnchecked } from '../helpers/packed-peaks';
import { closeSequelize } from '../../src/lib/db/sequelize';
import { bumpLibraryVersion } from '../../src/lib/library-state';
import {
  buildLibraryIndexFromEntries,
  getLibraryIndex,
  libraryIndexStatus,
  rebuildLibraryIndex,
  stopLibraryIndexPolling,
  syncLibraryIndex,
} from '../../src/lib/library-index';
import { closeSearchPool, type SearchIndex } from '../../src/lib/search/index';
import type { EntryMeta } from '../../src/lib/search/filters';
import { SCORE_NAMES, type Peak, type SearchFilters } from '../../src/lib/search/types';
import { encodePeaks } from '../../src/lib/spectra/index';

const sequelize = useTestDatabase();
afterAll(async () => {
  stopLibraryIndexPolling();
  await closeSearchPool();
  await closeSequelize();
});

const RUN = crypto.randomBytes(3).toString('hex');
const TAG = `load-${RUN}`;
const EXTRA = `load-extra-${RUN}`;

interface Spec {
  formula: string | null;
  nominalMass: number | null;
  ihd: number | null;
  elements: string | null;
  tags: string[];
  versions: { status: string; peaks: Buffer; ri?: { phase: string; value: number }[] }[];
}

const BASE: Peak[] = [[41, 20], [43, 100], [57, 45], [71, 12], [85, 30], [114, 3]];
const SPECS: Spec[] = [
  { formula: 'C8H18', nominalMass: 114, ihd: 0, elements: 'C,H', tags: [TAG, EXTRA], versions: [{ status: 'released', peaks: encodePeaks(BASE), ri: [{ phase: 'non-polar', value: 800 }, { phase: 'polar', value: 810 }] }] },
  // an older superseded version and a newer released one; a draft on top
  {
    formula: 'C6H5Cl', nominalMass: 112, ihd: 4, elements: 'C,Cl,H', tags: [TAG],
    versions: [
      { status: 'superseded', peaks: encodePeaks([[77, 100], [112, 80], [114, 26]]) },
      { status: 'released', peaks: encodePeaks([[51, 12], [77, 100], [112, 80], [114, 26]]), ri: [{ phase: 'non-polar', value: 1035 }] },
      { status: 'draft', peaks: encodePeaks([[51, 12], [77, 100], [112, 81], [114, 26]]) },
    ],
  },
  // duplicate m/z and zero-intensity peaks
  { formula: 'C7H8', nominalMass: 92, ihd: 4, elements: 'C,H', tags: [TAG, EXTRA], versions: [{ status: 'released', peaks: encodePeaks([[39, 10], [65, 0], [91, 60], [91, 40], [92, 70], [93, 0]]) }] },
  // unsorted, non-integer m/z landing in one bin, NaN and negative entries
  { formula: 'C6H6', nominalMass: 78, ihd: 4, elements: 'C,H', tags: [TAG], versions: [{ status: 'in_review', peaks: packUnchecked([[78.0464, 100], [51.0229, 18], [52.03, 20], [NaN, 5], [50.6, 9], [77.5, 23], [-3, 2], [39.4, 0]]), ri: [{ phase: 'non-polar', value: 653 }] }] },
  // profile data, which the index centroids
  {
    formula: 'C4H10O', nominalMass: 74, ihd: 0, elements: 'C,H,O', tags: [TAG],
    versions: [{ status: 'released', peaks: encodePeaks(Array.from({ length: 60 }, (_, i) => [40 + i * 0.1, 5 + 90 * Math.exp(-(((i % 15) - 7) ** 2) / 6)] as Peak)) }],
  },
  // no formula, mass, IHD or elements; a retired version and a released one
  {
    formula: null, nominalMass: null, ihd: null, elements: null, tags: [TAG],
    versions: [{ status: 'retired', peaks: encodePeaks(BASE) }, { status: 'released', peaks: encodePeaks([[44, 100], [28, 30], [16, 8]]) }],
  },
  // only a draft; only zero intensities (stored, matches nothing)
  { formula: 'CH4O', nominalMass: 32, ihd: 0, elements: 'C,H,O', tags: [TAG], versions: [{ status: 'draft', peaks: encodePeaks([[31, 100], [32, 70], [29, 40], [15, 10]]) }] },
  { formula: 'H2O', nominalMass: 18, ihd: 0, elements: 'H,O', tags: [TAG], versions: [{ status: 'released', peaks: encodePeaks([[18, 0], [17, 0]]) }] },
  // unsorted but otherwise plain, accurate masses
  { formula: 'C7H7', nominalMass: 91, ihd: 4.5, elements: 'C,H', tags: [TAG, EXTRA], versions: [{ status: 'released', peaks: encodePeaks([[91.0542, 100], [39.0229, 12], [65.0386, 20], [92.0575, 60], [63.0229, 8], [90.6, 10]]) }] },
  // a retired record: nothing of it is indexed
  { formula: 'C2H6O', nominalMass: 46, ihd: 0, elements: 'C,H,O', tags: [TAG], versions: [{ status: 'retired', peaks: encodePeaks([[31, 100], [45, 50], [46, 20]]) }] },
];

/** version row id -> status, for the versions made here */
const versions = new Map<number, { recordId: number; status: string }>();
const recordIds: number[] = [];

async function insert(sql: string, replacements: unknown[]): Promise<number> {
  const [id] = (await sequelize.query(sql, { replacements, type: QueryTypes.INSERT })) as unknown as [number];
  return Number(id);
}

beforeAll(async () => {
  const now = new Date();
  const tagIds = new Map<string, number>();
  for (const t of [TAG, EXTRA]) tagIds.set(t, await insert('INSERT INTO tag (name, createdAt, updatedAt) VALUES (?,?,?)', [t, now, now]));
  for (const [k, spec] of SPECS.entries()) {
    const name = `Load probe ${RUN} ${k}`;
    const compoundId = await insert('INSERT INTO compound (name, nameKey, formula, createdAt, updatedAt) VALUES (?,?,?,?,?)', [name, name.toLowerCase(), spec.formula, now, now]);
    const released = spec.versions.map((v, i) => (v.status === 'released' ? i + 1 : null)).filter(Boolean).pop() ?? null;
    const recordId = await insert(
      'INSERT INTO spectrum_record (compoundId, latestVersion, releasedVersion, synthetic, createdAt, updatedAt) VALUES (?,?,?,1,?,?)',
      [compoundId, spec.versions.length, released, now, now],
    );
    recordIds.push(recordId);
    for (const [i, v] of spec.versions.entries()) {
      const id = await insert(
        `INSERT INTO spectrum_version (recordId, version, status, name, synonyms, formula, nominalMass, ihd, elements, metadata, editors, peaks, peakCount, contentHash, synthetic, createdAt, updatedAt)
           VALUES (?,?,?,?,'[]',?,?,?,?,'{}','[]',?,?,?,1,?,?)`,
        [recordId, i + 1, v.status, `${name} v${i + 1}`, spec.formula, spec.nominalMass, spec.ihd, spec.elements, v.peaks, v.peaks.readUInt32LE(4), crypto.randomBytes(32).toString('hex'), now, now],
      );
      versions.set(id, { recordId, status: v.status });
      for (const ri of v.ri ?? []) await insert('INSERT INTO retention_index (spectrumVersionId, phase, value) VALUES (?,?,?)', [id, ri.phase, ri.value]);
    }
    for (const t of spec.tags) await insert('INSERT INTO record_tag (recordId, tagId) VALUES (?,?)', [recordId, tagIds.get(t)]);
  }
  await bumpLibraryVersion();
});

const INDEXED = ['released', 'in_review', 'draft'];
const ALL: SearchFilters['status'] = ['released', 'in_review', 'draft'];

function docOf(index: SearchIndex, spectrumId: number): number {
  const seg = index.segment;
  for (let d = 0; d < seg.n; d++) if (seg.spectrumId[d] === spectrumId && seg.live[d]) return d;
  return -1;
}

function metaAt(index: SearchIndex, d: number): EntryMeta {
  return (index as unknown as { metaAt(d: number): EntryMeta }).metaAt(d);
}

/** One doc's stored arrays as bytes, so equality is bit for bit. */
function docBytes(index: SearchIndex, d: number) {
  const seg = index.segment;
  const s = seg.docStart[d];
  const e = seg.docStart[d + 1];
  const b = (a: ArrayBufferView & { subarray(s: number, e: number): ArrayBufferView }) => {
    const v = a.subarray(s, e);
    return Buffer.from(v.buffer, v.byteOffset, v.byteLength).toString('hex');
  };
  return { bins: Array.from(seg.fBin.subarray(s, e)), w: b(seg.fW), rel: b(seg.fRel), norm: seg.docNorm[d] };
}

const mine = (): number[] => [...versions.entries()].filter(([, v]) => INDEXED.includes(v.status)).map(([id]) => id);

describe('rebuildLibraryIndex (columnar load)', () => {
  it('makes the same index as building from LibraryEntry objects: stored peaks, weights and metadata of every version', async () => {
    await rebuildLibraryIndex();
    const fast = getLibraryIndex();
    const old = await buildLibraryIndexFromEntries();
    expect(libraryIndexStatus().ready).toBe(true);
    expect(fast.options).toEqual(old.options);
    for (const [id, v] of versions) {
      const a = docOf(fast, id);
      const b = docOf(old, id);
      if (!INDEXED.includes(v.status)) {
        expect(a, `version ${id} (${v.status}) left out`).toBe(-1);
        expect(b).toBe(-1);
        continue;
      }
      expect(a, `version ${id} (${v.status}) indexed`).toBeGreaterThanOrEqual(0);
      expect(docBytes(fast, a)).toEqual(docBytes(old, b));
      expect(metaAt(fast, a)).toEqual(metaAt(old, b));
      expect(metaAt(fast, a).tags.slice().sort()).toEqual(SPECS[recordIds.indexOf(v.recordId)].tags.slice().sort());
    }
    // the edge cases were stored as they should be: the zero-only spectrum is empty, the profile one centroided
    const water = [...versions].find(([, v]) => v.recordId === recordIds[7])![0];
    expect(docBytes(fast, docOf(fast, water)).bins).toEqual([]);
    const ether = [...versions].find(([, v]) => v.recordId === recordIds[4])![0];
    expect(docBytes(fast, docOf(fast, ether)).bins.length).toBeLessThan(10);
  });

  it('answers searches and filters (formula, elements, IHD, mass, tags, status, RI) exactly as the object-built index does', async () => {
    const fast = getLibraryIndex();
    const old = await buildLibraryIndexFromEntries();
    const filters: SearchFilters[] = [
      { tags: [TAG] },
      { tags: [TAG], status: ALL },
      { tags: [TAG, EXTRA], status: ALL },
      { tags: [TAG], formula: 'C7H8' },
      { tags: [TAG], formula: 'ClH5C6', status: ALL },
      { tags: [TAG], elements: ['Cl'], status: ALL },
      { tags: [TAG], excludeElements: ['Cl'], ihdMin: 1, ihdMax: 4, status: ALL },
      { tags: [TAG], massMin: 70, massMax: 115, status: ALL },
      { tags: [TAG], status: ['in_review'] },
      { tags: [TAG], status: ['draft'] },
      { tags: [TAG], ri: { value: 1030, window: 10, phase: 'non-polar' }, status: ALL },
      { tags: [TAG], ri: { value: 800, window: 5, phase: 'non-polar', penalty: 0.3 }, status: ALL },
    ];
    const queries: Peak[][] = [BASE, [[77, 100], [112, 70], [51, 10]], [[91, 100], [92, 60], [65, 8]], [[78, 100], [52, 20], [51, 15]], [[44, 100], [28, 20]], [[40.7, 50], [41.2, 90], [44, 30]]];
    let nonEmpty = 0;
    for (const q of queries) {
      for (const f of filters) {
        for (const rankBy of SCORE_NAMES) {
          const a = fast.search(q, { rankBy, limit: 20 }, f);
          const b = old.search(q, { rankBy, limit: 20 }, f);
          expect(a.hits).toEqual(b.hits);
          expect(a.searched).toBe(b.searched);
          if (a.hits.length > 0) nonEmpty++;
        }
        const opts = { weights: { mz: 1, intensity: 0.5 }, lowMassCutoff: 40, excludeIons: [43], noiseFloor: 0.05 };
        expect(fast.search(q, opts, f).hits).toEqual(old.search(q, opts, f).hits);
      }
    }
    expect(nonEmpty).toBeGreaterThan(50);
    // the released version of each record is its own top hit
    const chloro = [...versions].find(([, v]) => v.recordId === recordIds[1] && v.status === 'released')![0];
    const top = fast.search([[51, 12], [77, 100], [112, 80], [114, 26]], { limit: 1 }, { tags: [TAG] }).hits[0];
    expect(top.recordId).toBe(recordIds[1]);
    expect(top.spectrumId).toBe(chloro);
    expect(top.version).toBe(2);
    expect(docOf(fast, chloro)).toBeGreaterThanOrEqual(0);
  });

  it('leaves the polling sync working on top of it: a new release replaces the old version, a retired record goes', async () => {
    await rebuildLibraryIndex();
    const index = getLibraryIndex();
    const before = mine();
    for (const id of before) expect(index.has(id)).toBe(true);

    // record 0: version 1 superseded by a new released version 2
    const recordId = recordIds[0];
    const v1 = [...versions].find(([, v]) => v.recordId === recordId)![0];
    const now = new Date(Date.now() + 5);
    const peaks = encodePeaks([[41, 25], [43, 100], [57, 50], [71, 15], [85, 33], [99, 4], [114, 5]]);
    const v2 = await insert(
      `INSERT INTO spectrum_version (recordId, version, status, name, synonyms, formula, nominalMass, ihd, elements, metadata, editors, peaks, peakCount, contentHash, synthetic, createdAt, updatedAt)
         VALUES (?,2,'released',?,'[]','C8H18',114,0,'C,H','{}','[]',?,7,?,1,?,?)`,
      [recordId, `Load probe ${RUN} 0 v2`, peaks, crypto.randomBytes(32).toString('hex'), now, now],
    );
    await sequelize.query("UPDATE spectrum_version SET status = 'superseded', updatedAt = ? WHERE id = ?", { replacements: [now, v1] });
    // record 2: retired
    const retired = [...versions].find(([, v]) => v.recordId === recordIds[2])![0];
    await sequelize.query("UPDATE spectrum_version SET status = 'retired', updatedAt = ? WHERE id = ?", { replacements: [now, retired] });
    await bumpLibraryVersion();

    await syncLibraryIndex();
    expect(index.has(v1)).toBe(false);
    expect(index.has(retired)).toBe(false);
    expect(index.has(v2)).toBe(true);
    const hit = index.search([[41, 25], [43, 100], [57, 50], [71, 15], [85, 33], [99, 4], [114, 5]], { limit: 3 }, { tags: [TAG] }).hits[0];
    expect(hit.recordId).toBe(recordId);
    expect(hit.spectrumId).toBe(v2);
    expect(hit.version).toBe(2);
    expect(hit.scores.cosine).toBeCloseTo(1, 6);
    expect(index.search([[91, 100], [92, 60], [39, 10]], { limit: 20 }, { tags: [TAG], status: ALL }).hits.some((h) => h.recordId === recordIds[2])).toBe(false);

    // a fresh rebuild agrees with what the sync made, for these records
    versions.set(v2, { recordId, status: 'released' });
    versions.set(v1, { recordId, status: 'superseded' });
    versions.set(retired, { recordId: recordIds[2], status: 'retired' });
    await rebuildLibraryIndex();
    const rebuilt = getLibraryIndex();
    for (const [id, v] of versions) expect(rebuilt.has(id), `version ${id}`).toBe(INDEXED.includes(v.status));
    const old = await buildLibraryIndexFromEntries();
    for (const id of mine()) {
      expect(docBytes(rebuilt, docOf(rebuilt, id))).toEqual(docBytes(old, docOf(old, id)));
      expect(metaAt(rebuilt, docOf(rebuilt, id))).toEqual(metaAt(old, docOf(old, id)));
    }
  });
});
