// The better-auth adapter (src/lib/db/auth-adapter.ts): better-auth's own
// adapter suites from @better-auth/test-utils against a scratch database in
// the test MariaDB, then our own tests against the real migrated tables.
import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import { QueryTypes, type Sequelize } from 'sequelize';
import { getAuthTables } from 'better-auth/db';
import type { BetterAuthOptions } from 'better-auth';
import {
  testAdapter,
  normalTestSuite,
  transactionsTestSuite,
  authFlowTestSuite,
  numberIdTestSuite,
  uuidTestSuite,
  joinsTestSuite,
  caseInsensitiveTestSuite,
} from '@better-auth/test-utils/adapter';
import { useTestDatabase } from '../helpers/db';
import { createSequelize, closeSequelize } from '../../src/lib/db/sequelize';
import { sequelizeAdapter, escapeLike } from '../../src/lib/db/auth-adapter';

const mainDb = useTestDatabase();
const SUITE_DB = 'ionotheca_adapter_suite';
const suiteUrl = (() => {
  const u = new URL(process.env.DATABASE_URL!);
  u.pathname = '/' + SUITE_DB;
  return u.toString();
})();
let suiteDb: Sequelize | null = null;
const getSuiteDb = () => {
  if (!suiteDb) throw new Error('suite database not ready');
  return suiteDb;
};

const q = (name: string) => '`' + name + '`';

/** Tables for whatever better-auth options a suite asks for, from getAuthTables (the way a schema generator would). */
async function createAuthSchema(db: Sequelize, options: BetterAuthOptions) {
  const tables = getAuthTables(options);
  const serial = options.advanced?.database?.generateId === 'serial';
  const idType = serial ? 'INT' : 'VARCHAR(255)';
  const existing = await db.query<{ t: string }>('SELECT TABLE_NAME AS t FROM information_schema.TABLES WHERE TABLE_SCHEMA = DATABASE()', { type: QueryTypes.SELECT });
  await db.query('SET FOREIGN_KEY_CHECKS = 0', { type: QueryTypes.RAW });
  for (const { t } of existing) await db.query(`DROP TABLE ${q(t)}`, { type: QueryTypes.RAW });
  const statements: string[] = [];
  for (const table of Object.values(tables)) {
    const cols = [`${q('id')} ${idType} NOT NULL${serial ? ' AUTO_INCREMENT' : ''} PRIMARY KEY`];
    const extras: string[] = [];
    for (const [key, f] of Object.entries(table.fields)) {
      const name = f.fieldName ?? key;
      if (name === 'id') continue;
      let type: string;
      if (f.references) type = f.references.field === 'id' ? idType : 'VARCHAR(255)';
      else if (f.type === 'string') type = f.unique || f.index || f.sortable ? 'VARCHAR(255)' : 'TEXT';
      else if (f.type === 'number') type = f.bigint ? 'BIGINT' : 'DOUBLE';
      else if (f.type === 'boolean') type = 'TINYINT(1)';
      else if (f.type === 'date') type = 'DATETIME(3)';
      else type = 'LONGTEXT';
      cols.push(`${q(name)} ${type} ${f.required === false ? 'NULL' : 'NOT NULL'}`);
      if (f.unique) extras.push(`UNIQUE KEY ${q(`${name}_unique`)} (${q(name)})`);
      if (f.references) {
        const target = tables[f.references.model]?.modelName ?? f.references.model;
        const targetColumn = f.references.field === 'id' ? 'id' : (tables[f.references.model]?.fields[f.references.field]?.fieldName ?? f.references.field);
        const onDelete = (f.references.onDelete ?? 'cascade').toUpperCase().replace('-', ' ');
        extras.push(`FOREIGN KEY (${q(name)}) REFERENCES ${q(target)} (${q(targetColumn)}) ON DELETE ${onDelete}`);
      }
    }
    statements.push(`CREATE TABLE ${q(table.modelName)} (${[...cols, ...extras].join(', ')}) ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_bin`);
  }
  for (const s of statements) await db.query(s, { type: QueryTypes.RAW });
  await db.query('SET FOREIGN_KEY_CHECKS = 1', { type: QueryTypes.RAW });
}

beforeAll(async () => {
  await mainDb.query(`CREATE DATABASE IF NOT EXISTS ${q(SUITE_DB)} CHARACTER SET utf8mb4 COLLATE utf8mb4_bin`, { type: QueryTypes.RAW });
  // One connection, so SET FOREIGN_KEY_CHECKS applies to the DDL that follows it.
  suiteDb = createSequelize(suiteUrl, { pool: 1 });
});

afterAll(async () => {
  await suiteDb?.close();
  await closeSequelize();
});

const { execute } = await testAdapter({
  adapter: () => sequelizeAdapter({ sequelize: getSuiteDb }),
  runMigrations: (options) => createAuthSchema(getSuiteDb(), options),
  tests: [
    normalTestSuite(),
    transactionsTestSuite(),
    authFlowTestSuite(),
    numberIdTestSuite(),
    uuidTestSuite(),
    joinsTestSuite(),
    caseInsensitiveTestSuite(),
  ],
});
execute();

describe('our own adapter tests against the migrated tables', () => {
  const adapter = () => sequelizeAdapter()({ user: { additionalFields: { roles: { type: 'string', required: false }, active: { type: 'boolean', required: false } } } } as BetterAuthOptions);
  const base = () => ({ name: 'Ada Example', emailVerified: false, createdAt: new Date('2024-05-01T10:00:00.123Z'), updatedAt: new Date('2024-05-01T10:00:00.123Z') });

  beforeAll(async () => {
    await mainDb.query('DELETE FROM `session`', { type: QueryTypes.RAW });
    await mainDb.query("DELETE FROM `user` WHERE email LIKE '%@adapter.test'", { type: QueryTypes.RAW });
  });

  it('creates a row and returns all its columns, null where absent, dates to the millisecond', async () => {
    const a = adapter();
    const u = await a.create<any>({ model: 'user', data: { ...base(), email: 'one@adapter.test', roles: 'curator,admin' } });
    expect(u.id).toEqual(expect.any(String));
    expect(u.email).toBe('one@adapter.test');
    expect(u.image).toBeNull();
    expect(u.emailVerified).toBe(false);
    expect(u.active).toBe(true);
    expect(u.roles).toBe('curator,admin');
    expect(u.createdAt).toBeInstanceOf(Date);
    expect(u.createdAt.toISOString()).toBe('2024-05-01T10:00:00.123Z');
  });

  it('finds one and many, with select, sort, limit and offset', async () => {
    const a = adapter();
    for (const n of ['b', 'c', 'd']) await a.create({ model: 'user', data: { ...base(), email: `${n}@adapter.test`, name: `User ${n}` } });
    const one = await a.findOne<any>({ model: 'user', where: [{ field: 'email', value: 'c@adapter.test' }], select: ['email', 'name'] });
    expect(one).toEqual({ email: 'c@adapter.test', name: 'User c' });
    const page = await a.findMany<any>({ model: 'user', where: [{ field: 'email', operator: 'ends_with', value: '@adapter.test' }], sortBy: { field: 'email', direction: 'desc' }, limit: 2, offset: 1 });
    expect(page.map((u: any) => u.email)).toEqual(['d@adapter.test', 'c@adapter.test']);
    expect(await a.findOne({ model: 'user', where: [{ field: 'email', value: 'nobody@adapter.test' }] })).toBeNull();
  });

  it('counts with and without conditions', async () => {
    const a = adapter();
    const all = await a.count({ model: 'user', where: [{ field: 'email', operator: 'ends_with', value: '@adapter.test' }] });
    expect(all).toBe(4);
    expect(await a.count({ model: 'user', where: [{ field: 'email', operator: 'in', value: ['b@adapter.test', 'c@adapter.test', 'x@adapter.test'] }] })).toBe(2);
  });

  it('applies each where operator', async () => {
    const a = adapter();
    const emails = async (where: any[]) => (await a.findMany<any>({ model: 'user', where: [{ field: 'email', operator: 'ends_with', value: '@adapter.test' }, ...where], sortBy: { field: 'email', direction: 'asc' } })).map((u: any) => u.email[0]).join('');
    expect(await emails([{ field: 'email', operator: 'eq', value: 'b@adapter.test' }])).toBe('b');
    expect(await emails([{ field: 'email', operator: 'ne', value: 'b@adapter.test' }])).toBe('cdo');
    expect(await emails([{ field: 'email', operator: 'lt', value: 'c@adapter.test' }])).toBe('b');
    expect(await emails([{ field: 'email', operator: 'lte', value: 'c@adapter.test' }])).toBe('bc');
    expect(await emails([{ field: 'email', operator: 'gt', value: 'c@adapter.test' }])).toBe('do');
    expect(await emails([{ field: 'email', operator: 'gte', value: 'd@adapter.test' }])).toBe('do');
    expect(await emails([{ field: 'email', operator: 'in', value: ['d@adapter.test', 'one@adapter.test'] }])).toBe('do');
    expect(await emails([{ field: 'email', operator: 'not_in', value: ['d@adapter.test', 'one@adapter.test'] }])).toBe('bc');
    expect(await emails([{ field: 'email', operator: 'in', value: [] }])).toBe('');
    expect(await emails([{ field: 'name', operator: 'contains', value: 'ser ' }])).toBe('bcd');
    expect(await emails([{ field: 'name', operator: 'starts_with', value: 'Ada' }])).toBe('o');
    expect(await emails([{ field: 'image', operator: 'eq', value: null }])).toBe('bcdo');
    expect(await emails([{ field: 'email', value: 'b@adapter.test', connector: 'OR' }, { field: 'email', value: 'd@adapter.test', connector: 'OR' }])).toBe('bd');
    // Case: the binary collation is exact unless the caller asks otherwise.
    expect(await emails([{ field: 'name', operator: 'eq', value: 'user b' }])).toBe('');
    expect(await emails([{ field: 'name', operator: 'eq', value: 'user b', mode: 'insensitive' }])).toBe('b');
  });

  it('treats % and _ in LIKE patterns literally', async () => {
    expect(escapeLike('50%_a\\b')).toBe('50\\%\\_a\\\\b');
    const a = adapter();
    await a.create({ model: 'user', data: { ...base(), email: 'pct@adapter.test', name: '100% sure_x' } });
    const hits = await a.findMany<any>({ model: 'user', where: [{ field: 'name', operator: 'contains', value: '% sure_' }] });
    expect(hits.map((u: any) => u.email)).toEqual(['pct@adapter.test']);
    expect(await a.count({ model: 'user', where: [{ field: 'name', operator: 'contains', value: '_' }] })).toBe(1);
    await a.delete({ model: 'user', where: [{ field: 'email', value: 'pct@adapter.test' }] });
  });

  it('updates one row and returns it; updateMany and deleteMany return exact counts', async () => {
    const a = adapter();
    const u = await a.update<any>({ model: 'user', where: [{ field: 'email', value: 'b@adapter.test' }], update: { name: 'Renamed', active: false } });
    expect(u.name).toBe('Renamed');
    expect(u.active).toBe(false);
    expect(await a.update({ model: 'user', where: [{ field: 'email', value: 'none@adapter.test' }], update: { name: 'x' } })).toBeNull();
    // Matched rows count, also where a row already held the value.
    expect(await a.updateMany({ model: 'user', where: [{ field: 'email', operator: 'in', value: ['b@adapter.test', 'c@adapter.test'] }], update: { name: 'Renamed' } })).toBe(2);
    expect(await a.deleteMany({ model: 'user', where: [{ field: 'email', operator: 'in', value: ['c@adapter.test', 'd@adapter.test', 'zz@adapter.test'] }] })).toBe(2);
    await a.delete({ model: 'user', where: [{ field: 'email', value: 'b@adapter.test' }] });
    expect(await a.count({ model: 'user', where: [{ field: 'email', operator: 'ends_with', value: '@adapter.test' }] })).toBe(1);
  });

  it('rolls a transaction back', async () => {
    const a = adapter();
    await expect(a.transaction(async (tx) => {
      await tx.create({ model: 'user', data: { ...base(), email: 'tx@adapter.test' } });
      expect(await tx.count({ model: 'user', where: [{ field: 'email', value: 'tx@adapter.test' }] })).toBe(1);
      throw new Error('undo');
    })).rejects.toThrow('undo');
    expect(await a.count({ model: 'user', where: [{ field: 'email', value: 'tx@adapter.test' }] })).toBe(0);
  });

  it('stores sessions against users (foreign key) and rate-limit rows', async () => {
    const a = adapter();
    const u = await a.findOne<any>({ model: 'user', where: [{ field: 'email', value: 'one@adapter.test' }] });
    const s = await a.create<any>({ model: 'session', data: { userId: u.id, token: 'tok-' + Date.now(), expiresAt: new Date(Date.now() + 3600_000), createdAt: new Date(), updatedAt: new Date() } });
    expect(s.userId).toBe(u.id);
    expect(s.ipAddress).toBeNull();
    await a.delete({ model: 'user', where: [{ field: 'id', value: u.id }] });
    expect(await a.count({ model: 'session', where: [{ field: 'userId', value: u.id }] })).toBe(0);
  });
});
