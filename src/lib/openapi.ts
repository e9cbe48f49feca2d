// The OpenAPI 3.1 document, generated from the route manifest (so every
// route appears) and from the zod schemas the routes validate with.
import { z } from 'zod';
import { API_ROUTES } from './route-manifest';
import { APP_VERSION } from './config';
import { searchBodySchema, interpretBodySchema, batchBodySchema } from './query/schemas';
import { createReportSchema, patchReportSchema, reviewSchema } from './reports/schemas';
import { patchSchema } from './curation/editSchema';

const BODIES: Record<string, z.ZodTypeAny> = {
  'POST /api/search': searchBodySchema,
  'POST /api/interpret': interpretBodySchema,
  'POST /api/search/batch': batchBodySchema,
  'POST /api/reports': createReportSchema,
  'PATCH /api/reports/[id]': patchReportSchema,
  'POST /api/reports/[id]/review': reviewSchema,
  'PATCH /api/spectra/[id]': patchSchema,
};

function toJsonSchema(s: z.ZodTypeAny): unknown {
  try {
    return z.toJSONSchema(s, { unrepresentable: 'any', io: 'input' });
  } catch {
    return { type: 'object' };
  }
}

const errorSchema = {
  type: 'object',
  properties: { error: { type: 'object', properties: { code: { type: 'string' }, message: { type: 'string' }, details: {} }, required: ['code', 'message'] } },
};

export function openApiDocument() {
  const paths: Record<string, Record<string, unknown>> = {};
  for (const [key, need] of Object.entries(API_ROUTES)) {
    const [method, pattern] = key.split(' ');
    if (pattern.includes('[...')) continue;
    const p = pattern.replace(/\[(\w+)\]/g, '{$1}');
    const params = [...pattern.matchAll(/\[(\w+)\]/g)].map((m) => ({ name: m[1], in: 'path', required: true, schema: { type: 'string' } }));
    const op: Record<string, unknown> = {
      summary: `${method} ${p}`,
      'x-capability': need,
      ...(need === 'public' ? { security: [] } : {}),
      ...(params.length ? { parameters: params } : {}),
      responses: {
        200: { description: 'Success' },
        400: { description: 'Bad input', content: { 'application/json': { schema: errorSchema } } },
        ...(need === 'public' ? {} : { 401: { description: 'Not signed in' }, 403: { description: 'No role of the caller allows it' } }),
        503: { description: 'The database is unreachable' },
      },
    };
    const body = BODIES[key];
    if (body) op.requestBody = { required: true, content: { 'application/json': { schema: toJsonSchema(body) } } };
    (paths[p] ??= {})[method.toLowerCase()] = op;
  }
  return {
    openapi: '3.1.0',
    info: { title: 'Ionotheca API', version: APP_VERSION, description: 'In-house mass-spectral library and similarity search. A hit is a candidate to be confirmed with a reference standard.' },
    components: {
      securitySchemes: {
        session: { type: 'apiKey', in: 'cookie', name: 'better-auth.session_token' },
        apiKey: { type: 'http', scheme: 'bearer' },
      },
    },
    security: [{ session: [] }, { apiKey: [] }],
    paths,
  };
}
