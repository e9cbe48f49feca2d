// POST /sign-out (the form in the app shell): end the session, back to sign-in.
import type { APIRoute } from 'astro';
import { signOutRequest } from '../lib/auth';

export const POST: APIRoute = async ({ request }) => {
  let cookies: string[] = [];
  try {
    if (request.headers.get('cookie')) cookies = await signOutRequest(request);
  } catch (e) {
    console.error('[auth] sign-out failed:', (e as Error).message);
  }
  const headers = new Headers({ location: '/sign-in?signed_out=1', 'cache-control': 'no-store' });
  for (const c of cookies) headers.append('set-cookie', c);
  return new Response(null, { status: 303, headers });
};

export const GET: APIRoute = () => new Response(null, { status: 303, headers: { location: '/' } });
