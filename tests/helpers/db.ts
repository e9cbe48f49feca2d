// Point the process's one Sequelize instance at the test database.
import { inject } from 'vitest';
import type { Sequelize } from 'sequelize';
import { createSequelize, setSequelize, getSequelize } from '../../src/lib/db/sequelize';
import { migrate } from '../../src/lib/db/migrate';

export function useTestDatabase() {
  const url = inject('dbUrl');
  process.env.DATABASE_URL = url;
  process.env.AUTH_SECRET ??= 'test-auth-secret-0123456789abcdef0123456789';
  process.env.REPORT_SIGNING_KEY ??= 'test-report-signing-key-0123456789abcdef';
  setSequelize(createSequelize(url));
  return getSequelize();
}

const scratchUrl = (db: string) => `mariadb://root@127.0.0.1:${inject('dbPort')}/${db}`;

/**
 * A database of its own on the test server (the main test database is shared
 * with other files): dropped if left over, created, migrated and made the
 * process's Sequelize instance. Pair with dropScratchDatabase in afterAll.
 */
export async function createScratchDatabase(name: string): Promise<Sequelize> {
  const admin = createSequelize(scratchUrl('ionotheca'));
  await admin.query(`DROP DATABASE IF EXISTS ${name}`);
  await admin.query(`CREATE DATABASE ${name} CHARACTER SET utf8mb4 COLLATE utf8mb4_bin`);
  await admin.close();
  const s = createSequelize(scratchUrl(name));
  await migrate(s);
  setSequelize(s);
  return s;
}

/** Closes the scratch database's instance, unsets it and drops the database. */
export async function dropScratchDatabase(name: string, s: Sequelize | undefined): Promise<void> {
  setSequelize(null);
  await s?.close();
  const admin = createSequelize(scratchUrl('ionotheca'));
  await admin.query(`DROP DATABASE IF EXISTS ${name}`);
  await admin.close();
}
