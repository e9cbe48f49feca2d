// better-auth's browser client (same origin, /api/auth), plus small fetch
// helpers the account screens share. Imported only by islands.
import { createAuthClient } from 'better-auth/client';

let client: ReturnType<typeof createAuthClient> | null = null;

/** The client, created on first use in the browser (same origin). */
export function getAuthClient() {
  if (!client) client = createAuthClient({ baseURL: `${window.location.origin}/api/auth` });
  return client;
}

export class ApiCallError extends Error {
  constructor(public status: number, public code: string, message: string) {
    super(message);
  }
}

/** JSON in, JSON out; API errors ({ error: { code, message } } or better-auth's { code, message }) become ApiCallError. */
export async function apiCall<T = any>(path: string, init: { method?: string; body?: unknown } = {}): Promise<T> {
  const res = await fetch(path, {
    method: init.method ?? (init.body === undefined ? 'GET' : 'POST'),
    headers: init.body === undefined ? {} : { 'content-type': 'application/json' },
    body: init.body === undefined ? undefined : JSON.stringify(init.body),
    credentials: 'same-origin',
  });
  const data = await res.json().catch(() => ({}));
  if (!res.ok) {
    const e = data?.error ?? data ?? {};
    throw new ApiCallError(res.status, String(e.code ?? res.status), String(e.message ?? `The server answered ${res.status}`));
  }
  return data as T;
}
