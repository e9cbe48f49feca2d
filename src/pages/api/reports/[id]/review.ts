import type { APIRoute } from 'astro';
import { z } from 'zod';
import { handle, json, parseWith, readJson } from '../../../../lib/http';
import { reviewSchema } from '../../../../lib/reports/schemas';
import { reviewReport } from '../../../../lib/reports/workflow';
import { getReportView } from '../../../../lib/reports/view';

const idSchema = z.coerce.number().int().positive('the report id is a positive whole number');

// POST /api/reports/:id/review: { action: submit | approve | return | comment, comment?, password? }
export const POST: APIRoute = handle(async ({ params, request, locals }) => {
  const id = parseWith(idSchema, params.id);
  const body = await readJson(request, reviewSchema);
  const outcome = await reviewReport(id, body, locals.user!);
  return json({ ...outcome, report: await getReportView(id, locals.user!) });
});
