// POST /api/invitations/accept { token, password, name? }: set the password
// from an invitation link; creates the account with the invited roles.
import { z } from 'zod';
import { handle, json, readJson } from '../../../lib/http';
import { acceptInvitation } from '../../../lib/invitations';

const Body = z.object({
  token: z.string().min(10).max(200),
  password: z.string().min(1).max(1000),
  name: z.string().trim().max(255).optional().nullable(),
});

export const POST = handle(async ({ request }) => {
  const body = await readJson(request, Body, 64 * 1024);
  const r = await acceptInvitation(body);
  return json({ ok: true, email: r.email, roles: r.roles });
});
