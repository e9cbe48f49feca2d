// POST /api/spectra/:id/review — { action: submit | approve | return | retire,
// comment?, reason?, password?, version? } (API.md). Approval is an
// electronic signature with the password re-entered, and never by someone
// who edited or submitted the version.
import type { APIRoute } from 'astro';
import { z } from 'zod';
import { handle, json, parseWith, readJson } from '../../../../lib/http';
import { syncLibraryIndex } from '../../../../lib/library-index';
import { actorFromLocals, reviewRecord } from '../../../../lib/curation';

const bodySchema = z.object({
  action: z.enum(['submit', 'approve', 'return', 'retire']),
  comment: z.string().trim().max(4000).optional(),
  reason: z.string().trim().max(2000).optional(),
  password: z.string().max(256).optional(),
  version: z.number().int().positive().optional(),
}).strict();

export const POST: APIRoute = handle(async ({ params, request, locals }) => {
  const { id } = parseWith(z.object({ id: z.coerce.number().int().positive() }), params);
  const body = await readJson(request, bodySchema);
  const result = await reviewRecord(id, body, actorFromLocals(locals));
  await syncLibraryIndex().catch(() => {});
  return json(result);
});
