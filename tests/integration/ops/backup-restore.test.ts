// Backup and restore round trip of the demo database, table by table.
import { describe, it, expect, beforeAll, afterAll, inject } from 'vitest';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { QueryTypes } from 'sequelize';
import { createSequelize, setSequelize } from '../../../src/lib/db/sequelize';
import { migrate } from '../../../src/lib/db/migrate';
import { backupDatabase, restoreDatabase } from '../../../src/lib/ops/backup';
import { tableChecksums } from '../../../src/lib/ops/table-checksums';
import { checkData } from '../../../src/lib/ops/check-data';
import { seedDemo } from '../../../seeds/index';

const port = inject('dbPort');
const conn = (database: string) => ({ host: '127.0.0.1', port, user: 'root', password: '', database });
const url = (db: string) => `mariadb://root@127.0.0.1:${port}/${db}`;
const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'ionotheca-backup-'));

let src: ReturnType<typeof createSequelize>;
let dst: ReturnType<typeof createSequelize>;

beforeAll(async () => {
  const admin = createSequelize(url('ionotheca'));
  await admin.query('DROP DATABASE IF EXISTS backup_src');
  await admin.query('DROP DATABASE IF EXISTS backup_dst');
  await admin.query('CREATE DATABASE backup_src CHARACTER SET utf8mb4 COLLATE utf8mb4_bin');
  await admin.query('CREATE DATABASE backup_dst CHARACTER SET utf8mb4 COLLATE utf8mb4_bin');
  await admin.close();
  src = createSequelize(url('backup_src'));
  dst = createSequelize(url('backup_dst'));
  await migrate(src);
  setSequelize(src);
  const r = await seedDemo(src, { password: 'ionotheca-demo', log: () => {} });
  expect(r.seeded).toBe(true);
}, 180_000);

afterAll(async () => {
  await src?.close();
  await dst?.close();
  setSequelize(null);
  fs.rmSync(dir, { recursive: true, force: true });
});

describe('backup and restore', () => {
  it('the seeded demo database satisfies check-data', async () => {
    const r = await checkData(src);
    expect(r.problems).toEqual([]);
    expect(r.counts.spectrum_record).toBeGreaterThanOrEqual(180);
  });

  it('round-trips the demo database with equal checksums in every table', async () => {
    const b = await backupDatabase(src, conn('backup_src'), dir);
    expect(fs.statSync(b.dumpFile).size).toBeGreaterThan(10_000);
    expect(b.manifest.tables.spectrum_version.rows).toBeGreaterThanOrEqual(180);
    const r = await restoreDatabase(dst, conn('backup_dst'), b.dumpFile);
    expect(r.mismatches).toEqual([]);
    const a = await tableChecksums(src);
    const c = await tableChecksums(dst);
    expect(Object.keys(c).sort()).toEqual(Object.keys(a).sort());
    for (const t of Object.keys(a)) expect(c[t], t).toEqual(a[t]);
  });

  it('refuses to restore into a database that is not empty', async () => {
    const files = fs.readdirSync(dir).filter((f) => f.endsWith('.sql'));
    await expect(restoreDatabase(src, conn('backup_src'), path.join(dir, files[0]))).rejects.toThrow(/not empty/);
    const [n] = await src.query<{ n: number }>('SELECT COUNT(*) AS n FROM spectrum_record', { type: QueryTypes.SELECT });
    expect(Number(n.n)).toBeGreaterThanOrEqual(180);
  });
});
