import type { APIRoute } from 'astro';
import { handle, json, readJson } from '../../../lib/http';
import { batchBodySchema } from '../../../lib/query/schemas';
import { peaksFromJcamp, checkPeaks } from '../../../lib/query/resolve-query';
import { prepareSearch, toApiHit, HIT_CAUTION } from '../../../lib/query/run-search';
import { getLibraryIndex } from '../../../lib/library-index';

// POST /api/search/batch: up to 10,000 queries (a list, or a JCAMP-DX file
// with several blocks). Runs in the worker pool so other requests go on.
export const POST: APIRoute = handle(async ({ request, locals }) => {
  const t0 = performance.now();
  const body = await readJson(request, batchBodySchema, 64 * 1024 * 1024);
  const queries = body.queries
    ? body.queries.map((q, i) => ({ id: q.id ?? i, title: null as string | null, peaks: checkPeaks(q.peaks, `queries.${i}.peaks`) }))
    : peaksFromJcamp(body.jcamp!).map((s, i) => ({ id: i, title: s.title, peaks: s.peaks }));
  if (queries.length > 10_000) return json({ error: { code: 'invalid_input', message: 'jcamp: at most 10,000 spectra' } }, 400);
  const { filters, options } = await prepareSearch(body.filters, body.options, body.limit, locals.user!.roles);
  const index = getLibraryIndex();
  const results = await index.searchBatch(queries.map((q) => q.peaks), options, filters);
  return json({
    results: results.map((r, i) => ({ id: queries[i].id, title: queries[i].title, hits: r.hits.map(toApiHit), searched: r.searched, tookMs: r.tookMs })),
    count: queries.length,
    tookMs: Math.round(performance.now() - t0),
    libraryVersion: index.libraryVersion,
    caution: HIT_CAUTION,
  });
});
