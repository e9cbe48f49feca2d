// The private MariaDB: starts, answers, stops; recovers after a killed run.
import { describe, it, expect, afterAll } from 'vitest';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import mariadb from 'mariadb';
import { startPrivateMariadb } from '../../db/mariadb.mjs';
import { freePort } from '../setup/ports';

const dirs: string[] = [];
afterAll(() => {
  for (const d of dirs) fs.rmSync(d, { recursive: true, force: true });
});

function alive(pid: number) {
  try {
    process.kill(pid, 0);
    return true;
  } catch {
    return false;
  }
}

describe('private MariaDB', () => {
  it('starts on loopback with utf8mb4_bin, answers a query, and stops', async () => {
    const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'ionotheca-pdb-'));
    dirs.push(dir);
    const port = await freePort();
    const db = await startPrivateMariadb({ dataDir: dir, port, fast: true, log: () => {} });
    const conn = await mariadb.createConnection({ host: '127.0.0.1', port, user: 'root', database: 'ionotheca' });
    const [row] = await conn.query('SELECT 1 + 1 AS two, @@collation_server AS coll, @@bind_address AS bind');
    await conn.end();
    expect(Number(row.two)).toBe(2);
    expect(row.coll).toBe('utf8mb4_bin');
    expect(row.bind).toBe('127.0.0.1');
    await db.stop();
    expect(alive(db.pid!)).toBe(false);
  });

  it('recovers the instance left by a killed run (same DATA_DIR) and keeps its data', async () => {
    const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'ionotheca-pdb-'));
    dirs.push(dir);
    const port = await freePort();
    const first = await startPrivateMariadb({ dataDir: dir, port, fast: true, log: () => {} });
    const c1 = await mariadb.createConnection({ host: '127.0.0.1', port, user: 'root', database: 'ionotheca' });
    await c1.query('CREATE TABLE kept (id INT PRIMARY KEY)');
    await c1.query('INSERT INTO kept VALUES (42)');
    await c1.end();
    // Simulate the app being killed: the server is left running, orphaned.
    first.child.unref();
    const second = await startPrivateMariadb({ dataDir: dir, port, fast: true, log: () => {} });
    expect(alive(first.pid!)).toBe(false);
    const c2 = await mariadb.createConnection({ host: '127.0.0.1', port, user: 'root', database: 'ionotheca' });
    const rows = await c2.query('SELECT id FROM kept');
    await c2.end();
    expect(rows.map((r: { id: number }) => r.id)).toEqual([42]);
    await second.stop();
  });

  it('says clearly when DB_PORT is held by another program', async () => {
    const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'ionotheca-pdb-'));
    dirs.push(dir);
    const net = await import('node:net');
    const holder = net.createServer().listen(0, '127.0.0.1');
    await new Promise((r) => holder.once('listening', r));
    const port = (holder.address() as { port: number }).port;
    await expect(startPrivateMariadb({ dataDir: dir, port, fast: true, log: () => {} })).rejects.toThrow(`DB_PORT ${port} is already in use`);
    holder.close();
  });
});
