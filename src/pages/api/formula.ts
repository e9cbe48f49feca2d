import type { APIRoute } from 'astro';
import { z } from 'zod';
import { handle, json, parseWith, queryObject } from '../../lib/http';
import { formulaInfo } from '../../lib/query/formula-info';

const schema = z.object({ mf: z.string({ error: 'mf is required' }).trim().min(1, 'mf is required').max(200) });

// GET /api/formula?mf=C6H5Br
export const GET: APIRoute = handle(async ({ url }) => {
  const { mf } = parseWith(schema, queryObject(url));
  return json(formulaInfo(mf));
});
