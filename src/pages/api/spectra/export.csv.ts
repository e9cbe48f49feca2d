// GET /api/spectra/export.csv: the current library view (same parameters as
// GET /api/spectra, every page) as CSV, one line a peak.
import type { APIRoute } from 'astro';
import { handle, HttpError, parseWith, queryObject } from '../../../lib/http';
import { can } from '../../../lib/roles';
import { exportRecordsCsv, spectraListQuerySchema } from '../../../lib/records';

export const GET: APIRoute = handle(async ({ url, locals }) => {
  const query = parseWith(spectraListQuerySchema, queryObject(url));
  const roles = locals.user?.roles ?? [];
  if (query.status.length > 0 && !query.status.every((s) => s === 'released') && !(can(roles, 'curate') || can(roles, 'audit'))) {
    throw new HttpError(403, 'forbidden', 'Only curators and auditors may export drafts, versions in review, superseded or retired versions');
  }
  const { csv, records, truncated } = await exportRecordsCsv(query, query.status);
  const stamp = new Date().toISOString().slice(0, 10);
  return new Response(csv, {
    status: 200,
    headers: {
      'content-type': 'text/csv; charset=utf-8',
      'content-disposition': `attachment; filename="ionotheca-library-${stamp}.csv"`,
      'cache-control': 'no-store',
      'x-records': String(records),
      ...(truncated ? { 'x-truncated': 'true' } : {}),
    },
  });
});
