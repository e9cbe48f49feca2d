// Build the app (Astro, plus the search worker bundle) when dist/ is missing
// or older than any source it is made from.
import fs from 'node:fs';
import path from 'node:path';
import { spawnSync } from 'node:child_process';

const ROOT = path.resolve(import.meta.dirname, '..');
const STAMP = path.join(ROOT, 'dist', '.build-stamp');
const SOURCES = ['src', 'public', 'db', 'astro.config.mjs', 'package-lock.json', 'tsconfig.json', 'scripts/build-search-worker.mjs'];

function newestMtime(p: string): number {
  if (!fs.existsSync(p)) return 0;
  const st = fs.statSync(p);
  if (!st.isDirectory()) return st.mtimeMs;
  let newest = st.mtimeMs;
  for (const e of fs.readdirSync(p)) newest = Math.max(newest, newestMtime(path.join(p, e)));
  return newest;
}

export function buildIsStale(): boolean {
  if (!fs.existsSync(STAMP) || !fs.existsSync(path.join(ROOT, 'dist', 'server', 'entry.mjs'))) return true;
  const built = fs.statSync(STAMP).mtimeMs;
  return SOURCES.some((s) => newestMtime(path.join(ROOT, s)) > built);
}

export function buildIfStale({ log = console.log, force = false } = {}): void {
  if (!force && !buildIsStale()) return;
  log('Building the app (first start or sources changed)…');
  const t0 = Date.now();
  const r = spawnSync(process.execPath, [path.join(ROOT, 'node_modules', 'astro', 'astro.js'), 'build', '--silent'], { cwd: ROOT, stdio: 'inherit', env: { ...process.env, ASTRO_TELEMETRY_DISABLED: '1' } });
  if (r.status !== 0) throw new Error('astro build failed (see above)');
  const worker = path.join(ROOT, 'scripts', 'build-search-worker.mjs');
  if (fs.existsSync(worker)) {
    const w = spawnSync(process.execPath, [worker], { cwd: ROOT, stdio: 'inherit' });
    if (w.status !== 0) throw new Error('building the search worker failed (see above)');
  }
  fs.writeFileSync(STAMP, new Date().toISOString());
  log(`Built in ${((Date.now() - t0) / 1000).toFixed(1)} s.`);
}

if (import.meta.url === `file://${process.argv[1]}`) {
  try {
    buildIfStale({ force: process.argv.includes('--force') });
  } catch (e) {
    console.error((e as Error).message);
    process.exit(1);
  }
}
