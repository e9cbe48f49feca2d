// Checks and figures of a reliability run: each check prints as it is made,
// the figures go to tests/artifacts/reliability/<run>.json (ignored by git),
// and the run exits non-zero when any check failed.
import fs from 'node:fs';
import path from 'node:path';
import { spawnSync } from 'node:child_process';
import mariadb from 'mariadb';
import { ROOT } from './server';

export class RunReport {
  checks: { name: string; ok: boolean; detail: string }[] = [];
  figures: Record<string, unknown> = {};
  readonly started = Date.now();
  constructor(public run: string) {
    console.log(`\n=== ${run} ===`);
  }
  log(message: string) {
    console.log(`[${this.run} +${((Date.now() - this.started) / 1000).toFixed(1)}s] ${message}`);
  }
  check(name: string, ok: boolean, detail = ''): boolean {
    this.checks.push({ name, ok, detail });
    console.log(`  ${ok ? 'PASS' : 'FAIL'}  ${name}${detail ? ` — ${detail}` : ''}`);
    return ok;
  }
  figure(name: string, value: unknown) {
    this.figures[name] = value;
  }
  get ok() {
    return this.checks.length > 0 && this.checks.every((c) => c.ok);
  }
  /** Print the figures, write the JSON file, and return the exit code. */
  finish(): number {
    const seconds = (Date.now() - this.started) / 1000;
    console.log(`\n${this.run} figures:`);
    for (const [k, v] of Object.entries(this.figures)) console.log(`  ${k}: ${typeof v === 'object' ? JSON.stringify(v) : v}`);
    const failed = this.checks.filter((c) => !c.ok).length;
    console.log(`${this.run}: ${this.checks.length - failed} passed, ${failed} failed (${seconds.toFixed(1)} s)`);
    const dir = path.join(ROOT, 'tests', 'artifacts', 'reliability');
    fs.mkdirSync(dir, { recursive: true });
    fs.writeFileSync(
      path.join(dir, `${this.run}.json`),
      JSON.stringify({ run: this.run, at: new Date().toISOString(), seconds, ok: this.ok, checks: this.checks, figures: this.figures }, null, 2),
    );
    return this.ok ? 0 : 1;
  }
}

/** `npm run check-data` against a data folder's private MariaDB (or DATABASE_URL). */
export function runCheckData(env: Record<string, string>): { ok: boolean; output: string } {
  const r = spawnSync(process.execPath, ['--import', 'tsx', 'scripts/check-data.ts'], {
    cwd: ROOT,
    env: { ...(process.env as Record<string, string>), DATABASE_URL: '', ...env },
    encoding: 'utf8',
    timeout: 120_000,
  });
  return { ok: r.status === 0, output: `${r.stdout ?? ''}${r.stderr ?? ''}`.trim() };
}

/** A direct SQL connection to a private instance (root over loopback), for counting rows. */
export async function sqlConnection(dbPort: number, database = 'ionotheca') {
  return mariadb.createConnection({ host: '127.0.0.1', port: dbPort, user: 'root', database, bigIntAsNumber: true, connectTimeout: 5000 });
}

export async function countReleased(dbPort: number): Promise<number> {
  const c = await sqlConnection(dbPort);
  try {
    const [row] = await c.query("SELECT COUNT(*) AS n FROM spectrum_version WHERE status = 'released'");
    return Number(row.n);
  } finally {
    await c.end();
  }
}

export const round = (x: number, d = 1) => Math.round(x * 10 ** d) / 10 ** d;
