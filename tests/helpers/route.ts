// Call an Astro endpoint function directly, as the middleware would after the
// guard: with a request and a signed-in user in locals.
import type { Role } from '../../src/lib/roles';

export function asUser(roles: Role[], id = `test-${roles.join('-')}`) {
  return { user: { id, email: `${id}@example.test`, name: `Test ${roles.join('/')}`, roles }, session: null, apiKeyId: null };
}

export async function callRoute(
  fn: (ctx: any) => Promise<Response> | Response,
  { method = 'GET', url = 'http://127.0.0.1/api/x', body, roles = ['analyst'] as Role[], params = {} }: { method?: string; url?: string; body?: unknown; roles?: Role[]; params?: Record<string, string> } = {},
) {
  const request = new Request(url, {
    method,
    headers: body === undefined ? {} : { 'content-type': 'application/json' },
    body: body === undefined ? undefined : typeof body === 'string' ? body : JSON.stringify(body),
  });
  const res = await fn({ request, url: new URL(url), locals: asUser(roles), params });
  const text = await res.text();
  let json: any = null;
  try {
    json = JSON.parse(text);
  } catch {
    /* not JSON */
  }
  return { status: res.status, json, text };
}
