// Page weight of the built app: for every page route, the JavaScript a browser
// loads before any interaction (the page's island components, the React
// renderer, hoisted scripts and everything they import statically), gzipped.
// Chunks reached only through dynamic import() (Plotly, the overlay, the
// JCAMP-DX reader) are listed apart as "lazy": they load when first needed.
//
//   node --import tsx scripts/page-weight.ts            # table of every page
//   node --import tsx scripts/page-weight.ts --json     # the same as JSON
//   node --import tsx scripts/page-weight.ts --max-kb 300 /library /identify   # exit 1 when over
import fs from 'node:fs';
import path from 'node:path';
import zlib from 'node:zlib';

export interface ScriptFile {
  file: string;
  bytes: number;
  gzip: number;
}

export interface PageWeight {
  route: string;
  component: string;
  islands: string[];
  initial: ScriptFile[];
  initialGzip: number;
  lazy: ScriptFile[];
  lazyGzip: number;
}

const STATIC_IMPORT = /(?:^|[\s;}{)])(?:import|export)\s*(?:[\w$*{}\s,]+?\s*from\s*)?["']([^"']+\.m?js)["']/g;
const DYNAMIC_IMPORT = /import\(\s*["']([^"']+\.m?js)["']\s*\)/g;
const VITE_DEPS = /__vite__mapDeps\.viteFileDeps\s*=\s*\[([^\]]*)\]|const\s+\w+\s*=\s*\[((?:"[^"]*\.js",?)+)\]/g;

function gzipSize(buf: Buffer): number {
  return zlib.gzipSync(buf, { level: 9 }).length;
}

function readManifest(serverDir: string): { entryModules: Record<string, string>; routes: any[] } {
  const files = fs.readdirSync(serverDir).filter((f) => /^manifest_.*\.mjs$/.test(f));
  if (files.length === 0) throw new Error(`no manifest_*.mjs in ${serverDir}: build the app first`);
  // The newest manifest is this build's (an old one can linger when dist/ was not cleaned).
  const newest = files.map((f) => path.join(serverDir, f)).sort((a, b) => fs.statSync(b).mtimeMs - fs.statSync(a).mtimeMs)[0];
  const text = fs.readFileSync(newest, 'utf8');
  // One line holds the serialized manifest: `const manifest = deserializeManifest({...});`
  const line = text.split('\n').find((l) => /^\s*const\s+\w+\s*=\s*deserializeManifest\(\{/.test(l));
  if (!line) throw new Error(`${newest}: the serialized manifest was not found (has the Astro build format changed?)`);
  const manifest = JSON.parse(line.slice(line.indexOf('(') + 1, line.lastIndexOf(')')));
  return { entryModules: manifest.entryModules, routes: manifest.routes };
}

function staticImports(code: string): string[] {
  const out: string[] = [];
  for (const m of code.matchAll(STATIC_IMPORT)) out.push(m[1]);
  return out;
}

/** Server modules a page module imports statically, with the island paths they render. */
function islandPaths(serverDir: string, pageFile: string): string[] {
  const seen = new Set<string>();
  const islands = new Set<string>();
  const walk = (file: string) => {
    if (seen.has(file) || !fs.existsSync(file)) return;
    seen.add(file);
    const code = fs.readFileSync(file, 'utf8');
    for (const m of code.matchAll(/"client:component-path":\s*"([^"]+)"/g)) islands.add(m[1]);
    for (const spec of staticImports(code)) if (spec.startsWith('.')) walk(path.resolve(path.dirname(file), spec));
  };
  walk(path.join(serverDir, pageFile));
  return [...islands].sort();
}

function clientClosure(clientDir: string, entries: string[]): { initial: Set<string>; lazy: Set<string> } {
  const initial = new Set<string>();
  const lazy = new Set<string>();
  const dynamicSeeds: string[] = [];
  const walk = (file: string, into: Set<string>, other: Set<string> | null) => {
    if (into.has(file) || (other && other.has(file)) || !fs.existsSync(file)) return;
    into.add(file);
    const code = fs.readFileSync(file, 'utf8');
    for (const spec of staticImports(code)) {
      if (spec.startsWith('.') || spec.startsWith('/')) walk(resolveClient(clientDir, file, spec), into, other);
    }
    for (const m of code.matchAll(DYNAMIC_IMPORT)) dynamicSeeds.push(resolveClient(clientDir, file, m[1]));
    for (const m of code.matchAll(VITE_DEPS)) {
      for (const dep of (m[1] ?? m[2] ?? '').split(',').map((s) => s.trim().replace(/^["']|["']$/g, '')).filter((s) => s.endsWith('.js'))) {
        dynamicSeeds.push(path.join(clientDir, dep.replace(/^\//, '')));
      }
    }
  };
  for (const e of entries) walk(e, initial, null);
  while (dynamicSeeds.length > 0) walk(dynamicSeeds.pop()!, lazy, initial);
  return { initial, lazy };
}

function resolveClient(clientDir: string, from: string, spec: string): string {
  if (spec.startsWith('/')) return path.join(clientDir, spec.slice(1));
  return path.resolve(path.dirname(from), spec);
}

function describe(clientDir: string, files: Set<string>): ScriptFile[] {
  return [...files]
    .map((f) => {
      const buf = fs.readFileSync(f);
      return { file: path.relative(clientDir, f), bytes: buf.length, gzip: gzipSize(buf) };
    })
    .sort((a, b) => b.gzip - a.gzip);
}

/**
 * Measure every page route of a build.
 * @param distDir - the build's folder. @default dist (next to this script's parent)
 */
export function measurePageWeights(distDir = path.resolve(import.meta.dirname, '..', 'dist')): PageWeight[] {
  const serverDir = path.join(distDir, 'server');
  const clientDir = path.join(distDir, 'client');
  const { entryModules, routes } = readManifest(serverDir);
  const renderer = entryModules['@astrojs/react/client.js'];
  const out: PageWeight[] = [];
  for (const r of routes) {
    const data = r.routeData;
    if (data?.type !== 'page' || data.origin !== 'project') continue;
    const component: string = data.component;
    const key = Object.keys(entryModules).find((k) => k === `\u0000@astro-page:${component.replace(/\.astro$/, '')}@_@astro`);
    if (!key) continue;
    const islands = islandPaths(serverDir, entryModules[key]);
    const entries: string[] = [];
    for (const island of islands) {
      const asset = entryModules[island] ?? entryModules[`${island}.tsx`] ?? entryModules[island.replace(/\.tsx$/, '')];
      if (!asset) throw new Error(`${data.route}: no client asset for island ${island}`);
      entries.push(path.join(clientDir, asset.replace(/^\//, '')));
    }
    if (islands.length > 0 && renderer) entries.push(path.join(clientDir, renderer.replace(/^\//, '')));
    for (const s of r.scripts ?? []) {
      if (s.type === 'external' && s.value) entries.push(path.join(clientDir, String(s.value).replace(/^\//, '')));
    }
    const { initial, lazy } = clientClosure(clientDir, entries);
    const initialFiles = describe(clientDir, initial);
    const lazyFiles = describe(clientDir, lazy);
    out.push({
      route: data.route,
      component,
      islands: islands.map((i) => path.basename(i)),
      initial: initialFiles,
      initialGzip: initialFiles.reduce((s, f) => s + f.gzip, 0),
      lazy: lazyFiles,
      lazyGzip: lazyFiles.reduce((s, f) => s + f.gzip, 0),
    });
  }
  return out.sort((a, b) => a.route.localeCompare(b.route));
}

const kb = (n: number) => `${(n / 1024).toFixed(1)} KB`;

if (import.meta.url === `file://${process.argv[1]}`) {
  const args = process.argv.slice(2);
  const pages = measurePageWeights();
  if (args.includes('--json')) {
    console.log(JSON.stringify(pages, null, 2));
  } else {
    console.log('Initial JavaScript of each page, gzipped (lazy chunks load on first use):\n');
    console.log(`${'page'.padEnd(24)}${'initial'.padStart(12)}${'lazy'.padStart(12)}  islands`);
    for (const p of pages) {
      console.log(`${p.route.padEnd(24)}${kb(p.initialGzip).padStart(12)}${kb(p.lazyGzip).padStart(12)}  ${p.islands.join(', ') || '—'}`);
    }
    if (args.includes('--files')) {
      for (const p of pages) {
        console.log(`\n${p.route}`);
        for (const f of p.initial) console.log(`  ${f.file.padEnd(48)}${kb(f.gzip).padStart(10)}`);
        for (const f of p.lazy) console.log(`  (lazy) ${f.file.padEnd(41)}${kb(f.gzip).padStart(10)}`);
      }
    }
  }
  const maxAt = args.indexOf('--max-kb');
  if (maxAt >= 0) {
    const max = Number(args[maxAt + 1]) * 1024;
    const routes = args.slice(maxAt + 2).filter((a) => a.startsWith('/'));
    const over = pages.filter((p) => (routes.length === 0 || routes.includes(p.route)) && p.initialGzip >= max);
    for (const p of over) console.error(`${p.route}: ${kb(p.initialGzip)} of initial JavaScript is over ${kb(max)}`);
    if (over.length > 0) process.exit(1);
  }
}
