// PATCH /api/spectra/:id — edit a record's metadata or tags (API.md). The
// route file src/pages/api/spectra/[id]/index.ts re-exports this handler.
import type { APIRoute } from 'astro';
import { z } from 'zod';
import { handle, json, parseWith, readJson } from '../http';
import { syncLibraryIndex } from '../library-index';
import { actorFromLocals } from './actor';
import { patchSchema } from './editSchema';
import { editRecord } from './workflow';

const paramsSchema = z.object({ id: z.coerce.number().int().positive() });

export const PATCH: APIRoute = handle(async ({ params, request, locals }) => {
  const { id } = parseWith(paramsSchema, params);
  const body = await readJson(request, patchSchema);
  const result = await editRecord(id, body, actorFromLocals(locals));
  await syncLibraryIndex().catch(() => {});
  return json(result);
});
