// DELETE /api/admin/api-keys/:id: revoke a key; its next request gets 401.
import { handle, json, HttpError } from '../../../../lib/http';
import { revokeApiKey } from '../../../../lib/accounts';

export const DELETE = handle(async ({ params, locals }) => {
  const id = String(params.id ?? '');
  if (!id || id.length > 64) throw new HttpError(404, 'not_found', 'No such API key');
  return json({ revoked: await revokeApiKey(id, locals.user!) });
});
