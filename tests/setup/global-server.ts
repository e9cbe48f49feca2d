// vitest globalSetup for browser and HTTP tests: the real `npm start` path
// (scripts/start.ts) on its own ports and temporary DATA_DIR, with its own
// private MariaDB and the demo scenario. The build is made beforehand by
// scripts/test.mjs.
import { spawn, type ChildProcess } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import type { TestProject } from 'vitest/node';
import { freePort } from './ports';

let child: ChildProcess | null = null;
let dir = '';

export default async function setup(project: TestProject) {
  dir = fs.mkdtempSync(path.join(os.tmpdir(), 'ionotheca-e2e-'));
  const [port, dbPort, mailPort] = [await freePort(), await freePort(), await freePort()];
  const env = {
    ...process.env,
    HOST: '127.0.0.1',
    PORT: String(port),
    DB_PORT: String(dbPort),
    MAIL_PORT: String(mailPort),
    DATA_DIR: dir,
    DEMO_SEED: '1',
    DEMO_PASSWORD: 'ionotheca-demo',
    SKIP_BUILD: '1',
    SIGN_IN_RATE_LIMIT: '2000',
    DATABASE_URL: '',
    SMTP_URL: '',
  };
  const log = fs.createWriteStream(path.join(dir, 'server.log'));
  child = spawn(process.execPath, ['--import', 'tsx', 'scripts/start.ts'], { env, stdio: ['ignore', 'pipe', 'pipe'] });
  child.stdout!.pipe(log);
  child.stderr!.pipe(log);
  const base = `http://127.0.0.1:${port}`;
  const deadline = Date.now() + 150_000;
  let ok = false;
  while (Date.now() < deadline && child.exitCode === null) {
    try {
      const r = await fetch(`${base}/api/health`);
      const h = (await r.json()) as { status: string };
      if (h.status === 'ok') {
        ok = true;
        break;
      }
    } catch {
      /* starting */
    }
    await new Promise((r) => setTimeout(r, 250));
  }
  if (!ok) {
    child.kill('SIGKILL');
    const out = fs.existsSync(path.join(dir, 'server.log')) ? fs.readFileSync(path.join(dir, 'server.log'), 'utf8') : '';
    throw new Error(`The test server did not become healthy.\n${out.slice(-3000)}`);
  }
  project.provide('baseUrl', base);
  project.provide('serverDataDir', dir);
  project.provide('serverDbPort', dbPort);
  project.provide('mailPort', mailPort);
  return async () => {
    if (child && child.exitCode === null) {
      child.kill('SIGTERM');
      await new Promise((r) => {
        const t = setTimeout(() => {
          child?.kill('SIGKILL');
          r(null);
        }, 30_000);
        child!.once('exit', () => {
          clearTimeout(t);
          r(null);
        });
      });
    }
    if (!process.env.KEEP_TEST_DATA) fs.rmSync(dir, { recursive: true, force: true });
  };
}

declare module 'vitest' {
  export interface ProvidedContext {
    baseUrl: string;
    serverDataDir: string;
    serverDbPort: number;
    mailPort: number;
  }
}
