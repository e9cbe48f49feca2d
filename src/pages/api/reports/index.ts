import type { APIRoute } from 'astro';
import { handle, json, parseWith, queryObject, readJson } from '../../../lib/http';
import { createReportSchema, listReportsSchema } from '../../../lib/reports/schemas';
import { createReport } from '../../../lib/reports/workflow';
import { listReports, reportsCsv } from '../../../lib/reports/view';
import { reportLabel } from '../../../lib/reports/reportLabel';

// GET /api/reports: the reports the caller may see (?format=csv exports them).
export const GET: APIRoute = handle(async ({ url, locals }) => {
  const q = parseWith(listReportsSchema, queryObject(url));
  const list = await listReports(q, locals.user!);
  if (q.format === 'csv') {
    return new Response(reportsCsv(list.items), {
      headers: {
        'content-type': 'text/csv; charset=utf-8',
        'content-disposition': `attachment; filename="ionotheca-reports-${new Date().toISOString().slice(0, 10)}.csv"`,
        'cache-control': 'no-store',
      },
    });
  }
  return json(list);
});

// POST /api/reports: a new draft from an Identify search snapshot.
export const POST: APIRoute = handle(async ({ request, locals }) => {
  const body = await readJson(request, createReportSchema, 8 * 1024 * 1024);
  const { id } = await createReport(body, locals.user!);
  return json({ id, label: reportLabel(id), url: `/reports/${id}` }, 201, { location: `/api/reports/${id}` });
});
