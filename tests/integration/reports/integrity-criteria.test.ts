// Acceptance criteria against the stored setting (and its absence), the HMAC
// seal of approved reports detecting rows changed behind the API, cited
// record versions staying readable after a new version, and the admin
// settings route.
import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import { QueryTypes } from 'sequelize';
import { freePort } from '../../setup/ports';
import { useTestDatabase } from '../../helpers/db';
import { closeSequelize } from '../../../src/lib/db/sequelize';
import * as reportsIndex from '../../../src/pages/api/reports/index';
import * as reportById from '../../../src/pages/api/reports/[id]/index';
import * as reportReview from '../../../src/pages/api/reports/[id]/review';
import * as settingsRoute from '../../../src/pages/api/admin/settings';
import { getAcceptanceCriteria, DEFAULT_ACCEPTANCE_CRITERIA } from '../../../src/lib/reports/settings';
import { getRecord } from '../../../src/lib/records/getRecord';
import { getSearchDefaults } from '../../../src/lib/query/search-defaults';
import type { Actor } from '../../../src/lib/reports/types';
import { PASSWORD, RUN, createUser, createReleasedRecord, hit, releaseNewVersion, route } from './helpers';

process.env.MAIL_PORT = String(await freePort());
process.env.SMTP_URL = '';
const sequelize = useTestDatabase();

let analyst: Actor, curator: Actor, admin: Actor, viewer: Actor;
let rec: number, other: number;
const REF: [number, number][] = [[41, 300], [43, 999], [58, 620], [71, 150], [86, 90], [100, 40]];
const QUERY_GOOD: [number, number][] = [[41, 310], [43, 999], [58, 600], [71, 160], [86, 85], [100, 35]];
// m/z 58 at half the reference's relative intensity: outside 20 %
const QUERY_BAD: [number, number][] = [[41, 310], [43, 999], [58, 300], [71, 160], [86, 85], [100, 35]];

/** The settings rows as they were, to put back after this file (the database is shared). */
let savedSettings: any[] = [];

beforeAll(async () => {
  savedSettings = await sequelize.query<any>("SELECT * FROM setting WHERE name = 'acceptance-criteria'", { type: QueryTypes.SELECT });
  await sequelize.query("DELETE FROM setting WHERE name = 'acceptance-criteria'");
  analyst = await createUser(sequelize, 'crit-analyst', ['analyst']);
  curator = await createUser(sequelize, 'crit-curator', ['curator']);
  admin = await createUser(sequelize, 'crit-admin', ['admin']);
  viewer = await createUser(sequelize, 'crit-viewer', ['viewer']);
  rec = await createReleasedRecord(sequelize, `2-Hexanone ${RUN}`, 'C6H12O', REF, 790);
  other = await createReleasedRecord(sequelize, `3-Hexanone ${RUN}`, 'C6H12O', [[29, 400], [57, 999], [71, 500], [100, 200]], 785);
});

afterAll(async () => {
  await sequelize.query("DELETE FROM setting WHERE name = 'acceptance-criteria'");
  for (const s of savedSettings) {
    await sequelize.query('INSERT INTO setting (id, name, version, value, createdBy, createdAt) VALUES (?,?,?,?,?,?)', {
      replacements: [s.id, s.name, s.version, typeof s.value === 'string' ? s.value : JSON.stringify(s.value), s.createdBy, s.createdAt],
    });
  }
  await closeSequelize();
});

function body(over: Record<string, unknown> = {}) {
  return {
    title: `Ketone in solvent blank ${RUN}`,
    query: { peaks: QUERY_GOOD },
    hits: [hit(1, rec, '', 0.912), hit(2, other, '', 0.64)],
    selected: { recordId: rec, version: 1 },
    sample: { retentionIndex: 796, riPhase: 'non-polar' },
    ...over,
  };
}

const standard = { name: '2-Hexanone, authentic', lot: 'STD-22-118', analysisDate: '2025-03-14' };

async function criteriaOf(id: number) {
  const g = await route(reportById.GET, analyst, { params: { id: String(id) } });
  return Object.fromEntries(g.body.criteria.results.map((c: any) => [c.key, c]));
}

describe('acceptance criteria', () => {
  it('without a stored setting the defaults apply (0.8, RI 20, 5 ions at 20 %, margin 0.02)', async () => {
    const c = await getAcceptanceCriteria();
    expect(c.version).toBeNull();
    expect(c.value).toEqual({ minimumScore: 0.8, riWindow: 20, keyIonCount: 5, keyIonTolerance: 0.2, isomerMargin: 0.02 });
  });

  it('a passing hit with a co-analysed standard may be concluded "identified"', async () => {
    const r = await route(reportsIndex.POST, analyst, { method: 'POST', body: body({ conclusion: 'identified', reasoning: 'All criteria met; standard co-analysed.', referenceStandard: standard }) });
    expect(r.status).toBe(201);
    const c = await criteriaOf(r.body.id);
    expect(c.minimumScore.status).toBe('pass');
    expect(c.retentionIndex).toMatchObject({ status: 'pass', value: 6 });
    expect(c.keyIons.status).toBe('pass');
    expect(c.keyIons.ions.map((i: any) => i.mz)).toEqual([43, 58, 41, 71, 86]);
    expect(c.isomerMargin.status).toBe('pass');
    expect(c.alternativesAddressed.status).toBe('pass');
  });

  it('each failing criterion blocks "identified" but not "tentative"', async () => {
    const cases: [string, Record<string, unknown>][] = [
      ['minimumScore', { hits: [hit(1, rec, '', 0.74), hit(2, other, '', 0.6)] }],
      ['retentionIndex', { sample: { retentionIndex: 830 } }],
      ['keyIons', { query: { peaks: QUERY_BAD } }],
      ['isomerMargin', { hits: [hit(1, other, '', 0.95), hit(2, rec, '', 0.912)] }],
    ];
    for (const [key, over] of cases) {
      const bad = await route(reportsIndex.POST, analyst, { method: 'POST', body: body({ ...over, conclusion: 'identified', reasoning: `3-Hexanone ${RUN} considered.`, referenceStandard: standard }) });
      expect(bad.status, key).toBe(400);
      expect(bad.body.error.code).toBe('conclusion_not_supported');
      const ok = await route(reportsIndex.POST, analyst, { method: 'POST', body: body({ ...over, conclusion: 'tentative' }) });
      expect(ok.status, key).toBe(201);
      const c = await criteriaOf(ok.body.id);
      expect(c[key].status, key).toBe('fail');
    }
  });

  it('a hit within the isomer margin is an alternative the reasoning must address', async () => {
    const r = await route(reportsIndex.POST, analyst, { method: 'POST', body: body({ hits: [hit(1, rec, '', 0.912), hit(2, other, '', 0.9)], conclusion: 'tentative', reasoning: 'Looks right.' }) });
    expect(r.status).toBe(201);
    const g = await route(reportById.GET, analyst, { params: { id: String(r.body.id) } });
    expect(g.body.criteria.alternatives).toEqual([expect.objectContaining({ recordId: other, addressed: false })]);
    expect((await route(reportReview.POST, analyst, { method: 'POST', params: { id: String(r.body.id) }, body: { action: 'submit' } })).body.error.code).toBe('alternatives_not_addressed');
    await route(reportById.PATCH, analyst, { method: 'PATCH', params: { id: String(r.body.id) }, body: { reasoning: `Record #${other} is ruled out by its base peak at 57.` } });
    expect((await route(reportReview.POST, analyst, { method: 'POST', params: { id: String(r.body.id) }, body: { action: 'submit' } })).status).toBe(200);
  });

  it('the admin changes the criteria (a new, audited version); reports record the version they were evaluated against', async () => {
    expect((await route(settingsRoute.PUT, admin, { method: 'PUT', body: { name: 'acceptance-criteria', value: { ...DEFAULT_ACCEPTANCE_CRITERIA, minimumScore: 1.5 } } })).status).toBe(400);
    const put = await route(settingsRoute.PUT, admin, { method: 'PUT', body: { name: 'acceptance-criteria', value: { ...DEFAULT_ACCEPTANCE_CRITERIA, minimumScore: 0.95 }, reason: 'tighter for the impurity method' } });
    expect(put.status).toBe(200);
    const v = put.body.setting.version;
    expect(v).toBe(1);
    const r = await route(reportsIndex.POST, analyst, { method: 'POST', body: body({ conclusion: 'tentative' }) });
    const g = await route(reportById.GET, analyst, { params: { id: String(r.body.id) } });
    expect(g.body.criteriaSettingsVersion).toBe(v);
    expect(g.body.criteria.settings.value.minimumScore).toBe(0.95);
    expect(g.body.criteria.results.find((c: any) => c.key === 'minimumScore').status).toBe('fail');
    const list = await route(settingsRoute.GET, admin);
    expect(list.body.settings['acceptance-criteria'].version).toBe(v);
    expect(list.body.settings['acceptance-criteria'].history[0]).toMatchObject({ version: v, createdBy: { id: admin.id } });
    const [ev] = await sequelize.query<any>("SELECT reason FROM audit_event WHERE action = 'setting.change' AND targetId = ? ORDER BY id DESC LIMIT 1", { replacements: [`acceptance-criteria@${v}`], type: QueryTypes.SELECT });
    expect(ev.reason).toBe('tighter for the impurity method');
  });

  it('a change of the search defaults is seen by the search at once', async () => {
    const before = await getSearchDefaults();
    const put = await route(settingsRoute.PUT, admin, { method: 'PUT', body: { name: 'search-defaults', value: { ...before, limit: 37 } } });
    expect(put.status).toBe(200);
    expect((await getSearchDefaults()).limit).toBe(37);
    await route(settingsRoute.PUT, admin, { method: 'PUT', body: { name: 'search-defaults', value: { rankBy: before.rankBy, weights: before.weights, limit: before.limit } } });
  });
});

describe('integrity of approved reports', () => {
  let id = 0;
  beforeAll(async () => {
    await sequelize.query("DELETE FROM setting WHERE name = 'acceptance-criteria'");
    const r = await route(reportsIndex.POST, analyst, { method: 'POST', body: body({ conclusion: 'identified', reasoning: 'All criteria met.', referenceStandard: standard }) });
    id = r.body.id;
    expect((await route(reportReview.POST, analyst, { method: 'POST', params: { id: String(id) }, body: { action: 'submit' } })).status).toBe(200);
    expect((await route(reportReview.POST, curator, { method: 'POST', params: { id: String(id) }, body: { action: 'approve', password: PASSWORD, comment: 'Agreed.' } })).status).toBe(200);
  });

  const status = async () => (await route(reportById.GET, viewer, { params: { id: String(id) } })).body.integrity.status;

  it('is intact as approved', async () => {
    expect(await status()).toBe('intact');
  });

  it('detects a field changed behind the API, and is intact again once it is put back', async () => {
    const [row] = await sequelize.query<any>('SELECT conclusion FROM report WHERE id = ?', { replacements: [id], type: QueryTypes.SELECT });
    await sequelize.query("UPDATE report SET conclusion = 'tentative' WHERE id = ?", { replacements: [id] });
    expect(await status()).toBe('altered');
    await sequelize.query('UPDATE report SET conclusion = ? WHERE id = ?', { replacements: [row.conclusion, id] });
    expect(await status()).toBe('intact');
  });

  it('detects a changed snapshot (a score), a changed citation, a changed comment, and a recomputed-looking HMAC', async () => {
    const [row] = await sequelize.query<any>('SELECT snapshot, hmac FROM report WHERE id = ?', { replacements: [id], type: QueryTypes.SELECT });
    const original = typeof row.snapshot === 'string' ? row.snapshot : JSON.stringify(row.snapshot);
    const snap = JSON.parse(original);
    snap.hits[0].score = 0.999;
    await sequelize.query('UPDATE report SET snapshot = ? WHERE id = ?', { replacements: [JSON.stringify(snap), id] });
    expect(await status()).toBe('altered');
    await sequelize.query('UPDATE report SET snapshot = ? WHERE id = ?', { replacements: [original, id] });
    expect(await status()).toBe('intact');

    await sequelize.query("UPDATE report_citation SET role = 'hit' WHERE reportId = ? AND role = 'selected'", { replacements: [id] });
    expect(await status()).toBe('altered');
    await sequelize.query("UPDATE report_citation SET role = 'selected' WHERE reportId = ? AND recordId = ?", { replacements: [id, rec] });
    expect(await status()).toBe('intact');

    await sequelize.query("UPDATE report_comment SET body = 'Agreed, reluctantly.' WHERE reportId = ?", { replacements: [id] });
    expect(await status()).toBe('altered');
    await sequelize.query("UPDATE report_comment SET body = 'Agreed.' WHERE reportId = ?", { replacements: [id] });
    expect(await status()).toBe('intact');

    // a plain SHA-256 of the content (no key) is not the seal
    await sequelize.query("UPDATE report SET hmac = SHA2('anything', 256) WHERE id = ?", { replacements: [id] });
    expect(await status()).toBe('altered');
    await sequelize.query('UPDATE report SET hmac = ? WHERE id = ?', { replacements: [row.hmac, id] });
    expect(await status()).toBe('intact');
  });

  it('a report set to approved behind the API has no valid seal', async () => {
    const r = await route(reportsIndex.POST, analyst, { method: 'POST', body: body({ conclusion: 'tentative', reasoning: 'x' }) });
    await sequelize.query("UPDATE report SET status = 'approved' WHERE id = ?", { replacements: [r.body.id] });
    expect((await route(reportById.GET, viewer, { params: { id: String(r.body.id) } })).body.integrity.status).toBe('altered');
  });

  it('the key is not in the database', async () => {
    const key = process.env.REPORT_SIGNING_KEY!;
    const hits = await sequelize.query<any>('SELECT COUNT(*) AS n FROM setting WHERE value LIKE ?', { replacements: [`%${key}%`], type: QueryTypes.SELECT });
    expect(Number(hits[0].n)).toBe(0);
  });
});

describe('cited record versions', () => {
  it('stay readable at the cited version after the record gets a new version', async () => {
    const name = `Cyclohexanone ${RUN}`;
    const v1: [number, number][] = [[42, 300], [55, 999], [69, 250], [98, 380]];
    const id = await createReleasedRecord(sequelize, name, 'C6H10O', v1, 895);
    const r = await route(reportsIndex.POST, analyst, { method: 'POST', body: { title: `Cited ${RUN}`, query: { peaks: v1 }, hits: [hit(1, id, '', 0.99)], selected: { recordId: id, version: 1 }, conclusion: 'tentative', reasoning: 'Matches.' } });
    expect(r.status).toBe(201);
    const v2 = await releaseNewVersion(sequelize, id, name, 'C6H10O', [[42, 280], [55, 999], [69, 260], [98, 400], [83, 50]]);
    expect(v2).toBe(2);

    // the record's current view moved on, the cited version is still there as it was
    expect((await getRecord(id)).version).toBe(2);
    const old = await getRecord(id, { version: 1 });
    expect(old.status).toBe('superseded');
    expect(old.peaks).toEqual(v1);

    const g = await route(reportById.GET, analyst, { params: { id: String(r.body.id) } });
    expect(g.body.selected).toMatchObject({ recordId: id, version: 1, status: 'superseded' });
    expect(g.body.selected.peaks).toEqual(v1);
    expect(g.body.citations).toEqual([expect.objectContaining({ recordId: id, version: 1, role: 'selected', status: 'superseded' })]);
    // and the criteria are still evaluated against version 1
    const patched = await route(reportById.PATCH, analyst, { method: 'PATCH', params: { id: String(r.body.id) }, body: { reasoning: 'Matches v1.' } });
    expect(patched.body.criteria.results.find((c: any) => c.key === 'keyIons').ions.map((i: any) => i.mz)).toEqual([55, 98, 42, 69]);
  });

  it('a report cannot cite a version that does not exist', async () => {
    const r = await route(reportsIndex.POST, analyst, { method: 'POST', body: { title: 'x', query: { peaks: [[50, 1]] }, hits: [hit(1, rec, '', 0.9, 7)] } });
    expect(r.status).toBe(400);
    expect(r.body.error.message).toMatch(/no version 7/);
  });
});
