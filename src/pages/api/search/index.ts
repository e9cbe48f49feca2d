import type { APIRoute } from 'astro';
import { handle, json, readJson } from '../../../lib/http';
import { searchBodySchema } from '../../../lib/query/schemas';
import { resolveQuery } from '../../../lib/query/resolve-query';
import { prepareSearch, runSearch, HIT_CAUTION } from '../../../lib/query/run-search';

// POST /api/search: one query (peaks, JCAMP-DX text or a record) → ranked hits.
export const POST: APIRoute = handle(async ({ request, locals }) => {
  const t0 = performance.now();
  const body = await readJson(request, searchBodySchema);
  const roles = locals.user!.roles;
  const query = await resolveQuery(body, roles);
  const { filters, options } = await prepareSearch(body.filters, body.options, body.limit, roles);
  const r = await runSearch(query.peaks, filters, options);
  return json({
    hits: r.hits,
    searched: r.searched,
    tookMs: Math.round((performance.now() - t0) * 100) / 100,
    searchMs: r.tookMs,
    rankBy: options.rankBy,
    options,
    libraryVersion: r.libraryVersion,
    query: { source: query.source, peakCount: query.peaks.length },
    caution: HIT_CAUTION,
  });
});
