// The demo scenario's reports, in a database of their own: one in each state,
// written by the invented people, citing released demo records, the approved
// one sealed with a valid HMAC.
import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import { QueryTypes, type Sequelize } from 'sequelize';
import { createScratchDatabase, dropScratchDatabase } from '../../helpers/db';
import { verifyAuditChain } from '../../../src/lib/audit';
import { getReportView } from '../../../src/lib/reports/view';
import { parseRoles } from '../../../src/lib/roles';
import { seedDemo } from '../../../seeds/index';
import { seedDemoReports } from '../../../seeds/reports';

process.env.REPORT_SIGNING_KEY ??= 'test-report-signing-key-0123456789abcdef';
process.env.AUTH_SECRET ??= 'test-auth-secret-0123456789abcdef0123456789';
const DB = 'seed_reports_test';
let s: Sequelize;
type Row = Record<string, any>;

beforeAll(async () => {
  s = await createScratchDatabase(DB);
  const r = await seedDemo(s, { password: 'seed-reports-password-1' });
  expect(r.seeded).toBe(true);
}, 180_000);

afterAll(() => dropScratchDatabase(DB, s));

describe('demo reports', () => {
  it('has a report in every state, by the demo people', async () => {
    const rows = await s.query<Row>('SELECT r.id, r.status, r.conclusion, u.email FROM report r JOIN `user` u ON u.id = r.authorId ORDER BY r.id', { type: QueryTypes.SELECT });
    expect(rows.map((r) => r.status).sort()).toEqual(['approved', 'draft', 'returned', 'submitted']);
    for (const r of rows) expect(r.email).toMatch(/@demo\.ionotheca\.test$/);
    expect(rows.find((r) => r.status === 'approved')!.conclusion).toBe('identified');
  });

  it('cites released demo records only', async () => {
    const [{ n }] = await s.query<Row>(
      "SELECT COUNT(*) AS n FROM report_citation c JOIN spectrum_version v ON v.recordId = c.recordId AND v.version = c.version WHERE v.status <> 'released' OR v.synthetic = 0",
      { type: QueryTypes.SELECT },
    );
    expect(Number(n)).toBe(0);
    const [{ m }] = await s.query<Row>('SELECT COUNT(*) AS m FROM report_citation', { type: QueryTypes.SELECT });
    expect(Number(m)).toBeGreaterThan(4);
  });

  it('seals the approved report with a valid HMAC and a signature by another curator', async () => {
    const [viewer] = await s.query<Row>("SELECT id, name, email, roles FROM `user` WHERE email = 'viewer@demo.ionotheca.test'", { type: QueryTypes.SELECT });
    const [approved] = await s.query<Row>("SELECT id, authorId, reviewerId FROM report WHERE status = 'approved'", { type: QueryTypes.SELECT });
    const view = await getReportView(Number(approved.id), { id: viewer.id, name: viewer.name, email: viewer.email, roles: parseRoles(viewer.roles) });
    expect(view.integrity.status).toBe('intact');
    expect(view.signature).toMatchObject({ meaning: 'reviewed and approved' });
    expect(approved.reviewerId).not.toBe(approved.authorId);
    expect(view.criteria!.allPass).toBe(true);
    expect(view.referenceStandard?.lot).toBeTruthy();
    // the viewer sees only the approved one
    await expect(getReportView(Number(approved.id) + 1, { id: viewer.id, name: viewer.name, email: viewer.email, roles: ['viewer'] })).rejects.toMatchObject({ status: 404 });
  });

  it('keeps the audit chain whole and does nothing a second time', async () => {
    expect((await verifyAuditChain()).ok).toBe(true);
    expect(await seedDemoReports(s)).toEqual({ reports: 0, auditEvents: 0 });
  });
});
