import type { APIRoute } from 'astro';
import { handle, json, readJson, HttpError } from '../../lib/http';
import { interpretBodySchema } from '../../lib/query/schemas';
import { resolveQuery } from '../../lib/query/resolve-query';
import { interpretSpectrum } from '../../lib/chem/index';

// POST /api/interpret: molecular ion, isotope clusters and halogens, nitrogen
// rule, losses and fragment ions, candidate formulas.
export const POST: APIRoute = handle(async ({ request, locals }) => {
  const body = await readJson(request, interpretBodySchema);
  const query = await resolveQuery(body, locals.user!.roles);
  const t0 = performance.now();
  let result;
  try {
    result = interpretSpectrum(query.peaks);
  } catch (e) {
    if (e instanceof RangeError) throw new HttpError(400, 'invalid_input', `peaks: ${e.message}`);
    throw e;
  }
  return json({
    ...result,
    query: { source: query.source, peakCount: query.peaks.length },
    tookMs: Math.round((performance.now() - t0) * 10) / 10,
    caution: 'Interpretation rules are heuristics: an assignment is a hypothesis to check against the whole spectrum, the retention index and a reference standard.',
  });
});
