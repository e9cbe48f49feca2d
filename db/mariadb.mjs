// The private MariaDB instance: find or install Debian's server, initialise a
// data directory on first use, start mariadbd on loopback, wait until it
// answers a query, and stop it again. Used by `npm start`, `npm test` and the
// backup/restore commands. Plain JavaScript so that it runs before anything is
// built or compiled.
import { spawn, spawnSync, execFileSync } from 'node:child_process';
import fs from 'node:fs';
import net from 'node:net';
import path from 'node:path';
import mariadb from 'mariadb';

export class DatabaseSetupError extends Error {
  constructor(message) {
    super(message);
    this.name = 'DatabaseSetupError';
  }
}

const SERVER_CANDIDATES = ['/usr/sbin/mariadbd', '/usr/bin/mariadbd', '/usr/sbin/mysqld'];
const INSTALL_DB_CANDIDATES = ['/usr/bin/mariadb-install-db', '/usr/bin/mysql_install_db'];

function firstExisting(paths) {
  return paths.find((p) => fs.existsSync(p)) ?? null;
}

/** Locate mariadbd and mariadb-install-db; install Debian's package when root and missing. */
export function ensureMariadbInstalled({ log = console.log } = {}) {
  let server = firstExisting(SERVER_CANDIDATES);
  let installDb = firstExisting(INSTALL_DB_CANDIDATES);
  if (server && installDb) return { server, installDb };
  const isRoot = typeof process.getuid === 'function' && process.getuid() === 0;
  if (!isRoot) {
    throw new DatabaseSetupError(
      "MariaDB server is not installed. Install Debian's package and run again:\n" +
        '    sudo apt-get update && sudo apt-get install -y mariadb-server',
    );
  }
  log('Installing mariadb-server with apt-get (first run only)…');
  const env = { ...process.env, DEBIAN_FRONTEND: 'noninteractive' };
  for (const args of [['update'], ['install', '-y', 'mariadb-server']]) {
    const r = spawnSync('apt-get', args, { stdio: 'inherit', env });
    if (r.status !== 0) {
      throw new DatabaseSetupError(
        `apt-get ${args.join(' ')} failed. Run it by hand: apt-get update && apt-get install -y mariadb-server`,
      );
    }
  }
  // Debian's package starts a system-wide service; we do not need it.
  spawnSync('service', ['mariadb', 'stop'], { stdio: 'ignore' });
  server = firstExisting(SERVER_CANDIDATES);
  installDb = firstExisting(INSTALL_DB_CANDIDATES);
  if (!server || !installDb) throw new DatabaseSetupError('mariadb-server installed but mariadbd was not found.');
  return { server, installDb };
}

function ensureWritableDir(dir) {
  try {
    fs.mkdirSync(dir, { recursive: true });
    fs.accessSync(dir, fs.constants.W_OK);
    const probe = path.join(dir, `.write-probe-${process.pid}`);
    fs.writeFileSync(probe, '');
    fs.unlinkSync(probe);
  } catch (e) {
    throw new DatabaseSetupError(`DATA_DIR ${dir} cannot be written (${e.code ?? e.message}). Choose another DATA_DIR or fix its permissions.`);
  }
}

function pidAlive(pid) {
  try {
    process.kill(pid, 0);
    return true;
  } catch (e) {
    return e.code === 'EPERM';
  }
}

function isOurMariadb(pid, datadir) {
  try {
    const cmd = fs.readFileSync(`/proc/${pid}/cmdline`, 'utf8').split('\0');
    return cmd.some((a) => /mariadbd|mysqld/.test(a)) && cmd.some((a) => a === `--datadir=${datadir}`);
  } catch {
    return false;
  }
}

function portFree(port, host = '127.0.0.1') {
  return new Promise((resolve) => {
    const srv = net.createServer();
    srv.once('error', () => resolve(false));
    srv.once('listening', () => srv.close(() => resolve(true)));
    srv.listen(port, host);
  });
}

async function waitForExit(pid, ms) {
  const end = Date.now() + ms;
  while (Date.now() < end) {
    if (!pidAlive(pid)) return true;
    await new Promise((r) => setTimeout(r, 100));
  }
  return !pidAlive(pid);
}

/** Try a query until the server answers (readiness by connecting, not sleeping). */
export async function waitUntilAnswers({ socketPath, host, port, user = 'root', password, timeoutMs = 30000, child }) {
  const end = Date.now() + timeoutMs;
  let lastError;
  while (Date.now() < end) {
    if (child && child.exitCode !== null) break;
    let conn;
    try {
      conn = await mariadb.createConnection({ socketPath, host, port, user, password, connectTimeout: 1000 });
      await conn.query('SELECT 1');
      await conn.end();
      return;
    } catch (e) {
      lastError = e;
      if (conn) await conn.end().catch(() => {});
      await new Promise((r) => setTimeout(r, 100));
    }
  }
  throw new DatabaseSetupError(`The private MariaDB did not answer${lastError ? `: ${lastError.message}` : ''}`);
}

/**
 * Start (or recover) the private instance for a data folder.
 * @param {object} o
 * @param {string} o.dataDir  the app's DATA_DIR; the database lives in DATA_DIR/mariadb
 * @param {number} o.port     loopback port (DB_PORT)
 * @param {boolean} [o.fast]  test-only durability shortcuts
 * @param {(line: string) => void} [o.log]  progress messages
 * @param {string} [o.database]  the database to create @default 'ionotheca'
 * @returns {Promise<{ port, socketPath, datadir, pid, child: import('node:child_process').ChildProcess, stop: () => Promise<void>, url }>}
 */
export async function startPrivateMariadb({ dataDir, port, fast = false, log = console.log, database = 'ionotheca' }) {
  const { server, installDb } = ensureMariadbInstalled({ log });
  dataDir = path.resolve(dataDir);
  ensureWritableDir(dataDir);
  const datadir = path.join(dataDir, 'mariadb');
  const socketPath = path.join(datadir, 'mysqld.sock');
  const pidFile = path.join(datadir, 'mysqld.pid');

  if (!fs.existsSync(path.join(datadir, 'mysql'))) {
    fs.mkdirSync(datadir, { recursive: true });
    const r = spawnSync(
      installDb,
      ['--no-defaults', `--datadir=${datadir}`, '--user=root', '--auth-root-authentication-method=normal', '--skip-test-db'],
      { encoding: 'utf8' },
    );
    if (r.status !== 0) throw new DatabaseSetupError(`mariadb-install-db failed: ${(r.stderr || r.stdout || '').trim().split('\n').pop()}`);
  }

  // A previous run that was killed may have left its server (same data dir) or a stale socket.
  if (fs.existsSync(pidFile)) {
    const pid = Number(fs.readFileSync(pidFile, 'utf8').trim());
    if (pid && pidAlive(pid) && isOurMariadb(pid, datadir)) {
      log(`Stopping the private MariaDB left running by an earlier run (pid ${pid})…`);
      process.kill(pid, 'SIGTERM');
      if (!(await waitForExit(pid, 30000))) process.kill(pid, 'SIGKILL');
      await waitForExit(pid, 5000);
    }
    fs.rmSync(pidFile, { force: true });
  }
  fs.rmSync(socketPath, { force: true });
  fs.rmSync(`${socketPath}.lock`, { force: true });

  if (!(await portFree(port))) {
    throw new DatabaseSetupError(`DB_PORT ${port} is already in use by another program. Set DB_PORT to a free port.`);
  }

  const args = [
    '--no-defaults',
    `--datadir=${datadir}`,
    `--socket=${socketPath}`,
    `--pid-file=${pidFile}`,
    `--port=${port}`,
    '--bind-address=127.0.0.1',
    '--user=root',
    '--character-set-server=utf8mb4',
    '--collation-server=utf8mb4_bin',
    '--max-allowed-packet=256M',
    '--innodb-buffer-pool-size=256M',
    `--log-error=${path.join(datadir, 'error.log')}`,
  ];
  if (fast) args.push('--innodb-flush-log-at-trx-commit=0', '--innodb-doublewrite=0', '--skip-log-bin');
  const child = spawn(server, args, { stdio: 'ignore', detached: false });
  let exited = false;
  child.on('exit', () => {
    exited = true;
  });
  try {
    await waitUntilAnswers({ socketPath, child, timeoutMs: 60000 });
  } catch (e) {
    try {
      child.kill('SIGKILL');
    } catch {}
    const tail = fs.existsSync(path.join(datadir, 'error.log'))
      ? fs.readFileSync(path.join(datadir, 'error.log'), 'utf8').trim().split('\n').slice(-3).join('\n')
      : '';
    throw new DatabaseSetupError(`${e.message}${tail ? `\n${tail}` : ''}`);
  }
  const conn = await mariadb.createConnection({ socketPath, user: 'root' });
  await conn.query(`CREATE DATABASE IF NOT EXISTS \`${database}\` CHARACTER SET utf8mb4 COLLATE utf8mb4_bin`);
  await conn.end();

  const stop = async () => {
    if (exited || child.exitCode !== null) return;
    child.kill('SIGTERM');
    const done = await waitForExit(child.pid, 30000);
    if (!done) child.kill('SIGKILL');
  };
  return { port, socketPath, datadir, pid: child.pid, child, stop, url: `mariadb://root@127.0.0.1:${port}/${database}` };
}

/** Check that an external server named by DATABASE_URL answers. */
export async function checkDatabaseUrl(url, timeoutMs = 10000) {
  const u = new URL(url);
  try {
    const conn = await mariadb.createConnection({
      host: u.hostname,
      port: Number(u.port || 3306),
      user: decodeURIComponent(u.username),
      password: decodeURIComponent(u.password),
      database: u.pathname.replace(/^\//, '') || undefined,
      connectTimeout: timeoutMs,
    });
    await conn.query('SELECT 1');
    await conn.end();
  } catch (e) {
    throw new DatabaseSetupError(`DATABASE_URL ${u.protocol}//${u.host}${u.pathname} does not answer: ${e.code ?? e.message}`);
  }
}

export function mariadbToolPath(name) {
  try {
    return execFileSync('which', [name], { encoding: 'utf8' }).trim();
  } catch {
    return null;
  }
}

/**
 * For commands that run beside a live app (backup, restore, check-data): use
 * the private instance when it already answers, else start it for the
 * duration of the command.
 */
export async function usePrivateMariadb({ dataDir, port, log = console.log }) {
  const datadir = path.join(path.resolve(dataDir), 'mariadb');
  const socketPath = path.join(datadir, 'mysqld.sock');
  try {
    await waitUntilAnswers({ socketPath, timeoutMs: 1500 });
    return { port, socketPath, datadir, stop: async () => {}, alreadyRunning: true };
  } catch {
    const db = await startPrivateMariadb({ dataDir, port, log });
    return { ...db, alreadyRunning: false };
  }
}
