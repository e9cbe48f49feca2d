// Measures loading N spectra from MariaDB into the search index (issue 10's
// "loadFromDb"): a private MariaDB in a temporary folder, N synthetic
// released versions with ~80 packed peaks each, then the same full rebuild
// that a server runs at start (src/lib/library-index.ts).
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import crypto from 'node:crypto';
import mariadb from 'mariadb';
import { startPrivateMariadb } from '../db/mariadb.mjs';
import { createSequelize, setSequelize, closeSequelize } from '../src/lib/db/sequelize';
import { migrate } from '../src/lib/db/migrate';
import { encodePeaks } from '../src/lib/spectra/index';
import { rebuildLibraryIndex, getLibraryIndex, stopLibraryIndexPolling } from '../src/lib/library-index';
import { freePort } from '../tests/setup/ports';
import { rng } from '../bench/synthetic';

function syntheticPeaks(rand: () => number): [number, number][] {
  const n = 60 + Math.floor(rand() * 40);
  const seen = new Set<number>();
  const peaks: [number, number][] = [];
  while (peaks.length < n) {
    // skewed towards low m/z, 30..650
    const mz = 30 + Math.floor(620 * rand() ** 2.2);
    if (seen.has(mz)) continue;
    seen.add(mz);
    peaks.push([mz, Math.round(1 + 998 * rand() ** 3)]);
  }
  return peaks.sort((a, b) => a[0] - b[0]);
}

export async function measureLoadFromDb(n: number, log: (s: string) => void = () => {}): Promise<{ spectra: number; ms: number; insertMs: number }> {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'ionotheca-loadbench-'));
  const port = await freePort();
  const db = await startPrivateMariadb({ dataDir: dir, port, fast: true, log: () => {} });
  try {
    const url = `mariadb://root@127.0.0.1:${port}/ionotheca`;
    const s = createSequelize(url, { pool: 4 });
    await migrate(s);
    setSequelize(s);
    const conn = await mariadb.createConnection({ host: '127.0.0.1', port, user: 'root', database: 'ionotheca' });
    const rand = rng(20261201);
    const now = new Date();
    const t0 = performance.now();
    const CHUNK = 2000;
    for (let start = 1; start <= n; start += CHUNK) {
      const ids = Array.from({ length: Math.min(CHUNK, n - start + 1) }, (_, i) => start + i);
      await conn.batch('INSERT INTO compound (id, name, nameKey, formula, createdAt, updatedAt) VALUES (?,?,?,?,?,?)', ids.map((id) => [id, `bench ${id}`, `bench ${id}`, 'C10H20O', now, now]));
      await conn.batch('INSERT INTO spectrum_record (id, compoundId, latestVersion, releasedVersion, synthetic, createdAt, updatedAt) VALUES (?,?,1,1,1,?,?)', ids.map((id) => [id, id, now, now]));
      await conn.batch(
        "INSERT INTO spectrum_version (id, recordId, version, status, name, synonyms, formula, nominalMass, ihd, elements, metadata, editors, peaks, peakCount, basePeakMz, contentHash, synthetic, createdAt, updatedAt) VALUES (?,?,1,'released',?,'[]','C10H20O',156,1,'C,H,O','{}','[]',?,?,?,?,1,?,?)",
        ids.map((id) => {
          const peaks = syntheticPeaks(rand);
          const base = peaks.reduce((a, b) => (b[1] > a[1] ? b : a));
          return [id, id, `bench ${id}`, encodePeaks(peaks), peaks.length, base[0], crypto.randomBytes(32).toString('hex'), now, now];
        }),
      );
      if ((start - 1) % 20000 === 0) log(`  inserted ${start - 1 + ids.length} / ${n}`);
    }
    await conn.end();
    const insertMs = performance.now() - t0;
    const t1 = performance.now();
    await rebuildLibraryIndex();
    const ms = performance.now() - t1;
    stopLibraryIndexPolling();
    const size = getLibraryIndex().size;
    if (size !== n) throw new Error(`index holds ${size} spectra, expected ${n}`);
    await closeSequelize();
    return { spectra: n, ms: Math.round(ms), insertMs: Math.round(insertMs) };
  } finally {
    await db.stop();
    fs.rmSync(dir, { recursive: true, force: true });
  }
}

if (import.meta.url === `file://${process.argv[1]}`) {
  const n = Number(process.argv[2] ?? 100_000);
  const r = await measureLoadFromDb(n, console.log);
  console.log(`Loaded ${r.spectra} spectra from MariaDB into the index in ${r.ms} ms (inserting them took ${r.insertMs} ms).`);
}
