// GET /api/me: who the caller is, their roles and what those roles allow.
import type { APIRoute } from 'astro';
import { json } from '../../lib/http';
import { capabilitiesOf, homePathFor } from '../../lib/roles';

export const GET: APIRoute = async ({ locals }) => {
  const user = locals.user!;
  return json({
    user,
    capabilities: [...capabilitiesOf(user.roles)],
    home: homePathFor(user.roles),
    via: locals.apiKeyId ? 'api_key' : 'session',
    session: locals.session ? { expiresAt: locals.session.expiresAt } : null,
  });
};
