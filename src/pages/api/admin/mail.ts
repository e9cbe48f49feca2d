// GET /api/admin/mail?to=&limit=: the messages the local fake SMTP server
// captured (only while SMTP_URL is unset; otherwise 404).
import { z } from 'zod';
import { QueryTypes } from 'sequelize';
import { handle, json, parseWith, queryObject, HttpError } from '../../../lib/http';
import { getSequelize } from '../../../lib/db/sequelize';
import { usesFakeMailbox } from '../../../lib/mail';

const Query = z.object({
  to: z.string().trim().max(255).optional(),
  limit: z.coerce.number().int().min(1).max(200).default(50),
});

export const GET = handle(async ({ url }) => {
  if (!usesFakeMailbox()) throw new HttpError(404, 'not_found', 'Mail goes to SMTP_URL; there is no local mailbox');
  const q = parseWith(Query, queryObject(url));
  const where = q.to ? 'WHERE `to` LIKE ?' : '';
  const params = q.to ? [`%${q.to.replace(/[\\%_]/g, (c) => '\\' + c)}%`] : [];
  const rows = await getSequelize().query<any>(`SELECT id, \`to\`, \`from\`, subject, text, html, receivedAt FROM mail_message ${where} ORDER BY id DESC LIMIT ${q.limit}`, {
    replacements: params,
    type: QueryTypes.SELECT,
  });
  return json({ items: rows.map((r: any) => ({ ...r, receivedAt: new Date(r.receivedAt).toISOString() })), total: rows.length });
});
