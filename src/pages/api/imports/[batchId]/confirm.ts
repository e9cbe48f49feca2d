// POST /api/imports/:batchId/confirm — { file, pages? }: store a file kept
// as needs_confirmation (same peaks under another compound) or
// needs_selection (a run with many pages; `pages` says which, or "all").
import type { APIRoute } from 'astro';
import { z } from 'zod';
import { handle, json, parseWith, readJson } from '../../../../lib/http';
import { syncLibraryIndex } from '../../../../lib/library-index';
import { actorFromLocals, confirmFile } from '../../../../lib/curation';

const bodySchema = z.object({
  file: z.string().min(1).max(255),
  pages: z.union([z.literal('all'), z.array(z.number().int().positive()).min(1).max(100000)]).optional(),
}).strict();

export const POST: APIRoute = handle(async ({ params, request, locals }) => {
  const { batchId } = parseWith(z.object({ batchId: z.string().uuid() }), params);
  const body = await readJson(request, bodySchema);
  const report = await confirmFile(batchId, body.file, actorFromLocals(locals), body.pages);
  if (report.status === 'imported') await syncLibraryIndex().catch(() => {});
  return json({ batchId, ...report });
});
