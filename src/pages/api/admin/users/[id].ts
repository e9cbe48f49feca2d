// PATCH /api/admin/users/:id { roles?, active? }: change roles; deactivate
// (ends sessions and disables keys at once) or reactivate.
import { z } from 'zod';
import { handle, json, readJson, HttpError } from '../../../../lib/http';
import { updateUser } from '../../../../lib/accounts';
import { ROLES } from '../../../../lib/roles';

const Body = z
  .object({
    roles: z.array(z.enum(ROLES)).min(1).max(ROLES.length).optional(),
    active: z.boolean().optional(),
  })
  .strict()
  .refine((b) => b.roles !== undefined || b.active !== undefined, { message: 'send roles or active' });

export const PATCH = handle(async ({ request, params, locals }) => {
  const body = await readJson(request, Body, 16 * 1024);
  const id = String(params.id ?? '');
  if (!id || id.length > 64) throw new HttpError(404, 'not_found', 'No such user');
  const user = await updateUser(id, body, locals.user!);
  return json({ user });
});
