// GET /api/tags — every tag with its record count; POST /api/tags — create one { name, colour? }.
import type { APIRoute } from 'astro';
import { z } from 'zod';
import { handle, json, readJson } from '../../../lib/http';
import { actorFromLocals, createTag, listTags } from '../../../lib/curation';

export const GET: APIRoute = handle(async () => json({ items: await listTags() }));

const createSchema = z.object({ name: z.string().trim().min(1).max(80), colour: z.string().regex(/^#[0-9a-fA-F]{6}$/, 'use #rrggbb').optional() }).strict();

export const POST: APIRoute = handle(async ({ request, locals }) => {
  const body = await readJson(request, createSchema);
  return json(await createTag(body, actorFromLocals(locals)), 201);
});
