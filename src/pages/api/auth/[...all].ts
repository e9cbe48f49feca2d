// better-auth's handler (sign-in, sign-out, session, password reset), with the
// account lockout around e-mail sign-in (src/lib/auth.ts).
import type { APIRoute } from 'astro';
import { handleAuthRequest } from '../../../lib/auth';
import { errorResponse } from '../../../lib/http';

export const prerender = false;

const handler: APIRoute = async (ctx) => {
  let clientAddress: string | undefined;
  try {
    clientAddress = ctx.clientAddress;
  } catch {
    clientAddress = undefined;
  }
  try {
    return await handleAuthRequest(ctx.request, clientAddress);
  } catch (e) {
    return errorResponse(e);
  }
};

export const GET = handler;
export const POST = handler;
