import type { APIRoute } from 'astro';
import { z } from 'zod';
import { handle, json, parseWith, readJson } from '../../../../lib/http';
import { patchReportSchema } from '../../../../lib/reports/schemas';
import { updateReport } from '../../../../lib/reports/workflow';
import { getReportView } from '../../../../lib/reports/view';

const idSchema = z.coerce.number().int().positive('the report id is a positive whole number');

// GET /api/reports/:id
export const GET: APIRoute = handle(async ({ params, locals }) => {
  const id = parseWith(idSchema, params.id);
  return json(await getReportView(id, locals.user!));
});

// PATCH /api/reports/:id: the author edits a draft or returned report (approved: 409).
export const PATCH: APIRoute = handle(async ({ params, request, locals }) => {
  const id = parseWith(idSchema, params.id);
  const body = await readJson(request, patchReportSchema);
  await updateReport(id, body, locals.user!);
  return json(await getReportView(id, locals.user!));
});
