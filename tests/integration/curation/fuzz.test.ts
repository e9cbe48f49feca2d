// A seeded fuzz through the import pipeline: valid files mutated 1,200 times
// (bytes dropped, repeated, swapped, replaced; lines cut, doubled, reordered;
// numbers made NaN, Infinity, negative or huge; labels broken). Each result
// must be a report with a known status, a rejection must say why, and the
// library's row counts grow only by what the reports say was stored.
import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import fs from 'node:fs';
import path from 'node:path';
import { useTestDatabase } from '../../helpers/db';
import { closeSequelize } from '../../../src/lib/db/sequelize';
import { importFile, type Actor } from '../../../src/lib/curation';
import { verifyAuditChain } from '../../../src/lib/audit';
import { RUN, SPECTRA_FIXTURES, IMPORT_FIXTURES, createUser, libraryCounts, peakTableFile, rng, randomPeaks } from './helpers';

const sequelize = useTestDatabase();
afterAll(() => closeSequelize());

const SEED = 20240611;
const MUTATIONS = 1200;
const STATUSES = ['imported', 'duplicate', 'rejected', 'needs_selection', 'needs_confirmation'];

let curator: Actor;
beforeAll(async () => {
  curator = await createUser(sequelize, 'fuzzer', ['curator']);
});

function seeds(): Buffer[] {
  // names of the fuzz's own and no registry numbers: it makes no compound the other tests use
  const own = (b: Buffer) => Buffer.from(b.toString('latin1').replace(/##(TITLE|title|NAMES)=\s?/g, (m) => `${m.trimEnd()} Fuzz ${RUN} `).replace(/^##CAS REGISTRY NO=.*\n/gim, ''), 'latin1');
  const files = [
    ...fs.readdirSync(SPECTRA_FIXTURES).filter((f) => f.endsWith('.jdx')).map((f) => own(fs.readFileSync(path.join(SPECTRA_FIXTURES, f)))),
    ...fs.readdirSync(IMPORT_FIXTURES).filter((f) => f.endsWith('.jdx')).map((f) => own(fs.readFileSync(path.join(IMPORT_FIXTURES, f)))),
  ];
  const next = rng(SEED + 1);
  for (let i = 0; i < 4; i++) files.push(Buffer.from(peakTableFile({ title: `Fuzz base ${i} ${RUN}`, formula: 'C8H8O', peaks: randomPeaks(next, 20) })));
  return files;
}

const NASTY = ['NaN', 'Infinity', '-Infinity', '-1', '0', '1e999', '?', '##', '$$', '=', ',', ';', '\u0000', '\u00ff', '\r', '\t', '1.5e308', '-0', '9'.repeat(40), '##END=', '##TITLE=', '##NTUPLES=', '##PAGE='];

function mutate(input: Buffer, next: () => number): Buffer {
  const pick = <T>(xs: T[]) => xs[Math.floor(next() * xs.length)];
  let text = input.toString('latin1');
  const rounds = 1 + Math.floor(next() * 3);
  for (let r = 0; r < rounds; r++) {
    const lines = text.split('\n');
    const at = Math.floor(next() * Math.max(1, text.length));
    switch (Math.floor(next() * 10)) {
      case 0: text = text.slice(0, at) + text.slice(at + 1 + Math.floor(next() * 20)); break; // drop bytes
      case 1: text = text.slice(0, at) + pick(NASTY) + text.slice(at); break; // insert a nasty token
      case 2: text = text.slice(0, at); break; // truncate
      case 3: { const i = Math.floor(next() * lines.length); lines.splice(i, 0, lines[i] ?? ''); text = lines.join('\n'); break; } // repeat a line
      case 4: { const i = Math.floor(next() * lines.length); const j = Math.floor(next() * lines.length); [lines[i], lines[j]] = [lines[j], lines[i]]; text = lines.join('\n'); break; }
      case 5: text = text.replace(/\d+(\.\d+)?/g, (m) => (next() < 0.05 ? pick(NASTY) : m)); break; // numbers made strange
      case 6: { const i = Math.floor(next() * lines.length); lines.splice(i, 1); text = lines.join('\n'); break; } // drop a line
      case 7: text = text.slice(0, at) + String.fromCharCode(Math.floor(next() * 256)) + text.slice(at + 1); break; // replace a byte
      case 8: text = text.replace(/##([A-Z .$_-]+)=/gi, (m, l) => (next() < 0.1 ? `##${String(l).slice(1)}=` : m)); break; // damage labels
      default: text = text.replace(/(\d+), (\d+)/g, (m, x, y) => (next() < 0.2 ? `${x}, ${Math.floor(Number(y) * (0.5 + next()))}` : m)); break; // change intensities
    }
  }
  return Buffer.from(text, 'latin1');
}

describe('seeded fuzz of the importer', () => {
  it(`${MUTATIONS} mutated files: each imported or rejected with a message; rows grow only by what the reports say`, async () => {
    const bases = seeds();
    const next = rng(SEED);
    const tally: Record<string, number> = {};
    let expectedRecords = 0;
    const start = await libraryCounts(sequelize);
    for (let i = 0; i < MUTATIONS; i++) {
      const bytes = mutate(bases[Math.floor(next() * bases.length)], next);
      const name = next() < 0.03 ? `fuzz/${i}.jdx` : `fuzz-${i}.jdx`;
      const before = await libraryCounts(sequelize);
      let result;
      try {
        result = await importFile({ fileName: name, bytes, actor: curator });
      } catch (e) {
        throw new Error(`mutation ${i} threw instead of reporting: ${(e as Error).stack}`);
      }
      const { report } = result;
      tally[report.status] = (tally[report.status] ?? 0) + 1;
      expect(STATUSES, `mutation ${i}`).toContain(report.status);
      const after = await libraryCounts(sequelize);
      if (report.status === 'rejected') {
        expect(typeof report.error === 'string' && report.error.length > 5, `mutation ${i}: ${JSON.stringify(report)}`).toBe(true);
      }
      if (report.status !== 'imported') {
        expect(after, `mutation ${i} (${report.status}) changed the library`).toEqual(before);
      } else {
        expect(report.spectra.length).toBeGreaterThan(0);
        expect(after.records - before.records, `mutation ${i}`).toBe(report.spectra.length);
        expect(after.versions - before.versions, `mutation ${i}`).toBe(report.spectra.length);
        expect(after.compounds - before.compounds).toBeLessThanOrEqual(report.spectra.length);
      }
      expectedRecords += report.status === 'imported' ? report.spectra.length : 0;
    }
    const end = await libraryCounts(sequelize);
    expect(end.records - start.records).toBe(expectedRecords);
    // the mix says the fuzz reached both sides of the reader
    expect(tally.rejected).toBeGreaterThan(100);
    expect((tally.imported ?? 0) + (tally.duplicate ?? 0) + (tally.needs_confirmation ?? 0)).toBeGreaterThan(100);
    expect((await verifyAuditChain()).ok).toBe(true);
    console.log(`fuzz outcome (seed ${SEED}):`, JSON.stringify(tally));
  }, 600_000);
});
