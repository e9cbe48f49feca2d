// GET /api/admin/invitations: all invitations with their state.
// POST /api/admin/invitations { email, name?, roles }: invite by e-mail.
import { z } from 'zod';
import { handle, json, readJson } from '../../../../lib/http';
import { createInvitation, listInvitations } from '../../../../lib/invitations';
import { ROLES } from '../../../../lib/roles';

const Body = z.object({
  email: z.email().max(255),
  name: z.string().trim().max(255).optional().nullable(),
  roles: z.array(z.enum(ROLES)).min(1).max(ROLES.length),
});

export const GET = handle(async () => {
  const items = await listInvitations();
  return json({ items, total: items.length });
});

export const POST = handle(async ({ request, locals }) => {
  const body = await readJson(request, Body, 16 * 1024);
  const invitation = await createInvitation(body, locals.user!);
  return json({ invitation }, 201);
});
