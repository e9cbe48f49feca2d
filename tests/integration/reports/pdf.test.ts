// GET /api/reports/:id/pdf where Chromium is missing: a clear 503, and a
// report the caller may not see is a 404 before any browser is started.
import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import { useTestDatabase } from '../../helpers/db';
import { closeSequelize } from '../../../src/lib/db/sequelize';
import * as reportsIndex from '../../../src/pages/api/reports/index';
import * as pdfRoute from '../../../src/pages/api/reports/[id]/pdf';
import type { Actor } from '../../../src/lib/reports/types';
import { RUN, createUser, createReleasedRecord, hit, route } from './helpers';

const sequelize = useTestDatabase();
let analyst: Actor, viewer: Actor, id = 0;
const saved = process.env.CHROMIUM_PATH;

beforeAll(async () => {
  analyst = await createUser(sequelize, 'pdf-analyst', ['analyst']);
  viewer = await createUser(sequelize, 'pdf-viewer', ['viewer']);
  const rec = await createReleasedRecord(sequelize, `Toluene ${RUN}`, 'C7H8', [[65, 100], [91, 999], [92, 600]]);
  id = (await route(reportsIndex.POST, analyst, { method: 'POST', body: { title: `PDF ${RUN}`, query: { peaks: [[91, 999], [92, 580]] }, hits: [hit(1, rec, '', 0.97)] } })).body.id;
  process.env.CHROMIUM_PATH = '/nonexistent/chromium';
});
afterAll(async () => {
  if (saved === undefined) delete process.env.CHROMIUM_PATH;
  else process.env.CHROMIUM_PATH = saved;
  await closeSequelize();
});

describe('report PDF without Chromium', () => {
  it('answers 503 with a message that says what is missing', async () => {
    const r = await route(pdfRoute.GET, analyst, { path: `/api/reports/${id}/pdf`, params: { id: String(id) } });
    expect(r.status).toBe(503);
    expect(r.body.error.code).toBe('pdf_unavailable');
    expect(r.body.error.message).toMatch(/Chromium/);
    expect(r.body.error.message).toContain(`/reports/${id}/print`);
  });

  it('answers 404 for a report the caller may not see, and 400 for a bad paper size', async () => {
    expect((await route(pdfRoute.GET, viewer, { path: `/api/reports/${id}/pdf`, params: { id: String(id) } })).status).toBe(404);
    expect((await route(pdfRoute.GET, analyst, { path: `/api/reports/${id}/pdf?paper=a3`, params: { id: String(id) } })).status).toBe(400);
  });
});
