// POST /api/admin/lockouts/clear { email }: lift the sign-in lock of an address.
import { z } from 'zod';
import { handle, json, readJson } from '../../../../lib/http';
import { clearLockout } from '../../../../lib/lockout';

const Body = z.object({ email: z.string().trim().min(3).max(255) });

export const POST = handle(async ({ request, locals }) => {
  const { email } = await readJson(request, Body, 4096);
  const cleared = await clearLockout(email, locals.user!);
  return json({ email: email.toLowerCase(), cleared });
});
