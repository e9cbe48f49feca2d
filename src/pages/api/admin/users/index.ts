// GET /api/admin/users: every user with roles, state, lock and key counts.
import { handle, json } from '../../../../lib/http';
import { listUsers } from '../../../../lib/accounts';
import { currentLockouts } from '../../../../lib/lockout';

export const GET = handle(async () => {
  const [users, lockouts] = await Promise.all([listUsers(), currentLockouts()]);
  return json({ items: users, total: users.length, lockouts });
});
