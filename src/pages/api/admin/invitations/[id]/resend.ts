// POST /api/admin/invitations/:id/resend: a fresh link and expiry; the old link stops working.
import { handle, json, HttpError } from '../../../../../lib/http';
import { resendInvitation } from '../../../../../lib/invitations';

export const POST = handle(async ({ params, locals }) => {
  const id = Number(params.id);
  if (!Number.isInteger(id) || id < 1) throw new HttpError(404, 'not_found', 'No such invitation');
  const invitation = await resendInvitation(id, locals.user!);
  return json({ invitation });
});
