// PATCH /api/tags/:id — rename and/or recolour { name?, colour? }.
import type { APIRoute } from 'astro';
import { z } from 'zod';
import { handle, json, parseWith, readJson } from '../../../../lib/http';
import { syncLibraryIndex } from '../../../../lib/library-index';
import { actorFromLocals, updateTag } from '../../../../lib/curation';

const bodySchema = z.object({ name: z.string().trim().min(1).max(80).optional(), colour: z.string().regex(/^#[0-9a-fA-F]{6}$/, 'use #rrggbb').optional() })
  .strict()
  .refine((b) => b.name !== undefined || b.colour !== undefined, 'send a name or a colour');

export const PATCH: APIRoute = handle(async ({ params, request, locals }) => {
  const { id } = parseWith(z.object({ id: z.coerce.number().int().positive() }), params);
  const body = await readJson(request, bodySchema);
  const tag = await updateTag(id, body, actorFromLocals(locals));
  await syncLibraryIndex().catch(() => {});
  return json(tag);
});
