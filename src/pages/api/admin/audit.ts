// GET /api/admin/audit: the audit trail, filtered by actor, record, action and
// time; `?format=csv` exports every matching event (API.md). Read-only.
import type { APIRoute } from 'astro';
import { handle, json, parseWith, queryObject } from '../../../lib/http';
import { auditQuerySchema, exportAuditCsv, listAuditEvents } from '../../../lib/ops/list-audit';

export const GET: APIRoute = handle(async ({ url }) => {
  const query = parseWith(auditQuerySchema, queryObject(url));
  if (query.format === 'csv') {
    const { csv, rows, truncated } = await exportAuditCsv(query);
    const stamp = new Date().toISOString().slice(0, 10);
    return new Response(csv, {
      status: 200,
      headers: {
        'content-type': 'text/csv; charset=utf-8',
        'content-disposition': `attachment; filename="ionotheca-audit-${stamp}.csv"`,
        'cache-control': 'no-store',
        'x-rows': String(rows),
        ...(truncated ? { 'x-truncated': 'true' } : {}),
      },
    });
  }
  return json(await listAuditEvents(query));
});
