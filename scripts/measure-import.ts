// Measures how long 1,000 small JCAMP-DX files take to import through the
// HTTP API (POST /api/imports), the way the import screen sends them (one
// file a request, a few at a time) and in batches (many files a request).
// Starts its own server (scripts/start.ts: private MariaDB, migrations, demo
// users) on free ports in a temporary DATA_DIR unless BASE_URL is given, and
// needs a current build (node --import tsx scripts/build-if-stale.ts).
//   node --import tsx scripts/measure-import.ts [--files=1000] [--parallel=4] [--batch=100]
// The files are invented test spectra, written here, not for identification.
import { spawn, type ChildProcess } from 'node:child_process';
import fs from 'node:fs';
import net from 'node:net';
import os from 'node:os';
import path from 'node:path';

const ROOT = path.resolve(import.meta.dirname, '..');
const arg = (name: string, d: number) => Number(process.argv.find((a) => a.startsWith(`--${name}=`))?.split('=')[1] ?? d);
const FILES = arg('files', 1000);
const PARALLEL = arg('parallel', 4);
const BATCH = arg('batch', 100);

function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const s = net.createServer();
    s.once('error', reject);
    s.listen(0, '127.0.0.1', () => {
      const port = (s.address() as net.AddressInfo).port;
      s.close(() => resolve(port));
    });
  });
}

/** Deterministic pseudo-random numbers (mulberry32). */
function rng(seed: number) {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

const FORMULAS = ['C 6 H 6', 'C 7 H 8', 'C 8 H 10', 'C 6 H 5 Cl', 'C 7 H 7 Cl', 'C 4 H 10 O', 'C 3 H 6 O', 'C 10 H 8', 'C 6 H 12 O', 'C 9 H 12'];

/** A small peak-table file (about 30 peaks, under 1 KB) of an invented compound. */
function smallFile(run: string, i: number, next: () => number): { name: string; text: string } {
  const peaks = new Map<number, number>();
  while (peaks.size < 30) peaks.set(15 + Math.floor(next() * 250), 1 + Math.floor(next() * 998));
  const list = [...peaks.entries()].sort((a, b) => a[0] - b[0]);
  list[Math.floor(next() * list.length)][1] = 999;
  const text = [
    `##TITLE= Measure ${run} compound ${i}`, '##JCAMP-DX= 5.01', '##DATA TYPE= MASS SPECTRUM', '##ORIGIN= import measurement (invented)',
    '##OWNER= measure', `##NAMES= Measure ${run} compound ${i}`, `##MOLFORM= ${FORMULAS[i % FORMULAS.length]}`, '##.IONIZATION ENERGY= 70',
    `##NPOINTS= ${list.length}`, '##PEAK TABLE= (XY..XY)', ...list.map(([m, v]) => `${m}, ${v}`), '##END=', '',
  ].join('\n');
  return { name: `measure-${run}-${String(i).padStart(4, '0')}.jdx`, text };
}

async function startServer(): Promise<{ base: string; stop: () => Promise<void> }> {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'ionotheca-measure-'));
  const [port, dbPort, mailPort] = [await freePort(), await freePort(), await freePort()];
  const env = {
    ...process.env, HOST: '127.0.0.1', PORT: String(port), DB_PORT: String(dbPort), MAIL_PORT: String(mailPort), DATA_DIR: dir,
    DEMO_SEED: '1', DEMO_PASSWORD: 'ionotheca-demo', SKIP_BUILD: '1', DATABASE_URL: '', SMTP_URL: '',
  };
  const log = fs.createWriteStream(path.join(dir, 'server.log'));
  const child: ChildProcess = spawn(process.execPath, ['--import', 'tsx', path.join(ROOT, 'scripts', 'start.ts')], { cwd: ROOT, env, stdio: ['ignore', 'pipe', 'pipe'] });
  child.stdout!.pipe(log);
  child.stderr!.pipe(log);
  const base = `http://127.0.0.1:${port}`;
  const deadline = Date.now() + 180_000;
  for (;;) {
    if (child.exitCode !== null || Date.now() > deadline) {
      throw new Error(`the server did not start:\n${fs.readFileSync(path.join(dir, 'server.log'), 'utf8').slice(-2000)}`);
    }
    try {
      const h = (await (await fetch(`${base}/api/health`)).json()) as { status: string };
      if (h.status === 'ok') break;
    } catch {
      /* starting */
    }
    await new Promise((r) => setTimeout(r, 250));
  }
  return {
    base,
    stop: async () => {
      if (child.exitCode === null) {
        child.kill('SIGTERM');
        await new Promise((r) => child.once('exit', r));
      }
      fs.rmSync(dir, { recursive: true, force: true });
    },
  };
}

async function signIn(base: string, email: string, password: string): Promise<string> {
  const res = await fetch(`${base}/api/auth/sign-in/email`, {
    method: 'POST', headers: { 'content-type': 'application/json', origin: base }, body: JSON.stringify({ email, password }),
  });
  if (!res.ok) throw new Error(`sign-in as ${email} failed: ${res.status} ${await res.text()}`);
  return res.headers.getSetCookie().map((c) => c.split(';')[0]).join('; ');
}

async function post(base: string, cookie: string, files: { name: string; text: string }[]) {
  const form = new FormData();
  for (const f of files) form.append('files', new Blob([f.text]), f.name);
  const res = await fetch(`${base}/api/imports`, { method: 'POST', headers: { cookie, origin: base }, body: form });
  const body = (await res.json()) as { files?: { status: string }[]; error?: { message: string } };
  if (!res.ok || !body.files) throw new Error(`POST /api/imports answered ${res.status}: ${body.error?.message}`);
  return body.files;
}

async function measure(label: string, base: string, cookie: string, files: { name: string; text: string }[], perRequest: number, parallel: number) {
  const chunks: { name: string; text: string }[][] = [];
  for (let i = 0; i < files.length; i += perRequest) chunks.push(files.slice(i, i + perRequest));
  const statuses: Record<string, number> = {};
  let nextChunk = 0;
  const t0 = performance.now();
  await Promise.all(Array.from({ length: Math.min(parallel, chunks.length) }, async () => {
    while (nextChunk < chunks.length) {
      const chunk = chunks[nextChunk++];
      for (const r of await post(base, cookie, chunk)) statuses[r.status] = (statuses[r.status] ?? 0) + 1;
    }
  }));
  const seconds = (performance.now() - t0) / 1000;
  console.log(`${label}: ${files.length} files in ${seconds.toFixed(1)} s (${(files.length / seconds).toFixed(0)} files/s, ${((seconds * 1000) / files.length).toFixed(1)} ms a file) ${JSON.stringify(statuses)}`);
  return { seconds, statuses };
}

async function main() {
  const external = process.env.BASE_URL;
  const server = external ? { base: external.replace(/\/$/, ''), stop: async () => {} } : await startServer();
  try {
    const cookie = await signIn(server.base, process.env.MEASURE_EMAIL ?? 'curator@demo.ionotheca.test', process.env.MEASURE_PASSWORD ?? 'ionotheca-demo');
    const run = Date.now().toString(36);
    const next = rng(1000);
    const a = Array.from({ length: FILES }, (_, i) => smallFile(`${run}a`, i, next));
    const b = Array.from({ length: FILES }, (_, i) => smallFile(`${run}b`, i, next));
    console.log(`Machine: ${os.cpus().length} × ${os.cpus()[0]?.model ?? 'cpu'}, Node ${process.version}; files of about ${Math.round(a.reduce((n, f) => n + f.text.length, 0) / a.length)} bytes, 30 peaks each.`);
    const one = await measure(`one file a request, ${PARALLEL} at a time (as the import screen)`, server.base, cookie, a, 1, PARALLEL);
    const many = await measure(`${BATCH} files a request, ${PARALLEL} at a time`, server.base, cookie, b, BATCH, PARALLEL);
    const ok = (one.statuses.imported ?? 0) === FILES && (many.statuses.imported ?? 0) === FILES;
    if (!ok) console.log('Not every file was imported: see the statuses above.');
    process.exitCode = ok ? 0 : 1;
  } finally {
    await server.stop();
  }
}

main().catch((e) => {
  console.error((e as Error).message);
  process.exit(1);
});
