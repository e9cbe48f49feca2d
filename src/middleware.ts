// Session lookup into Astro.locals and the route guard. Every API route and
// page is looked up in src/lib/route-manifest.ts before it runs: a route that
// is not listed answers 404, so no route can skip the check.
import { defineMiddleware } from 'astro:middleware';
import { API_ROUTES, PAGE_ROUTES, type Need } from './lib/route-manifest';
import { can } from './lib/roles';
import { apiError, isDatabaseDown } from './lib/http';
import { resolvePrincipal } from './lib/principal';
import { ensureRuntime } from './lib/runtime';
import './lib/startup';
import { trustedOrigins, apiKeyFrom } from './lib/auth';
import { getSequelize } from './lib/db/sequelize';
import { QueryTypes } from 'sequelize';

// Astro reports route patterns in lower case (`[batchId]` → `[batchid]`), so
// the manifest is looked up case-insensitively.
const API_NEEDS = new Map(Object.entries(API_ROUTES).map(([k, v]) => [k.toLowerCase(), v]));
const PAGE_NEEDS = new Map(Object.entries(PAGE_ROUTES).map(([k, v]) => [k.toLowerCase(), v]));

const SAFE_METHODS = new Set(['GET', 'HEAD', 'OPTIONS']);

/**
 * Astro's checkOrigin covers form posts; this covers every other body type
 * too (JSON in particular): a state-changing request that carries cookies
 * must come from our own origin. API-key calls carry no cookie and pass.
 */
function crossSiteWithCookies(request: Request, url: URL): boolean {
  if (SAFE_METHODS.has(request.method) || !request.headers.get('cookie')) return false;
  if (url.pathname.startsWith('/api/auth/')) return false; // better-auth checks its own routes
  const origin = request.headers.get('origin');
  if (!origin) return !!request.headers.get('cookie')?.includes('session_token');
  return origin !== url.origin && !trustedOrigins().includes(origin);
}

function carriesCredentials(request: Request): boolean {
  return !!apiKeyFrom(request.headers) || !!request.headers.get('cookie')?.includes('session_token');
}

async function databaseUnreachable(): Promise<boolean> {
  try {
    await getSequelize().query('SELECT 1', { type: QueryTypes.SELECT });
    return false;
  } catch (e) {
    return isDatabaseDown(e);
  }
}

export const onRequest = defineMiddleware(async (context, next) => {
  void ensureRuntime();
  const { request, url } = context;
  const isApi = url.pathname.startsWith('/api/');
  const pattern = context.routePattern;
  // A listed page path that has no page (yet) is still guarded as listed, so
  // its answer does not depend on whether the page happens to exist.
  const pagePattern = pattern === '/404' && PAGE_NEEDS.has(url.pathname.replace(/\/$/, '').toLowerCase()) ? url.pathname.replace(/\/$/, '').toLowerCase() : pattern;
  const need: Need | undefined = isApi ? API_NEEDS.get(`${request.method} ${pattern}`.toLowerCase()) : (PAGE_NEEDS.get(pagePattern.toLowerCase()) ?? 'read');

  context.locals.user = null;
  context.locals.session = null;
  context.locals.apiKeyId = null;

  if (isApi && need === undefined) {
    if (pattern === '/404' || ![...API_NEEDS.keys()].some((k) => k.endsWith(` ${pattern.toLowerCase()}`))) {
      return apiError(404, 'not_found', `No such route: ${request.method} ${url.pathname}`);
    }
    return apiError(405, 'method_not_allowed', `${request.method} is not allowed on ${url.pathname}`);
  }

  if (crossSiteWithCookies(request, url)) {
    if (isApi) return apiError(403, 'cross_site_request', 'Requests with a session cookie must come from this site (Origin header)');
    return new Response('Cross-site request refused.', { status: 403, headers: { 'content-type': 'text/plain; charset=utf-8' } });
  }

  let dbDown = false;
  if (!(isApi && (pattern === '/api/health' || pattern === '/api/auth/[...all]'))) {
    try {
      const p = await resolvePrincipal(request);
      if (p) {
        context.locals.user = p.user;
        context.locals.session = p.session;
        context.locals.apiKeyId = p.apiKeyId;
      } else if (carriesCredentials(request) && (await databaseUnreachable())) {
        dbDown = true;
      }
    } catch (e) {
      // better-auth wraps a failed lookup in its own error ("Failed to get
      // session"): ask the database itself, or an outage looks like a sign-out.
      if (isDatabaseDown(e) || (await databaseUnreachable())) dbDown = true;
      else console.error('[auth] session lookup failed:', (e as Error).message);
    }
  }

  if (need === 'public') return next();
  const user = context.locals.user;
  if (!user) {
    if (dbDown) {
      if (isApi) return apiError(503, 'database_unavailable', 'The database is not reachable right now; try again shortly');
      return new Response('The database is not reachable right now; try again shortly.', { status: 503, headers: { 'content-type': 'text/plain; charset=utf-8' } });
    }
    if (isApi) return apiError(401, 'unauthenticated', 'Sign in first, or send an API key');
    return context.redirect(`/sign-in?next=${encodeURIComponent(url.pathname + url.search)}`, 302);
  }
  if (need !== 'signed-in' && !can(user.roles, need ?? 'read')) {
    if (isApi) return apiError(403, 'forbidden', `Your roles (${user.roles.join(', ') || 'none'}) do not allow this (needs "${need}")`);
    return context.rewrite('/403');
  }
  return next();
});
