// Bundles the search pool's worker (pure code from src/lib/search) into
// dist/search-worker.mjs, for the production server, where Vite has bundled
// src/lib and no .ts worker file exists. Run after `astro build` (which
// empties dist/). The pool finds the bundle relative to the working
// directory, or wherever SEARCH_WORKER_FILE points.
import { build } from 'esbuild';
import path from 'node:path';
import { fileURLToPath } from 'node:url';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
const outfile = path.join(root, 'dist', 'search-worker.mjs');

await build({
  entryPoints: [path.join(root, 'src/lib/search/worker.ts')],
  outfile,
  bundle: true,
  platform: 'node',
  format: 'esm',
  target: 'node20',
  sourcemap: false,
  legalComments: 'none',
  logLevel: 'warning',
});
console.log(`search worker bundled: ${path.relative(process.cwd(), outfile)}`);
