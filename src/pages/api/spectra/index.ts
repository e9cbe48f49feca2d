// GET /api/spectra: the library list (API.md). Thin: parse, check who may ask
// for which statuses, call src/lib/records.
import type { APIRoute } from 'astro';
import { handle, HttpError, json, parseWith, queryObject } from '../../../lib/http';
import { can } from '../../../lib/roles';
import { listRecords, spectraListQuerySchema } from '../../../lib/records';

export const GET: APIRoute = handle(async ({ url, locals }) => {
  const query = parseWith(spectraListQuerySchema, queryObject(url));
  const roles = locals.user?.roles ?? [];
  if (query.status.length > 0 && !query.status.every((s) => s === 'released') && !(can(roles, 'curate') || can(roles, 'audit'))) {
    throw new HttpError(403, 'forbidden', 'Only curators and auditors may list drafts, versions in review, superseded or retired versions');
  }
  const list = await listRecords(query, { statuses: query.status });
  return json(list);
});
