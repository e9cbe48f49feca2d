import type { APIRoute } from 'astro';
import { handle, json, readJson } from '../../../lib/http';
import { listSettings, putSetting, putSettingSchema } from '../../../lib/reports/settings';

// GET /api/admin/settings: 'search-defaults' and 'acceptance-criteria', each with its version history.
export const GET: APIRoute = handle(async () => json({ settings: await listSettings() }));

// PUT /api/admin/settings: { name, value, reason? } stores a new version.
export const PUT: APIRoute = handle(async ({ request, locals }) => {
  const body = await readJson(request, putSettingSchema);
  const saved = await putSetting(body, locals.user!);
  return json({ setting: saved, settings: await listSettings() });
});
