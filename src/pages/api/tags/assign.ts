// POST /api/tags/assign — { recordIds, tagIds | tagNames, action: add | remove }: bulk tagging from the library table.
import type { APIRoute } from 'astro';
import { z } from 'zod';
import { handle, json, readJson } from '../../../lib/http';
import { syncLibraryIndex } from '../../../lib/library-index';
import { actorFromLocals, assignTags } from '../../../lib/curation';

const bodySchema = z.object({
  recordIds: z.array(z.number().int().positive()).min(1).max(10000),
  tagIds: z.array(z.number().int().positive()).max(100).optional(),
  tagNames: z.array(z.string().trim().min(1).max(80)).max(100).optional(),
  action: z.enum(['add', 'remove']),
}).strict().refine((b) => (b.tagIds?.length ?? 0) + (b.tagNames?.length ?? 0) > 0, { message: 'name at least one tag (tagIds or tagNames)', path: ['tagIds'] });

export const POST: APIRoute = handle(async ({ request, locals }) => {
  const body = await readJson(request, bodySchema);
  const result = await assignTags(body, actorFromLocals(locals));
  await syncLibraryIndex().catch(() => {});
  return json(result);
});
