// The whole report flow through the routes, with the local fake SMTP server:
// an analyst creates and submits, the reviewers get mail, the author cannot
// approve, a curator returns with a comment, the analyst resubmits, a second
// curator approves (an electronic signature), the author gets mail, a viewer
// can read it, and a PATCH on it answers 409.
import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import { QueryTypes } from 'sequelize';
import { freePort } from '../../setup/ports';
import { useTestDatabase } from '../../helpers/db';
import { closeSequelize } from '../../../src/lib/db/sequelize';
import { verifyAuditChain } from '../../../src/lib/audit';
import * as reportsIndex from '../../../src/pages/api/reports/index';
import * as reportById from '../../../src/pages/api/reports/[id]/index';
import * as reportReview from '../../../src/pages/api/reports/[id]/review';
import { reportLabel } from '../../../src/lib/reports/reportLabel';
import type { Actor } from '../../../src/lib/reports/types';
import { PASSWORD, RUN, createUser, createReleasedRecord, hit, lastMailId, mailsTo, route } from './helpers';

process.env.MAIL_PORT = String(await freePort());
process.env.SMTP_URL = '';
const sequelize = useTestDatabase();
afterAll(() => closeSequelize());

let analyst: Actor, curator1: Actor, curator2: Actor, viewer: Actor, auditor: Actor, otherAnalyst: Actor;
let rec1: number, rec2: number, rec3: number;
const REF: [number, number][] = [[39, 120], [51, 180], [77, 640], [105, 999], [136, 310], [137, 30]];
const QUERY: [number, number][] = [[39, 130], [51, 170], [77, 600], [105, 999], [136, 290], [137, 28], [50, 40]];

beforeAll(async () => {
  analyst = await createUser(sequelize, 'analyst', ['analyst']);
  otherAnalyst = await createUser(sequelize, 'analyst-b', ['analyst']);
  curator1 = await createUser(sequelize, 'curator-a', ['curator']);
  curator2 = await createUser(sequelize, 'curator-b', ['curator']);
  viewer = await createUser(sequelize, 'viewer', ['viewer']);
  auditor = await createUser(sequelize, 'auditor', ['auditor']);
  rec1 = await createReleasedRecord(sequelize, `Methyl benzoate ${RUN}`, 'C8H8O2', REF, 1094);
  rec2 = await createReleasedRecord(sequelize, `Benzyl formate ${RUN}`, 'C8H8O2', [[39, 100], [51, 150], [77, 500], [79, 700], [91, 400], [105, 300], [136, 999]]);
  rec3 = await createReleasedRecord(sequelize, `Acetophenone ${RUN}`, 'C8H8O', [[43, 400], [51, 200], [77, 700], [105, 999], [120, 300]]);
});

function createBody(title: string) {
  return {
    title,
    query: { peaks: QUERY, sourceFileName: 'run-0412.jdx' },
    search: { filters: { massMin: 50 }, options: { rankBy: 'composite', weights: { mz: 3, intensity: 0.6 } }, limit: 50 },
    hits: [hit(1, rec1, 'ignored: names come from the record', 0.931), hit(2, rec2, 'x', 0.918), hit(3, rec3, 'y', 0.702)],
    selected: { recordId: rec1, version: 1 },
    interpretation: { molecularIon: { mz: 136, confidence: 0.8, reasons: ['highest even m/z'] }, halogenEstimate: { Cl: 0, Br: 0, fit: 0.01, alternatives: [] } },
    sample: { sampleId: `S-${RUN}`, retentionIndex: 1090, instrument: 'GC-MS bench 2', method: 'EI 70 eV, 30 m non-polar' },
    riLadder: { phase: 'non-polar', points: [[5.1, 900], [7.9, 1000], [10.4, 1100]] },
  };
}

describe('report workflow', () => {
  let id = 0;

  it('an analyst creates a draft from a search snapshot', async () => {
    const r = await route(reportsIndex.POST, analyst, { method: 'POST', body: createBody(`Peak at 8.7 min ${RUN}`) });
    expect(r.status).toBe(201);
    id = r.body.id;
    expect(r.body.label).toBe(reportLabel(id));
    const g = await route(reportById.GET, analyst, { params: { id: String(id) } });
    expect(g.status).toBe(200);
    expect(g.body.status).toBe('draft');
    expect(g.body.snapshot.hits[0].name).toBe(`Methyl benzoate ${RUN}`); // identity from the cited version, not from the client
    expect(g.body.snapshot.query.sourceFileName).toBe('run-0412.jdx');
    expect(g.body.snapshot.appVersion).toMatch(/^\d+\.\d+\.\d+/);
    expect(typeof g.body.snapshot.library.version).toBe('number');
    expect(g.body.citations).toHaveLength(3);
    expect(g.body.citations.find((c: any) => c.recordId === rec1).role).toBe('selected');
    expect(g.body.criteria.alternatives.map((a: any) => a.recordId)).toEqual([rec2]);
    expect(g.body.integrity.status).toBe('unsigned');
    expect(g.body.permissions).toMatchObject({ edit: true, submit: true, approve: false });
  });

  it('another analyst and a viewer cannot see the draft; a curator cannot either', async () => {
    for (const who of [otherAnalyst, viewer, curator1]) {
      expect((await route(reportById.GET, who, { params: { id: String(id) } })).status).toBe(404);
    }
    expect((await route(reportById.GET, auditor, { params: { id: String(id) } })).status).toBe(200);
  });

  it('submitting needs a conclusion and reasoning that addresses the alternatives', async () => {
    let r = await route(reportReview.POST, analyst, { method: 'POST', params: { id: String(id) }, body: { action: 'submit' } });
    expect(r.status).toBe(400);
    expect(r.body.error.code).toBe('report_incomplete');
    r = await route(reportById.PATCH, analyst, { method: 'PATCH', params: { id: String(id) }, body: { conclusion: 'tentative', reasoning: 'Spectrum and RI agree with the library record.' } });
    expect(r.status).toBe(200);
    r = await route(reportReview.POST, analyst, { method: 'POST', params: { id: String(id) }, body: { action: 'submit' } });
    expect(r.status).toBe(400);
    expect(r.body.error.code).toBe('alternatives_not_addressed');
    expect(r.body.error.message).toContain(`Benzyl formate ${RUN}`);
  });

  it('"identified" is refused without a co-analysed reference standard', async () => {
    const r = await route(reportById.PATCH, analyst, { method: 'PATCH', params: { id: String(id) }, body: { conclusion: 'identified' } });
    expect(r.status).toBe(400);
    expect(r.body.error.code).toBe('conclusion_not_supported');
    expect(r.body.error.message).toMatch(/reference standard/);
  });

  it('the analyst submits; every other active curator gets a notice with a link and no spectral data', async () => {
    const before = await lastMailId(sequelize);
    let r = await route(reportById.PATCH, analyst, {
      method: 'PATCH', params: { id: String(id) },
      body: { reasoning: `Spectrum and RI agree with the library record. Benzyl formate ${RUN} (#${rec2}) scores close but lacks m/z 91 in the query and has its base peak at 136.` },
    });
    expect(r.status).toBe(200);
    expect(r.body.criteria.results.find((c: any) => c.key === 'alternativesAddressed').status).toBe('pass');
    r = await route(reportReview.POST, analyst, { method: 'POST', params: { id: String(id) }, body: { action: 'submit', comment: 'Ready for review.' } });
    expect(r.status).toBe(200);
    expect(r.body.status).toBe('submitted');
    expect(r.body.mail.failed).toEqual([]);
    for (const c of [curator1, curator2]) {
      const m = await mailsTo(sequelize, c.email, before);
      expect(m).toHaveLength(1);
      expect(m[0].subject).toContain(reportLabel(id));
      expect(m[0].subject).toContain(`Peak at 8.7 min ${RUN}`);
      expect(m[0].text).toContain(`/reports/${id}`);
      // nothing of the content beyond the title: no peaks, hits, conclusion or reasoning
      expect(m[0].text).not.toMatch(/Methyl benzoate|Benzyl formate|tentative|m\/z|\b105\b|0\.93/i);
    }
    expect(await mailsTo(sequelize, analyst.email, before)).toHaveLength(0);
    expect(await mailsTo(sequelize, viewer.email, before)).toHaveLength(0);
  });

  it('the author may not change a submitted report, and cannot approve it', async () => {
    let r = await route(reportById.PATCH, analyst, { method: 'PATCH', params: { id: String(id) }, body: { title: 'changed' } });
    expect(r.status).toBe(409);
    r = await route(reportReview.POST, analyst, { method: 'POST', params: { id: String(id) }, body: { action: 'approve', password: PASSWORD } });
    expect(r.status).toBe(403);
    const [row] = await sequelize.query<any>('SELECT status FROM report WHERE id = ?', { replacements: [id], type: QueryTypes.SELECT });
    expect(row.status).toBe('submitted');
  });

  it('a curator returns it with a comment; the author is told', async () => {
    const before = await lastMailId(sequelize);
    let r = await route(reportReview.POST, curator1, { method: 'POST', params: { id: String(id) }, body: { action: 'return' } });
    expect(r.status).toBe(400); // a comment is required
    r = await route(reportReview.POST, curator1, { method: 'POST', params: { id: String(id) }, body: { action: 'return', comment: 'Add the instrument serial and the tune file date.' } });
    expect(r.status).toBe(200);
    expect(r.body.report.status).toBe('returned');
    expect(r.body.report.reviewer.id).toBe(curator1.id);
    expect(r.body.report.comments.map((c: any) => c.action)).toEqual(['submit', 'return']);
    const m = await mailsTo(sequelize, analyst.email, before);
    expect(m).toHaveLength(1);
    expect(m[0].subject).toMatch(/returned/);
    expect(m[0].text).toContain(`/reports/${id}`);
    expect(m[0].text).not.toContain('tune file'); // the comment itself stays in the report
    expect((await route(reportById.GET, viewer, { params: { id: String(id) } })).status).toBe(404);
  });

  it('the analyst edits and resubmits; the reviewers are told again', async () => {
    const before = await lastMailId(sequelize);
    let r = await route(reportById.PATCH, analyst, { method: 'PATCH', params: { id: String(id) }, body: { sample: { ...createBody('').sample, instrument: 'GC-MS bench 2, serial QX-2231' } } });
    expect(r.status).toBe(200);
    r = await route(reportReview.POST, analyst, { method: 'POST', params: { id: String(id) }, body: { action: 'submit', comment: 'Serial added.' } });
    expect(r.status).toBe(200);
    expect(r.body.report.status).toBe('submitted');
    expect(r.body.report.reviewer).toBeNull();
    const m = await mailsTo(sequelize, curator2.email, before);
    expect(m).toHaveLength(1);
    expect(m[0].subject).toMatch(/resubmitted/);
  });

  it('a second curator approves with a re-entered password; wrong password changes nothing', async () => {
    let r = await route(reportReview.POST, curator2, { method: 'POST', params: { id: String(id) }, body: { action: 'approve', password: 'not the password' } });
    expect(r.status).toBe(403);
    expect(r.body.error.code).toBe('signature_failed');
    const [still] = await sequelize.query<any>('SELECT status, hmac FROM report WHERE id = ?', { replacements: [id], type: QueryTypes.SELECT });
    expect(still).toMatchObject({ status: 'submitted', hmac: null });

    const before = await lastMailId(sequelize);
    r = await route(reportReview.POST, curator2, { method: 'POST', params: { id: String(id) }, body: { action: 'approve', password: PASSWORD } });
    expect(r.status).toBe(200);
    expect(r.body.status).toBe('approved');
    expect(r.body.signature.meaning).toBe('reviewed and approved');
    expect(r.body.signature.signedAt).toMatch(/Z$/);
    expect(r.body.report.integrity.status).toBe('intact');
    expect(r.body.report.integrity.hmac).toMatch(/^[0-9a-f]{64}$/);
    expect(r.body.report.reviewer.id).toBe(curator2.id);
    const sigs = await sequelize.query<any>("SELECT signerId, meaning, contentDigest FROM signature WHERE subjectType = 'report' AND subjectId = ?", { replacements: [id], type: QueryTypes.SELECT });
    expect(sigs).toHaveLength(1);
    expect(sigs[0]).toMatchObject({ signerId: curator2.id, meaning: 'reviewed and approved' });
    expect(sigs[0].contentDigest).toMatch(/^[0-9a-f]{64}$/);
    const m = await mailsTo(sequelize, analyst.email, before);
    expect(m).toHaveLength(1);
    expect(m[0].subject).toMatch(/approved/);
    expect(m[0].text).toContain(`/reports/${id}`);
  });

  it('a viewer can read the approved report and finds it in the list; drafts stay hidden', async () => {
    const g = await route(reportById.GET, viewer, { params: { id: String(id) } });
    expect(g.status).toBe(200);
    expect(g.body.status).toBe('approved');
    expect(g.body.integrity.status).toBe('intact');
    expect(g.body.caution).toMatch(/reference standard/);
    expect(g.body.permissions).toEqual({ edit: false, submit: false, approve: false, return: false, comment: false });
    const l = await route(reportsIndex.GET, viewer, { path: '/api/reports?pageSize=1000' });
    expect(l.status).toBe(200);
    expect(l.body.items.some((i: any) => i.id === id)).toBe(true);
    expect(l.body.items.every((i: any) => i.status === 'approved')).toBe(true);
    const csv = await route(reportsIndex.GET, viewer, { path: `/api/reports?format=csv&q=${reportLabel(id)}` });
    expect(csv.status).toBe(200);
    expect(csv.headers.get('content-type')).toMatch(/text\/csv/);
    const lines = csv.text.trim().split('\r\n');
    expect(lines[0]).toMatch(/^report,title,status,conclusion,author,reviewer/);
    expect(lines).toHaveLength(2);
    expect(lines[1]).toContain(reportLabel(id));
    expect(lines[1]).toContain('Tentative');
  });

  it('an approved report is read-only: PATCH and any further review step answer 409', async () => {
    let r = await route(reportById.PATCH, analyst, { method: 'PATCH', params: { id: String(id) }, body: { reasoning: 'afterthought' } });
    expect(r.status).toBe(409);
    expect(r.body.error.code).toBe('report_read_only');
    r = await route(reportReview.POST, curator1, { method: 'POST', params: { id: String(id) }, body: { action: 'comment', comment: 'late remark' } });
    expect(r.status).toBe(409);
    r = await route(reportReview.POST, curator1, { method: 'POST', params: { id: String(id) }, body: { action: 'return', comment: 'no' } });
    expect(r.status).toBe(409);
    expect((await route(reportById.GET, viewer, { params: { id: String(id) } })).body.integrity.status).toBe('intact');
  });

  it('a correction is a new report that points at the approved one', async () => {
    const r = await route(reportsIndex.POST, analyst, { method: 'POST', body: { ...createBody(`Correction ${RUN}`), supersedesReportId: id } });
    expect(r.status).toBe(201);
    const g = await route(reportById.GET, analyst, { params: { id: String(r.body.id) } });
    expect(g.body.supersedesReportId).toBe(id);
    const old = await route(reportById.GET, analyst, { params: { id: String(id) } });
    expect(old.body.supersededBy).toEqual([r.body.id]);
    // a draft cannot be "corrected" by another report
    const bad = await route(reportsIndex.POST, analyst, { method: 'POST', body: { ...createBody('x'), supersedesReportId: r.body.id } });
    expect(bad.status).toBe(409);
  });

  it('a curator may not review a report they wrote', async () => {
    const c = await route(reportsIndex.POST, curator1, { method: 'POST', body: { ...createBody(`Curator's own ${RUN}`), conclusion: 'not_in_library', reasoning: 'Nothing fits.' } });
    expect(c.status).toBe(201);
    expect((await route(reportReview.POST, curator1, { method: 'POST', params: { id: String(c.body.id) }, body: { action: 'submit' } })).status).toBe(200);
    const own = await route(reportReview.POST, curator1, { method: 'POST', params: { id: String(c.body.id) }, body: { action: 'approve', password: PASSWORD } });
    expect(own.status).toBe(403);
    expect(own.body.error.code).toBe('own_report');
    // the author is not among those asked to review
    const g = await route(reportById.GET, curator2, { params: { id: String(c.body.id) } });
    expect(g.body.permissions.approve).toBe(true);
  });

  it('every step is in the audit trail, and the chain holds', async () => {
    const events = await sequelize.query<any>("SELECT action, actorId FROM audit_event WHERE targetType = 'report' AND targetId = ? ORDER BY id", { replacements: [String(id)], type: QueryTypes.SELECT });
    expect(events.map((e) => e.action)).toEqual([
      'report.create', 'report.update', 'report.update', 'report.submit', 'report.return', 'report.update', 'report.resubmit', 'report.approve',
    ]);
    expect(events.at(-1).actorId).toBe(curator2.id);
    expect((await verifyAuditChain()).ok).toBe(true);
  });
});
