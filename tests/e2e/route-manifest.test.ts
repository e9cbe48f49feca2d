// Every API route file has a manifest entry for each method it exports, and
// for every route and every principal (anonymous, a session of each role, an
// API key of each role) the built server answers 401, 403 or neither exactly
// as src/lib/route-manifest.ts says. Requests are made harmless: ids that do
// not exist and bodies that are not JSON, so nothing is changed.
import { describe, it, expect, beforeAll } from 'vitest';
import fs from 'node:fs';
import path from 'node:path';
import { API_ROUTES, type Need } from '../../src/lib/route-manifest';
import { can, ROLES, type Role } from '../../src/lib/roles';
import { call, demoEmail, issueKey, sessionFor, usersByEmail, type Credential } from '../helpers/auth';

const API_DIR = path.resolve('src/pages/api');
const METHODS = ['GET', 'POST', 'PUT', 'PATCH', 'DELETE'] as const;

interface RouteFile { file: string; pattern: string; methods: string[] }

function walk(dir: string): string[] {
  return fs.readdirSync(dir, { withFileTypes: true }).flatMap((e) => (e.isDirectory() ? walk(path.join(dir, e.name)) : [path.join(dir, e.name)]));
}

/** Astro's route pattern of a file under src/pages, e.g. api/spectra/[id]/index.ts → /api/spectra/[id]. */
function patternOf(file: string): string {
  const rel = path.relative(path.resolve('src/pages'), file).split(path.sep).join('/');
  return '/' + rel.replace(/\.(ts|js|mjs)$/, '').replace(/(^|\/)index$/, '');
}

function exportedMethods(source: string): string[] {
  const found = new Set<string>();
  for (const m of [...METHODS, 'ALL']) {
    if (new RegExp(`export\\s+(const|let|var|async\\s+function|function)\\s+${m}\\b`).test(source)) found.add(m);
    if (new RegExp(`export\\s*\\{[^}]*\\b${m}\\b[^}]*\\}`).test(source)) found.add(m);
  }
  return [...found];
}

const routeFiles: RouteFile[] = walk(API_DIR)
  .filter((f) => /\.(ts|js|mjs)$/.test(f) && !f.endsWith('.d.ts') && !/\.test\./.test(f))
  .map((file) => ({ file: path.relative(process.cwd(), file), pattern: patternOf(file), methods: exportedMethods(fs.readFileSync(file, 'utf8')) }));

describe('route manifest covers src/pages/api', () => {
  it('finds route files', () => {
    expect(routeFiles.length).toBeGreaterThan(5);
    expect(routeFiles.map((r) => r.pattern)).toContain('/api/health');
  });

  it('has an entry for every exported method of every route file', () => {
    const missing: string[] = [];
    for (const r of routeFiles) {
      if (r.methods.length === 0) missing.push(`${r.file}: exports no HTTP method`);
      if (r.methods.includes('ALL')) missing.push(`${r.file}: exports ALL; export each method so each has a manifest entry`);
      for (const m of r.methods.filter((x) => x !== 'ALL')) if (!(`${m} ${r.pattern}` in API_ROUTES)) missing.push(`${m} ${r.pattern} (${r.file})`);
    }
    expect(missing).toEqual([]);
  });
});

type Principal = { name: string; roles: Role[] | null; cred: Credential };

/** What the guard must answer a principal for a need. */
function expected(need: Need, roles: Role[] | null): '401' | '403' | 'allowed' {
  if (need === 'public') return 'allowed';
  if (!roles) return '401';
  if (need === 'signed-in') return 'allowed';
  return can(roles, need) ? 'allowed' : '403';
}

function concretePath(method: string, pattern: string): string {
  if (pattern === '/api/auth/[...all]') return method === 'GET' ? '/api/auth/ok' : '/api/auth/manifest-probe-not-a-route';
  return pattern.replace(/\[\.\.\.[^\]]+\]/g, 'probe').replace(/\[[^\]]+\]/g, '999999999');
}

describe('every route answers every principal as the manifest says', () => {
  const principals: Principal[] = [{ name: 'anonymous', roles: null, cred: null }];
  const ROLE_USER: Record<Role, string> = { viewer: 'viewer', analyst: 'analyst', curator: 'curator', auditor: 'auditor', admin: 'admin' };

  beforeAll(async () => {
    const cookies: Record<string, string> = {};
    for (const role of ROLES) cookies[role] = await sessionFor(ROLE_USER[role]);
    const users = await usersByEmail(cookies.admin);
    for (const role of ROLES) {
      const u = users.get(demoEmail(ROLE_USER[role]))!;
      expect(u, `demo user for ${role}`).toBeTruthy();
      principals.push({ name: `session:${role}`, roles: u.roles as Role[], cred: { cookie: cookies[role] } });
    }
    for (const role of ROLES) {
      const u = users.get(demoEmail(ROLE_USER[role]))!;
      const { key } = await issueKey(cookies.admin, u.id, `manifest test ${role}`);
      principals.push({ name: `key:${role}`, roles: u.roles as Role[], cred: { key } });
    }
  });

  const entries = routeFiles.flatMap((r) => r.methods.filter((m) => `${m} ${r.pattern}` in API_ROUTES).map((m) => ({ method: m, pattern: r.pattern })));

  it('walks at least the routes of this issue', () => {
    const keys = entries.map((e) => `${e.method} ${e.pattern}`);
    for (const k of ['GET /api/me', 'GET /api/admin/users', 'PATCH /api/admin/users/[id]', 'POST /api/admin/api-keys', 'DELETE /api/admin/api-keys/[id]', 'POST /api/invitations/accept']) expect(keys).toContain(k);
  });

  for (const { method, pattern } of entries) {
    const need = API_ROUTES[`${method} ${pattern}`];
    it(`${method} ${pattern} (needs ${need})`, async () => {
      const url = concretePath(method, pattern);
      const results = await Promise.all(
        principals.map(async (p) => {
          const res = await call(p.cred, method, url, undefined, method === 'GET' || method === 'DELETE' ? undefined : '{"not json');
          await res.arrayBuffer().catch(() => null);
          const want = expected(need, p.roles);
          const got = res.status === 401 ? '401' : res.status === 403 ? '403' : 'allowed';
          return { principal: p.name, status: res.status, want, ok: got === want };
        }),
      );
      const wrong = results.filter((r) => !r.ok).map((r) => `${r.principal}: got ${r.status}, expected ${r.want}`);
      expect(wrong).toEqual([]);
      // A 401 must come as the API's JSON error shape.
      const anon = await call(null, method, url, undefined, method === 'GET' || method === 'DELETE' ? undefined : '{"not json');
      if (anon.status === 401) expect((await anon.json()).error.code).toBe('unauthenticated');
    });
  }
});
