// A small HTTP client for the reliability runs and the e2e security tests:
// sign in through better-auth, call the API with a session cookie or an API
// key, upload JCAMP-DX files, and find demo users and records.
export const DEMO_PASSWORD = 'ionotheca-demo';
export const demoEmail = (who: string) => `${who}@demo.ionotheca.test`;

export interface Credential {
  cookie?: string;
  apiKey?: string;
}

export interface ApiAnswer<T = any> {
  status: number;
  body: T;
  headers: Headers;
  ms: number;
}

export interface CallOptions extends Credential {
  method?: string;
  json?: unknown;
  body?: BodyInit;
  /** Origin header; defaults to the server's own origin for writes with a cookie */
  origin?: string | null;
  headers?: Record<string, string>;
  timeoutMs?: number;
}

export async function call<T = any>(base: string, path: string, o: CallOptions = {}): Promise<ApiAnswer<T>> {
  const method = o.method ?? (o.json !== undefined || o.body !== undefined ? 'POST' : 'GET');
  const headers: Record<string, string> = { ...(o.headers ?? {}) };
  if (o.cookie) headers.cookie = o.cookie;
  if (o.apiKey) headers.authorization = `Bearer ${o.apiKey}`;
  if (o.origin !== undefined) {
    if (o.origin !== null) headers.origin = o.origin;
  } else if (method !== 'GET' && method !== 'HEAD') headers.origin = base;
  let body = o.body;
  if (o.json !== undefined) {
    headers['content-type'] = 'application/json';
    body = JSON.stringify(o.json);
  }
  const t0 = performance.now();
  const r = await fetch(`${base}${path}`, { method, headers, body, redirect: 'manual', signal: AbortSignal.timeout(o.timeoutMs ?? 120_000) });
  const text = await r.text();
  const ms = performance.now() - t0;
  let parsed: any = text;
  if ((r.headers.get('content-type') ?? '').includes('json')) {
    try {
      parsed = JSON.parse(text);
    } catch {
      /* keep the text */
    }
  }
  return { status: r.status, body: parsed as T, headers: r.headers, ms };
}

/** E-mail and password sign-in; returns the Cookie header value and the raw Set-Cookie lines. */
export async function signIn(base: string, email: string, password = DEMO_PASSWORD): Promise<{ cookie: string; setCookie: string[]; status: number }> {
  const r = await fetch(`${base}/api/auth/sign-in/email`, {
    method: 'POST',
    headers: { 'content-type': 'application/json', origin: base },
    body: JSON.stringify({ email, password }),
    redirect: 'manual',
  });
  const setCookie = r.headers.getSetCookie();
  await r.text();
  const cookie = setCookie.map((c) => c.split(';')[0]).join('; ');
  return { cookie, setCookie, status: r.status };
}

export async function signInOrThrow(base: string, email: string, password = DEMO_PASSWORD): Promise<string> {
  const r = await signIn(base, email, password);
  if (r.status !== 200 || !r.cookie.includes('session_token')) throw new Error(`sign-in as ${email} failed (HTTP ${r.status})`);
  return r.cookie;
}

export interface UserItem {
  id: string;
  email: string;
  name: string;
  roles: string[];
  active: boolean;
}

export async function listUsers(base: string, admin: Credential): Promise<UserItem[]> {
  const r = await call<{ items: UserItem[] }>(base, '/api/admin/users', admin);
  if (r.status !== 200) throw new Error(`GET /api/admin/users: HTTP ${r.status} ${JSON.stringify(r.body).slice(0, 300)}`);
  return r.body.items;
}

export async function userId(base: string, admin: Credential, email: string): Promise<string> {
  const u = (await listUsers(base, admin)).find((x) => x.email.toLowerCase() === email.toLowerCase());
  if (!u) throw new Error(`no user ${email}`);
  return u.id;
}

/** Issue an API key for a user through the admin API; returns the secret. */
export async function issueApiKey(base: string, admin: Credential, forUserId: string, name: string): Promise<string> {
  const r = await call<{ apiKey: { key: string } }>(base, '/api/admin/api-keys', { ...admin, json: { userId: forUserId, name } });
  if (r.status !== 201 && r.status !== 200) throw new Error(`POST /api/admin/api-keys: HTTP ${r.status} ${JSON.stringify(r.body).slice(0, 300)}`);
  return r.body.apiKey.key;
}

export interface UploadFile {
  name: string;
  text: string;
}

/** POST /api/imports with the files in the multipart field `files`. */
export async function uploadFiles(base: string, cred: Credential, files: UploadFile[], timeoutMs = 600_000): Promise<ApiAnswer> {
  const form = new FormData();
  for (const f of files) form.append('files', new Blob([f.text], { type: 'chemical/x-jcamp-dx' }), f.name);
  return call(base, '/api/imports', { ...cred, body: form, timeoutMs });
}

/** The per-file status of an import answer, by file name. */
export function statusByFile(body: any): Map<string, string> {
  const m = new Map<string, string>();
  for (const f of body?.files ?? []) m.set(String(f.file), String(f.status));
  return m;
}

/** Submit a draft and have a second curator approve it (four eyes): the record is released. */
export async function releaseRecord(base: string, submitter: Credential, approver: Credential, id: number, password = DEMO_PASSWORD) {
  const s = await call(base, `/api/spectra/${id}/review`, { ...submitter, json: { action: 'submit' } });
  if (s.status !== 200) throw new Error(`submit ${id}: HTTP ${s.status} ${JSON.stringify(s.body).slice(0, 300)}`);
  const a = await call(base, `/api/spectra/${id}/review`, { ...approver, json: { action: 'approve', password } });
  if (a.status !== 200) throw new Error(`approve ${id}: HTTP ${a.status} ${JSON.stringify(a.body).slice(0, 300)}`);
  return a.body;
}

export function percentile(sorted: number[], p: number): number {
  if (sorted.length === 0) return NaN;
  const i = Math.min(sorted.length - 1, Math.max(0, Math.ceil((p / 100) * sorted.length) - 1));
  return sorted[i];
}
