// Shapes of API answers (API.md): JSON, errors as { error: { code, message, details? } }.
import { z } from 'zod';

export function json(body: unknown, status = 200, headers: Record<string, string> = {}): Response {
  return new Response(JSON.stringify(body), {
    status,
    headers: { 'content-type': 'application/json; charset=utf-8', 'cache-control': 'no-store', ...headers },
  });
}

export function apiError(status: number, code: string, message: string, details?: unknown): Response {
  return json({ error: { code, message, ...(details === undefined ? {} : { details }) } }, status);
}

export class HttpError extends Error {
  constructor(public status: number, public code: string, message: string, public details?: unknown) {
    super(message);
  }
}

export const MAX_JSON_BYTES = 2 * 1024 * 1024;

/** Read a JSON body with a size limit and validate it; throws HttpError (400/413). */
export async function readJson<T extends z.ZodTypeAny>(request: Request, schema: T, maxBytes = MAX_JSON_BYTES): Promise<z.infer<T>> {
  const declared = Number(request.headers.get('content-length') ?? 0);
  if (declared > maxBytes) throw new HttpError(413, 'body_too_large', `The request body is over the limit of ${maxBytes} bytes`);
  const text = await request.text();
  if (Buffer.byteLength(text) > maxBytes) throw new HttpError(413, 'body_too_large', `The request body is over the limit of ${maxBytes} bytes`);
  let data: unknown;
  try {
    data = text === '' ? {} : JSON.parse(text);
  } catch {
    throw new HttpError(400, 'invalid_json', 'The request body is not valid JSON');
  }
  return parseWith(schema, data);
}

export function parseWith<T extends z.ZodTypeAny>(schema: T, data: unknown): z.infer<T> {
  const r = schema.safeParse(data);
  if (!r.success) {
    const first = r.error.issues[0];
    const field = first?.path.join('.') || '(body)';
    throw new HttpError(400, 'invalid_input', `${field}: ${first?.message ?? 'invalid'}`, r.error.issues.map((i) => ({ field: i.path.join('.'), message: i.message })));
  }
  return r.data;
}

/** Query-string parameters as a plain object, for parseWith. */
export function queryObject(url: URL): Record<string, string> {
  return Object.fromEntries(url.searchParams.entries());
}

/** Wrap an endpoint: HttpError -> its JSON answer; database down -> 503; anything else -> 500 without a stack. */
export function handle(fn: (ctx: any) => Promise<Response> | Response) {
  return async (ctx: any): Promise<Response> => {
    try {
      return await fn(ctx);
    } catch (e) {
      return errorResponse(e);
    }
  };
}

export function isDatabaseDown(e: unknown): boolean {
  const err = e as { name?: string; code?: string; original?: { code?: string }; parent?: { code?: string } };
  const code = err?.original?.code ?? err?.parent?.code ?? err?.code ?? '';
  return (
    /SequelizeConnection|ConnectionRefused|ConnectionAcquireTimeout|HostNotReachable/.test(err?.name ?? '') ||
    /ECONNREFUSED|ER_GET_CONNECTION_TIMEOUT|ER_CONNECTION_TIMEOUT|ECONNRESET|ER_SOCKET_UNEXPECTED_CLOSE|PROTOCOL_CONNECTION_LOST|ER_CONNECTION_ALREADY_CLOSED|ER_POOL_ALREADY_CLOSED|ER_CMD_CONNECTION_CLOSED/.test(code)
  );
}

export function errorResponse(e: unknown): Response {
  if (e instanceof HttpError) return apiError(e.status, e.code, e.message, e.details);
  if (isDatabaseDown(e)) return apiError(503, 'database_unavailable', 'The database is not reachable right now; try again shortly');
  console.error('[api] unexpected error:', (e as Error)?.message ?? e);
  return apiError(500, 'internal_error', 'Something went wrong on the server');
}
