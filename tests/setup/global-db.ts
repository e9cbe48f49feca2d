// vitest globalSetup: a private MariaDB for the test run, on its own port and
// temporary data folder, migrated once; stopped and removed afterwards.
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import type { TestProject } from 'vitest/node';
import { startPrivateMariadb } from '../../db/mariadb.mjs';
import { createSequelize } from '../../src/lib/db/sequelize';
import { migrate } from '../../src/lib/db/migrate';
import { freePort } from './ports';

let stop: (() => Promise<void>) | null = null;
let dir = '';

export default async function setup(project: TestProject) {
  dir = fs.mkdtempSync(path.join(os.tmpdir(), 'ionotheca-test-'));
  const port = await freePort();
  const db = await startPrivateMariadb({ dataDir: dir, port, fast: true, log: () => {} });
  stop = db.stop;
  const url = `mariadb://root@127.0.0.1:${port}/ionotheca`;
  const s = createSequelize(url);
  await migrate(s);
  await s.close();
  project.provide('dbUrl', url);
  project.provide('dbPort', port);
  project.provide('testDataDir', dir);
  process.env.IONOTHECA_TEST_DB_URL = url;
  return async () => {
    await stop?.();
    fs.rmSync(dir, { recursive: true, force: true });
  };
}

declare module 'vitest' {
  export interface ProvidedContext {
    dbUrl: string;
    dbPort: number;
    testDataDir: string;
  }
}
