// Shared set-up of the curation integration tests: people of our own (the
// database is shared with other test files), fixtures, row counts.
import crypto from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import { QueryTypes, type Sequelize } from 'sequelize';
import { hashPassword } from 'better-auth/crypto';
import type { Actor } from '../../../src/lib/curation';
import type { Role } from '../../../src/lib/roles';

export const PASSWORD = 'curation-test-password-1';
export const SPECTRA_FIXTURES = path.resolve('tests/fixtures/jcamp');
export const IMPORT_FIXTURES = path.resolve('tests/fixtures/import');

/** A unique token per test run, so names do not collide with rows other files made. */
export const RUN = crypto.randomBytes(4).toString('hex');

export async function createUser(sequelize: Sequelize, label: string, roles: Role[]): Promise<Actor> {
  const id = crypto.randomUUID();
  const email = `${label}-${RUN}-${id.slice(0, 6)}@curation.test`;
  const now = new Date();
  await sequelize.query('INSERT INTO `user` (id, name, email, emailVerified, roles, active, createdAt, updatedAt) VALUES (?,?,?,?,?,?,?,?)', {
    replacements: [id, `${label} ${RUN}`, email, 1, roles.join(','), 1, now, now], type: QueryTypes.INSERT,
  });
  await sequelize.query('INSERT INTO account (id, accountId, providerId, userId, password, createdAt, updatedAt) VALUES (?,?,?,?,?,?,?)', {
    replacements: [crypto.randomUUID(), id, 'credential', id, await hashPassword(PASSWORD), now, now], type: QueryTypes.INSERT,
  });
  return { id, email, name: `${label} ${RUN}`, roles };
}

export async function libraryCounts(sequelize: Sequelize) {
  const [r] = await sequelize.query<{ c: number; r: number; v: number; ri: number }>(
    'SELECT (SELECT COUNT(*) FROM compound) AS c, (SELECT COUNT(*) FROM spectrum_record) AS r, (SELECT COUNT(*) FROM spectrum_version) AS v, (SELECT COUNT(*) FROM retention_index) AS ri',
    { type: QueryTypes.SELECT },
  );
  return { compounds: Number(r.c), records: Number(r.r), versions: Number(r.v), retentionIndices: Number(r.ri) };
}

export function fixture(dir: string, name: string): Buffer {
  return fs.readFileSync(path.join(dir, name));
}

/** A small peak-table file for a compound of our own. */
export function peakTableFile(opts: { title: string; names?: string[]; formula?: string | null; cas?: string | null; mw?: number | null; energy?: number | null; peaks: [number, number][]; extra?: string[] }): string {
  const lines = [`##TITLE= ${opts.title}`, '##JCAMP-DX= 5.01', '##DATA TYPE= MASS SPECTRUM', '##ORIGIN= Curation tests (invented)', '##OWNER= test'];
  if (opts.names?.length) lines.push(`##NAMES= ${opts.names.join('\n')}`);
  if (opts.formula) lines.push(`##MOLFORM= ${opts.formula}`);
  if (opts.cas) lines.push(`##CAS REGISTRY NO= ${opts.cas}`);
  if (opts.mw !== undefined && opts.mw !== null) lines.push(`##MW= ${opts.mw}`);
  if (opts.energy !== null) lines.push(`##.IONIZATION ENERGY= ${opts.energy ?? 70}`);
  lines.push(...(opts.extra ?? []));
  lines.push(`##NPOINTS= ${opts.peaks.length}`, '##PEAK TABLE= (XY..XY)');
  for (const [mz, i] of opts.peaks) lines.push(`${mz}, ${i}`);
  lines.push('##END=', '');
  return lines.join('\n');
}

/** Deterministic pseudo-random numbers (mulberry32) for seeded tests. */
export function rng(seed: number) {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** A random but plausible EI spectrum: distinct each call. */
export function randomPeaks(next: () => number, n = 12, maxMz = 300): [number, number][] {
  const set = new Map<number, number>();
  while (set.size < n) set.set(15 + Math.floor(next() * (maxMz - 15)), Math.max(1, Math.round(next() * 999)));
  const peaks = [...set.entries()].sort((a, b) => a[0] - b[0]);
  peaks[Math.floor(next() * peaks.length)][1] = 999;
  return peaks;
}

export async function storedPeaks(sequelize: Sequelize, recordId: number, version = 1): Promise<[number, number][]> {
  const { decodePeaks } = await import('../../../src/lib/spectra/decodePeaks');
  const [v] = await sequelize.query<{ peaks: Buffer }>('SELECT peaks FROM spectrum_version WHERE recordId = ? AND version = ?', {
    replacements: [recordId, version], type: QueryTypes.SELECT,
  });
  return decodePeaks(v.peaks);
}

/** Float32 intensities: compare to about 7 significant digits. */
export function expectPeaksEqual(actual: [number, number][], expected: [number, number][]) {
  if (actual.length !== expected.length) throw new Error(`expected ${expected.length} peaks, got ${actual.length}: ${JSON.stringify(actual)}`);
  actual.forEach(([mz, i], k) => {
    const [emz, ei] = expected[k];
    if (Math.abs(mz - emz) > 1e-9 * Math.max(1, emz) || Math.abs(i - ei) > 1e-6 * Math.max(1, Math.abs(ei))) {
      throw new Error(`peak ${k}: expected [${emz}, ${ei}], got [${mz}, ${i}]`);
    }
  });
}

let casCounter = 0;
/** A registry number of this run with a valid check digit (CAS's rule), unique per call. */
export function uniqueCas(): string {
  const body = String((parseInt(RUN, 16) % 900000) * 10 + (casCounter++ % 10) + 1000000).slice(-7);
  const digits = body.replace(/^0+/, '') || '1';
  let sum = 0;
  for (let i = 0; i < digits.length; i++) sum += Number(digits[digits.length - 1 - i]) * (i + 1);
  return `${digits.slice(0, -2)}-${digits.slice(-2)}-${sum % 10}`;
}
