// GET /api/spectra/:id (?version=n): one record version with versions and history.
import type { APIRoute } from 'astro';
import { z } from 'zod';
import { handle, json, parseWith, queryObject } from '../../../../lib/http';
import { can } from '../../../../lib/roles';
import { getRecord } from '../../../../lib/records';

const paramsSchema = z.object({ id: z.coerce.number().int().positive() });
const querySchema = z.object({ version: z.coerce.number().int().positive().optional() });

export const GET: APIRoute = handle(async ({ params, url, locals }) => {
  const { id } = parseWith(paramsSchema, params);
  const { version } = parseWith(querySchema, queryObject(url));
  const roles = locals.user?.roles ?? [];
  const record = await getRecord(id, { version, privileged: can(roles, 'curate') || can(roles, 'audit') });
  return json(record);
});
export { PATCH } from '../../../../lib/curation/patch-route';
