// Start the real app (`npm start`'s scripts/start.ts) for a reliability run:
// free loopback ports, its own DATA_DIR, its own private MariaDB (unless
// DATABASE_URL is given), output into DATA_DIR/server-N.log. Every process
// started here is stopped by pid when the run ends.
import { spawn, spawnSync, type ChildProcess } from 'node:child_process';
import fs from 'node:fs';
import net from 'node:net';
import os from 'node:os';
import path from 'node:path';
import { buildIsStale } from '../../build-if-stale';

export const ROOT = path.resolve(import.meta.dirname, '..', '..', '..');

export function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const s = net.createServer();
    s.once('error', reject);
    s.listen(0, '127.0.0.1', () => {
      const port = (s.address() as net.AddressInfo).port;
      s.close(() => resolve(port));
    });
  });
}

/**
 * A private copy of the built app to run: dist/ and scripts/ copied, the rest
 * linked. Other people rebuilding dist/ in the same work tree while a run is
 * going would otherwise pull pages from under the server (Astro loads each
 * page's module on first use). RELIABILITY_SNAPSHOT=0 runs the tree as it is.
 */
export function snapshotRoot(log: (s: string) => void = console.log): string {
  if (process.env.RELIABILITY_SNAPSHOT === '0') return ROOT;
  // run.ts makes one copy for all its runs
  if (process.env.RELIABILITY_ROOT && fs.existsSync(process.env.RELIABILITY_ROOT)) return process.env.RELIABILITY_ROOT;
  const snap = fs.mkdtempSync(path.join(os.tmpdir(), 'ionotheca-snap-'));
  for (const name of ['node_modules', 'src', 'db', 'seeds', 'public', 'package.json', 'package-lock.json', 'tsconfig.json', 'astro.config.mjs']) {
    if (fs.existsSync(path.join(ROOT, name))) fs.symlinkSync(path.join(ROOT, name), path.join(snap, name));
  }
  fs.cpSync(path.join(ROOT, 'scripts'), path.join(snap, 'scripts'), { recursive: true });
  const stamp = path.join(ROOT, 'dist', '.build-stamp');
  const stampOf = () => (fs.existsSync(stamp) ? fs.readFileSync(stamp, 'utf8') : null);
  const before = stampOf();
  if (before && !buildIsStale()) {
    fs.cpSync(path.join(ROOT, 'dist'), path.join(snap, 'dist'), { recursive: true });
    // a build that started while we copied leaves a partial copy: build our own then
    if (stampOf() === before && !buildIsStale()) return snap;
    fs.rmSync(path.join(snap, 'dist'), { recursive: true, force: true });
  }
  log('Building a private copy of the app for this run…');
  const r = spawnSync(process.execPath, [path.join(ROOT, 'node_modules', 'astro', 'astro.js'), 'build', '--silent', '--outDir', path.join(snap, 'dist')], {
    cwd: ROOT, stdio: ['ignore', 'inherit', 'inherit'], env: { ...process.env, ASTRO_TELEMETRY_DISABLED: '1' },
  });
  if (r.status !== 0) throw new Error('astro build failed (see above)');
  const worker = path.join(snap, 'scripts', 'build-search-worker.mjs');
  if (fs.existsSync(worker)) {
    const w = spawnSync(process.execPath, [worker], { cwd: snap, stdio: ['ignore', 'inherit', 'inherit'] });
    if (w.status !== 0) throw new Error('building the search worker failed (see above)');
  }
  return snap;
}

export function removeSnapshot(root: string) {
  if (root !== ROOT && root !== process.env.RELIABILITY_ROOT && root.startsWith(os.tmpdir())) fs.rmSync(root, { recursive: true, force: true });
}

export function makeDataDir(prefix: string): string {
  return fs.mkdtempSync(path.join(os.tmpdir(), `ionotheca-${prefix}-`));
}

export interface ServerOptions {
  dataDir: string;
  port?: number;
  dbPort?: number;
  mailPort?: number;
  /** extra environment (DATABASE_URL, AUTH_SECRET, …) */
  env?: Record<string, string>;
  /** @default true */
  demoSeed?: boolean;
  /** @default 180000 */
  healthTimeoutMs?: number;
  /** the app's root folder (a snapshotRoot()) @default ROOT */
  root?: string;
}

export interface ServerHandle {
  base: string;
  port: number;
  dbPort: number;
  mailPort: number;
  dataDir: string;
  child: ChildProcess;
  logFile: string;
  /** SIGTERM, wait for the exit (SIGKILL after 30 s), stop a private MariaDB left behind */
  stop: () => Promise<void>;
  /** SIGKILL the app process only (its MariaDB keeps running) */
  kill: () => Promise<void>;
  logTail: (chars?: number) => string;
}

let serial = 0;

export function mariadbPid(dataDir: string): number | null {
  try {
    const pid = Number(fs.readFileSync(path.join(dataDir, 'mariadb', 'mysqld.pid'), 'utf8').trim());
    return pid > 0 ? pid : null;
  } catch {
    return null;
  }
}

export function pidAlive(pid: number): boolean {
  try {
    process.kill(pid, 0);
    return true;
  } catch (e) {
    return (e as NodeJS.ErrnoException).code === 'EPERM';
  }
}

export async function waitForExit(pid: number, ms: number): Promise<boolean> {
  const end = Date.now() + ms;
  while (Date.now() < end) {
    if (!pidAlive(pid)) return true;
    await sleep(100);
  }
  return !pidAlive(pid);
}

export const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

/** Stop the private MariaDB of a data folder by its pid file, if it is still running. */
export async function stopLeftoverMariadb(dataDir: string): Promise<void> {
  const pid = mariadbPid(dataDir);
  if (!pid || !pidAlive(pid)) return;
  try {
    const cmd = fs.readFileSync(`/proc/${pid}/cmdline`, 'utf8');
    if (!cmd.includes(path.join(dataDir, 'mariadb'))) return; // not ours
  } catch {
    return;
  }
  process.kill(pid, 'SIGTERM');
  if (!(await waitForExit(pid, 30_000))) process.kill(pid, 'SIGKILL');
}

export interface Health {
  status: string;
  db: string;
  ready?: boolean;
  message?: string;
  library: { spectra: number; records: number; version: number };
}

export async function getHealth(base: string, timeoutMs = 3000): Promise<{ status: number; body: Health } | null> {
  try {
    const r = await fetch(`${base}/api/health`, { signal: AbortSignal.timeout(timeoutMs) });
    return { status: r.status, body: (await r.json()) as Health };
  } catch {
    return null;
  }
}

/** Poll /api/health until `ok` says so (or the time is up); returns the last answer. */
export async function waitForHealth(base: string, ok: (h: { status: number; body: Health } | null) => boolean, timeoutMs: number, everyMs = 250) {
  const end = Date.now() + timeoutMs;
  let last = await getHealth(base);
  while (!ok(last) && Date.now() < end) {
    await sleep(everyMs);
    last = await getHealth(base);
  }
  return { ok: ok(last), last };
}

export async function startServer(o: ServerOptions): Promise<ServerHandle> {
  const port = o.port ?? (await freePort());
  const dbPort = o.dbPort ?? (await freePort());
  const mailPort = o.mailPort ?? (await freePort());
  fs.mkdirSync(o.dataDir, { recursive: true });
  const logFile = path.join(o.dataDir, `server-${++serial}-${port}.log`);
  const env: Record<string, string> = {
    ...(process.env as Record<string, string>),
    HOST: '127.0.0.1',
    PORT: String(port),
    DB_PORT: String(dbPort),
    MAIL_PORT: String(mailPort),
    DATA_DIR: o.dataDir,
    DEMO_SEED: o.demoSeed === false ? '0' : '1',
    DEMO_PASSWORD: 'ionotheca-demo',
    SKIP_BUILD: '1',
    DATABASE_URL: '',
    SMTP_URL: '',
    ...(o.env ?? {}),
  };
  const log = fs.openSync(logFile, 'a');
  const child = spawn(process.execPath, ['--import', 'tsx', 'scripts/start.ts'], { cwd: o.root ?? ROOT, env, stdio: ['ignore', log, log] });
  fs.closeSync(log);
  const base = `http://127.0.0.1:${port}`;
  const logTail = (chars = 3000) => (fs.existsSync(logFile) ? fs.readFileSync(logFile, 'utf8').slice(-chars) : '');
  const exited = new Promise<void>((r) => child.once('exit', () => r()));

  const handle: ServerHandle = {
    base, port, dbPort, mailPort, dataDir: o.dataDir, child, logFile, logTail,
    kill: async () => {
      if (child.exitCode === null && child.signalCode === null) {
        child.kill('SIGKILL');
        await exited;
      }
    },
    stop: async () => {
      if (child.exitCode === null && child.signalCode === null) {
        child.kill('SIGTERM');
        const t = setTimeout(() => child.kill('SIGKILL'), 30_000);
        await exited;
        clearTimeout(t);
      }
      if (!o.env?.DATABASE_URL) await stopLeftoverMariadb(o.dataDir);
    },
  };

  const end = Date.now() + (o.healthTimeoutMs ?? 180_000);
  while (Date.now() < end && child.exitCode === null) {
    const h = await getHealth(base);
    if (h?.body.status === 'ok') return handle;
    await sleep(250);
  }
  await handle.stop();
  throw new Error(`The server on ${base} did not become healthy.\n${logTail()}`);
}
