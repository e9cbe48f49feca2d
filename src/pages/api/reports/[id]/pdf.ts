import type { APIRoute } from 'astro';
import { z } from 'zod';
import { handle, parseWith, queryObject } from '../../../../lib/http';
import { renderReportPdf } from '../../../../lib/reports/pdf';
import { getReportView } from '../../../../lib/reports/view';

const idSchema = z.coerce.number().int().positive('the report id is a positive whole number');
const querySchema = z.object({ paper: z.enum(['a4', 'letter']).optional() }).strict();

// GET /api/reports/:id/pdf[?paper=a4|letter]: the print view as PDF (503 without Chromium).
export const GET: APIRoute = handle(async ({ params, url, request, locals }) => {
  const id = parseWith(idSchema, params.id);
  const { paper } = parseWith(querySchema, queryObject(url));
  const view = await getReportView(id, locals.user!); // 404 before launching a browser
  const pdf = await renderReportPdf(id, request, paper === 'letter' ? 'Letter' : 'A4');
  return new Response(new Uint8Array(pdf), {
    headers: {
      'content-type': 'application/pdf',
      'content-disposition': `inline; filename="${view.label}.pdf"`,
      'cache-control': 'no-store',
    },
  });
});
