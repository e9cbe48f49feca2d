// GET /api/admin/api-keys: all keys (never the secret).
// POST /api/admin/api-keys { userId, name, expiresInDays? }: issue a key that
// acts as that user with their roles; the key is in this answer only.
import { z } from 'zod';
import { handle, json, readJson } from '../../../../lib/http';
import { issueApiKey, listApiKeys } from '../../../../lib/accounts';

const Body = z.object({
  userId: z.string().min(1).max(64),
  name: z.string().trim().min(1).max(80),
  expiresInDays: z.number().int().min(1).max(730).optional().nullable(),
});

export const GET = handle(async () => {
  const items = await listApiKeys();
  return json({ items, total: items.length });
});

export const POST = handle(async ({ request, locals }) => {
  const body = await readJson(request, Body, 16 * 1024);
  const key = await issueApiKey(body, locals.user!);
  return json({ apiKey: key }, 201);
});
