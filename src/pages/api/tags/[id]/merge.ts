// POST /api/tags/:id/merge — { into }: tag :id is merged into tag `into` (its records get `into`; :id is deleted).
import type { APIRoute } from 'astro';
import { z } from 'zod';
import { handle, json, parseWith, readJson } from '../../../../lib/http';
import { syncLibraryIndex } from '../../../../lib/library-index';
import { actorFromLocals, mergeTag } from '../../../../lib/curation';

export const POST: APIRoute = handle(async ({ params, request, locals }) => {
  const { id } = parseWith(z.object({ id: z.coerce.number().int().positive() }), params);
  const { into } = await readJson(request, z.object({ into: z.number().int().positive() }).strict());
  const tag = await mergeTag(id, into, actorFromLocals(locals));
  await syncLibraryIndex().catch(() => {});
  return json(tag);
});
