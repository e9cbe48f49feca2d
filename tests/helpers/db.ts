// Point the process's one Sequelize instance at the test database.
import { inject } from 'vitest';
import { createSequelize, setSequelize, getSequelize } from '../../src/lib/db/sequelize';

export function useTestDatabase() {
  const url = inject('dbUrl');
  process.env.DATABASE_URL = url;
  process.env.AUTH_SECRET ??= 'test-auth-secret-0123456789abcdef0123456789';
  process.env.REPORT_SIGNING_KEY ??= 'test-report-signing-key-0123456789abcdef';
  setSequelize(createSequelize(url));
  return getSequelize();
}
