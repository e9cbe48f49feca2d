// GET /api/imports/:batchId — each file's state (queued, processing, then its
// final status and report), for progress bars.
import type { APIRoute } from 'astro';
import { z } from 'zod';
import { handle, json, parseWith } from '../../../../lib/http';
import { getBatch } from '../../../../lib/curation';

export const GET: APIRoute = handle(async ({ params }) => {
  const { batchId } = parseWith(z.object({ batchId: z.string().uuid() }), params);
  return json(await getBatch(batchId));
});
