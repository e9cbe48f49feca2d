// GET /api/spectra/:id/jcamp?version=n — the version as a JCAMP-DX 5.01 file.
// Drafts and versions in review only for those who may curate or audit.
import type { APIRoute } from 'astro';
import { z } from 'zod';
import { handle, parseWith, queryObject } from '../../../../lib/http';
import { can } from '../../../../lib/roles';
import { exportRecordJcamp } from '../../../../lib/curation';

export const GET: APIRoute = handle(async ({ params, url, locals }) => {
  const { id } = parseWith(z.object({ id: z.coerce.number().int().positive() }), params);
  const { version } = parseWith(z.object({ version: z.coerce.number().int().positive().optional() }), queryObject(url));
  const roles = locals.user?.roles ?? [];
  const out = await exportRecordJcamp(id, { version, privileged: can(roles, 'curate') || can(roles, 'audit') });
  return new Response(out.text, {
    status: 200,
    headers: {
      'content-type': 'chemical/x-jcamp-dx; charset=utf-8',
      'content-disposition': `attachment; filename="${out.fileName}"`,
      'cache-control': 'no-store',
      'x-record-version': String(out.version),
    },
  });
});
