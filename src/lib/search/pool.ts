import { existsSync, readdirSync, statSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { Piscina } from 'piscina';
import type { SearchTask, TaskHits } from './runSearchTask';
import { toWire, unpackHits, type PackedHits } from './taskWire';

export interface WorkerLocation {
  file: string;
  source: 'env' | 'bundle' | 'typescript';
}

function sourceDir(): string | null {
  try {
    return path.dirname(fileURLToPath(import.meta.url));
  } catch {
    return null;
  }
}

/**
 * Where the worker script is:
 * 1. `SEARCH_WORKER_FILE`, if set (it must exist);
 * 2. `dist/search-worker.mjs` under the working directory (built by
 *    scripts/build-search-worker.mjs), unless the TypeScript worker next to
 *    this module exists and is newer (a stale bundle during development);
 * 3. the TypeScript source through tsx (vitest, `node --import tsx` scripts).
 * In the bundled server this module's own folder holds no worker.ts, so only
 * 1 and 2 can apply. null: no worker, search runs in the calling thread.
 */
export function locateSearchWorker(): WorkerLocation | null {
  const env = process.env.SEARCH_WORKER_FILE;
  if (env) return existsSync(env) ? { file: path.resolve(env), source: 'env' } : null;
  const dir = sourceDir();
  const tsWorker = dir ? path.join(dir, 'worker.ts') : null;
  const tsEntry = dir ? path.join(dir, 'worker-source.mjs') : null;
  const haveSource = tsWorker !== null && tsEntry !== null && existsSync(tsWorker) && existsSync(tsEntry);
  const bundle = path.resolve(process.cwd(), 'dist/search-worker.mjs');
  if (existsSync(bundle)) {
    const stale = haveSource && newestSourceMtime(dir as string) > statSync(bundle).mtimeMs;
    if (!stale) return { file: bundle, source: 'bundle' };
  }
  if (haveSource) return { file: tsEntry as string, source: 'typescript' };
  return null;
}

function newestSourceMtime(dir: string): number {
  let newest = 0;
  // Every module of the search folder: the worker imports most of them.
  for (const name of readdirSync(dir)) {
    if (name.endsWith('.ts') || name.endsWith('.mjs')) newest = Math.max(newest, statSync(path.join(dir, name)).mtimeMs);
  }
  return newest;
}

export interface SearchPool {
  threads: number;
  location: WorkerLocation;
  run(task: SearchTask): Promise<TaskHits[]>;
  close(): Promise<void>;
}

let pool: SearchPool | null | undefined;

/** Worker threads: one per core (at least 1, at most 8); `SEARCH_THREADS` overrides. */
export function searchThreads(): number {
  const env = Number(process.env.SEARCH_THREADS);
  if (Number.isInteger(env) && env >= 0) return env;
  const cores = typeof os.availableParallelism === 'function' ? os.availableParallelism() : os.cpus().length;
  return Math.max(1, Math.min(8, cores));
}

/** The process's search pool, started on first use; null when no worker can be found or SEARCH_THREADS=0. */
export function getSearchPool(): SearchPool | null {
  if (pool !== undefined) return pool;
  const threads = searchThreads();
  const location = threads > 0 ? locateSearchWorker() : null;
  if (!location) {
    pool = null;
    return pool;
  }
  try {
    const piscina = new Piscina({
      filename: pathToFileURL(location.file).href,
      minThreads: threads,
      maxThreads: threads,
      idleTimeout: 60_000,
      // Queries are short; keep a few queued per thread so a thread never waits.
      concurrentTasksPerWorker: 1,
    });
    pool = {
      threads,
      location,
      run: async (task) => unpackHits((await piscina.run(toWire(task))) as PackedHits),
      close: async () => {
        pool = undefined;
        await piscina.destroy();
      },
    };
  } catch {
    pool = null;
  }
  return pool;
}

/** Stop the pool's threads (tests, scripts, shutdown). The next search starts a new one. */
export async function closeSearchPool(): Promise<void> {
  const p = pool;
  pool = undefined;
  if (p) await p.close();
}
