// The demo seed, in a database of its own on the test server (the main test
// database is shared with other files): it fills an empty database with the
// scenario in one go, marks every spectrum synthetic, and refuses, touching
// nothing, a database that already holds a user or a record.
import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import { QueryTypes, type Sequelize } from 'sequelize';
import { createScratchDatabase, dropScratchDatabase } from '../helpers/db';
import { verifyPassword } from 'better-auth/crypto';
import { verifyAuditChain } from '../../src/lib/audit';
import { checkData } from '../../src/lib/ops/check-data';
import { decodePeaks, peakContentHash } from '../../src/lib/spectra/index';
import { seedDemo, DEMO_USERS } from '../../seeds/index';

const PASSWORD = 'seed-test-password-7';
const DB = 'seed_test';

let s: Sequelize;
type Row = Record<string, any>;
const q = (sql: string, replacements: unknown[] = []) => s.query<Row>(sql, { type: QueryTypes.SELECT, replacements });
const n = async (sql: string, replacements: unknown[] = []) => Number((await q(sql, replacements))[0].n);

const TABLES = ['user', 'account', 'compound', 'spectrum_record', 'spectrum_version', 'retention_index', 'tag', 'record_tag', 'signature', 'setting', 'audit_event'];
async function rowCounts() {
  const out: Record<string, number> = {};
  for (const t of TABLES) out[t] = await n(`SELECT COUNT(*) AS n FROM \`${t}\``);
  const [state] = await q('SELECT version FROM library_state WHERE id = 1');
  out.libraryVersion = Number(state.version);
  return out;
}

beforeAll(async () => {
  s = await createScratchDatabase(DB);
}, 120_000);

afterAll(() => dropScratchDatabase(DB, s));

describe('seedDemo', () => {
  it('refuses a database that already has a user, and changes nothing', async () => {
    const now = new Date();
    await s.query('INSERT INTO `user` (id, name, email, emailVerified, roles, active, createdAt, updatedAt) VALUES (?,?,?,?,?,?,?,?)', {
      replacements: ['00000000-0000-4000-8000-000000000001', 'Someone Already Here', 'first@seed.test', 1, 'admin', 1, now, now], type: QueryTypes.INSERT,
    });
    const before = await rowCounts();
    const r = await seedDemo(s, { password: PASSWORD });
    expect(r.seeded).toBe(false);
    expect(r.reason).toMatch(/not empty/);
    expect(await rowCounts()).toEqual(before);
    await s.query("DELETE FROM `user` WHERE email = 'first@seed.test'");
  });

  it('seeds an empty database: ≥ 180 records, ≥ 150 released, the rest in review or draft', async () => {
    const lines: string[] = [];
    const r = await seedDemo(s, { password: PASSWORD, log: (l) => lines.push(l) });
    expect(r.seeded).toBe(true);
    expect(lines.length).toBeGreaterThan(0);
    expect(r.counts.records).toBeGreaterThanOrEqual(180);
    expect(r.counts.released).toBeGreaterThanOrEqual(150);
    expect(r.counts.inReview).toBeGreaterThan(0);
    expect(r.counts.draft).toBeGreaterThan(0);
    expect(r.counts.released + r.counts.inReview + r.counts.draft).toBe(r.counts.records);

    expect(await n('SELECT COUNT(*) AS n FROM spectrum_record')).toBe(r.counts.records);
    expect(await n('SELECT COUNT(*) AS n FROM spectrum_record WHERE releasedVersion IS NOT NULL')).toBe(r.counts.released);
    expect(await n("SELECT COUNT(*) AS n FROM spectrum_version WHERE status = 'released'")).toBe(r.counts.released);
    // Unreleased records: their one version is in review or a draft.
    const open = await q('SELECT v.status, COUNT(*) AS n FROM spectrum_record r JOIN spectrum_version v ON v.recordId = r.id AND v.version = r.latestVersion WHERE r.releasedVersion IS NULL GROUP BY v.status');
    expect(Object.fromEntries(open.map((o) => [o.status, Number(o.n)]))).toEqual({ in_review: r.counts.inReview, draft: r.counts.draft });
    // Some released records have history: a superseded first version, or an edit under way.
    expect(await n("SELECT COUNT(*) AS n FROM spectrum_version WHERE status = 'superseded'")).toBeGreaterThan(0);
    expect(await n('SELECT COUNT(*) AS n FROM spectrum_record WHERE releasedVersion IS NOT NULL AND latestVersion > releasedVersion')).toBeGreaterThan(0);
    const [state] = await q('SELECT version FROM library_state WHERE id = 1');
    expect(Number(state.version)).toBe(1);
  });

  it('creates the six demo users, one a role, each with a credential account for the demo password', async () => {
    const users = await q('SELECT u.id, u.email, u.name, u.roles, u.active, u.emailVerified, a.password, a.accountId, a.providerId FROM `user` u JOIN account a ON a.userId = u.id ORDER BY u.email');
    expect(users.map((u) => u.email).sort()).toEqual([
      'admin@demo.ionotheca.test', 'analyst@demo.ionotheca.test', 'auditor@demo.ionotheca.test',
      'curator2@demo.ionotheca.test', 'curator@demo.ionotheca.test', 'viewer@demo.ionotheca.test',
    ].sort());
    const roles = Object.fromEntries(users.map((u) => [u.email, u.roles]));
    expect(roles).toEqual({
      'admin@demo.ionotheca.test': 'admin', 'curator@demo.ionotheca.test': 'curator', 'curator2@demo.ionotheca.test': 'curator',
      'analyst@demo.ionotheca.test': 'analyst', 'viewer@demo.ionotheca.test': 'viewer', 'auditor@demo.ionotheca.test': 'auditor',
    });
    for (const u of users) {
      expect(Number(u.active)).toBe(1);
      expect(Number(u.emailVerified)).toBe(1);
      expect(u.providerId).toBe('credential');
      expect(u.accountId).toBe(u.id);
      expect(u.name).toBe(DEMO_USERS.find((d) => d.email === u.email)!.name);
    }
    expect(await verifyPassword({ hash: users[0].password, password: PASSWORD })).toBe(true);
    expect(await verifyPassword({ hash: users[0].password, password: 'wrong' })).toBe(false);
  });

  it('marks every record and version synthetic, in the data and in its note', async () => {
    expect(await n('SELECT COUNT(*) AS n FROM spectrum_record WHERE synthetic = 0')).toBe(0);
    expect(await n('SELECT COUNT(*) AS n FROM spectrum_version WHERE synthetic = 0')).toBe(0);
    const versions = await q('SELECT recordId, version, metadata, notes, peaks, peakCount, basePeakMz, contentHash, formula, nominalMass, ihd, elements, smiles, ionizationEnergy, ionizationMode FROM spectrum_version');
    for (const v of versions) {
      const meta = typeof v.metadata === 'string' ? JSON.parse(v.metadata) : v.metadata;
      expect(meta.synthetic).toBe(true);
      expect(meta.note).toMatch(/not for identification/);
      expect(v.notes).toMatch(/Synthetic demo spectrum/);
      expect(Number(v.ionizationEnergy)).toBe(70);
      expect(v.ionizationMode).toBe('EI+');
      expect(v.smiles).toBeTruthy();
      expect(v.elements).toBe(v.formula.match(/[A-Z][a-z]?/g).join(','));
      const peaks = decodePeaks(v.peaks);
      expect(peaks.length).toBe(Number(v.peakCount));
      expect(peakContentHash(peaks)).toBe(v.contentHash);
      const base = peaks.reduce((b, p) => (p[1] > b[1] ? p : b));
      expect(base[1]).toBe(999);
      expect(base[0]).toBe(Number(v.basePeakMz));
    }
    // Every record wears the "synthetic demo" tag.
    expect(await n("SELECT COUNT(*) AS n FROM spectrum_record r WHERE NOT EXISTS (SELECT 1 FROM record_tag rt JOIN tag t ON t.id = rt.tagId WHERE rt.recordId = r.id AND t.name = 'synthetic demo')")).toBe(0);
    expect(await n("SELECT COUNT(*) AS n FROM tag WHERE name IN ('aromatic', 'halogenated', 'solvent', 'RI ladder')")).toBe(4);
  });

  it('releases only with a second curator\'s signature, audited in an unbroken chain', async () => {
    const released = await q("SELECT v.id, v.recordId, v.version, v.createdBy, v.submittedBy, v.approvedBy FROM spectrum_version v WHERE v.approvedAt IS NOT NULL");
    expect(released.length).toBeGreaterThanOrEqual(150);
    const curators = new Set((await q("SELECT id FROM `user` WHERE roles LIKE '%curator%'")).map((u) => u.id));
    for (const v of released) {
      expect(v.approvedBy).not.toBe(v.createdBy);
      expect(v.approvedBy).not.toBe(v.submittedBy);
      expect(curators.has(v.approvedBy)).toBe(true);
    }
    expect(await n("SELECT COUNT(*) AS n FROM signature WHERE subjectType = 'spectrum_version' AND meaning = 'reviewed and approved for release'")).toBe(released.length);
    expect(await n("SELECT COUNT(*) AS n FROM spectrum_version v WHERE v.approvedAt IS NOT NULL AND NOT EXISTS (SELECT 1 FROM signature s WHERE s.subjectType = 'spectrum_version' AND s.subjectId = v.id AND s.signerId = v.approvedBy)")).toBe(0);
    for (const action of ['spectrum.import', 'spectrum.submit', 'spectrum.approve']) {
      expect(await n('SELECT COUNT(*) AS n FROM audit_event WHERE action = ?', [action])).toBeGreaterThanOrEqual(150);
    }
    const chain = await verifyAuditChain();
    expect(chain.ok).toBe(true);
    const check = await checkData(s);
    expect(check.problems).toEqual([]);
  });

  it('stores retention indices, tags and the default settings', async () => {
    const ri = await q('SELECT phase, ladder, value FROM retention_index');
    expect(ri.length).toBeGreaterThan(100);
    expect(new Set(ri.map((r) => r.phase))).toEqual(new Set(['non-polar']));
    expect(ri.some((r) => r.ladder === 'C8–C20 n-alkanes')).toBe(true);
    const settings = await q('SELECT name, version, value FROM setting ORDER BY name');
    const value = (x: Row) => (typeof x.value === 'string' ? JSON.parse(x.value) : x.value);
    expect(settings.map((x) => [x.name, Number(x.version)])).toEqual([['acceptance-criteria', 1], ['search-defaults', 1]]);
    expect(value(settings[0])).toEqual({ minScore: 0.8, riWindow: 20, keyIons: { count: 5, tolerance: 0.2 }, isomerMargin: 0.02 });
    expect(value(settings[1])).toEqual({ rankBy: 'composite', weights: { mz: 3, intensity: 0.6 } });
  });

  it('refuses a second run on the seeded database and changes nothing', async () => {
    const before = await rowCounts();
    const r = await seedDemo(s, { password: PASSWORD });
    expect(r.seeded).toBe(false);
    expect(r.reason).toMatch(/not empty/);
    expect(await rowCounts()).toEqual(before);
  });
});
