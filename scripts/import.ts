// `npm run import -- FILES…`: bulk import of JCAMP-DX files from the command
// line with the same rules as POST /api/imports (src/lib/curation). Arguments
// are files, folders (searched for .jdx/.dx/.jcamp files) and globs. Runs
// against the database of src/lib/config.ts as the system user "cli"; exits
// non-zero when any file was rejected.
import fs from 'node:fs';
import path from 'node:path';
import fg from 'fast-glob';
import { appDatabaseUrl } from '../src/lib/config';
import { closeSequelize, getSequelize } from '../src/lib/db/sequelize';
import { CLI_ACTOR, runImport, type FileReport, type PageSelection } from '../src/lib/curation';

const EXTENSIONS = '{jdx,dx,jcamp,jcm,JDX,DX,JCAMP,JCM}';

function usage(): never {
  console.log(`Usage: npm run import -- [--pages=all] FILES…

  FILES    JCAMP-DX files, folders (searched recursively for *.jdx, *.dx, *.jcamp, *.jcm) or globs ("runs/**/*.jdx")
  --pages=all   import every page of NTUPLES runs with more than 20 pages (otherwise they are reported as needs_selection)

Imports into the database the server uses (DATABASE_URL, or the private instance on DB_PORT) as the system user "cli".
Exit status: 0 when no file was rejected, 1 when any was, 2 when the import could not run.`);
  process.exit(2);
}

export async function collectFiles(args: string[]): Promise<string[]> {
  const out: string[] = [];
  for (const arg of args) {
    let stat: fs.Stats | null = null;
    try {
      stat = fs.statSync(arg);
    } catch {
      stat = null;
    }
    if (stat?.isDirectory()) {
      out.push(...(await fg(`**/*.${EXTENSIONS}`, { cwd: arg, absolute: true, onlyFiles: true, dot: false })).sort());
    } else if (stat?.isFile()) {
      out.push(path.resolve(arg));
    } else if (fg.isDynamicPattern(arg)) {
      out.push(...(await fg(arg.replace(/\\/g, '/'), { absolute: true, onlyFiles: true })).sort());
    } else {
      throw new Error(`${arg}: no such file or folder`);
    }
  }
  return [...new Set(out)];
}

function bar(done: number, total: number, width = 30): string {
  const filled = total === 0 ? width : Math.round((done / total) * width);
  return `[${'#'.repeat(filled)}${'-'.repeat(width - filled)}] ${done}/${total}`;
}

function table(rows: string[][]): string {
  const widths = rows[0].map((_, i) => Math.min(60, Math.max(...rows.map((r) => r[i].length))));
  const line = (r: string[]) => r.map((c, i) => (c.length > widths[i] ? `${c.slice(0, widths[i] - 1)}…` : c.padEnd(widths[i]))).join('  ');
  return [line(rows[0]), widths.map((w) => '-'.repeat(w)).join('  '), ...rows.slice(1).map(line)].join('\n');
}

function detail(r: FileReport): string {
  if (r.status === 'rejected') return r.error ?? '';
  if (r.status === 'duplicate') return `duplicate of record ${r.duplicateOf}`;
  if (r.status === 'needs_selection') return `${r.pageCount} pages: choose pages in the import screen, or --pages=all`;
  if (r.status === 'needs_confirmation') return `same peaks as record ${r.samePeaksAs?.map((s) => s.id).join(', ')}: confirm in the import screen`;
  return r.warnings.map((w) => w.code).join(', ');
}

async function main() {
  const argv = process.argv.slice(2).filter((a) => a !== '--');
  if (argv.length === 0 || argv.includes('--help') || argv.includes('-h')) usage();
  const allPages = argv.includes('--pages=all');
  const args = argv.filter((a) => !a.startsWith('--'));
  const unknown = argv.filter((a) => a.startsWith('--') && a !== '--pages=all');
  if (unknown.length) {
    console.error(`Unknown option ${unknown.join(', ')}`);
    usage();
  }
  let files: string[];
  try {
    files = await collectFiles(args);
  } catch (e) {
    console.error((e as Error).message);
    process.exit(2);
  }
  if (files.length === 0) {
    console.error('No JCAMP-DX files found.');
    process.exit(2);
  }
  try {
    await getSequelize().authenticate();
    await getSequelize().query('SELECT 1 FROM spectrum_record LIMIT 1');
  } catch (e) {
    const url = appDatabaseUrl().replace(/\/\/[^@]*@/, '//');
    console.error(`The database at ${url} cannot be reached or is not set up (${(e as Error).message}).\nStart Ionotheca first (npm start), or set DATABASE_URL.`);
    process.exit(2);
  }

  const tty = process.stderr.isTTY;
  const started = Date.now();
  const pages: Record<string, PageSelection> = {};
  if (allPages) for (const f of files) pages[path.basename(f)] = 'all';
  process.stderr.write(`Importing ${files.length} file(s)…\n`);
  const result = await runImport({
    actor: CLI_ACTOR,
    source: 'cli',
    files: files.map((f) => ({ name: path.basename(f), path: f, size: fs.statSync(f).size })),
    pages,
    removeFiles: false,
    onFile: (report, i, total) => {
      const msg = `${bar(i + 1, total)} ${report.status.padEnd(18)} ${report.file}`;
      if (tty) process.stderr.write(`\r\x1b[2K${msg.slice(0, (process.stderr.columns ?? 120) - 1)}`);
      else process.stderr.write(`${msg}\n`);
    },
  });
  if (tty) process.stderr.write('\n');
  const seconds = (Date.now() - started) / 1000;

  const rows = [['file', 'status', 'records', 'detail']];
  result.files.forEach((r, i) => rows.push([path.relative(process.cwd(), files[i]) || r.file, r.status, r.spectra.map((s) => s.id).join(',') || '-', detail(r)]));
  console.log(table(rows));
  const counts: Record<string, number> = {};
  for (const r of result.files) counts[r.status] = (counts[r.status] ?? 0) + 1;
  const stored = result.files.reduce((n, r) => n + r.spectra.length, 0);
  console.log(`\n${files.length} file(s) in ${seconds.toFixed(1)} s: ${Object.entries(counts).map(([k, v]) => `${v} ${k}`).join(', ')}; ${stored} new draft record(s). Batch ${result.batchId}.`);
  if (stored > 0) console.log('New records are drafts: submit them for review in the library or the review screen.');
  await closeSequelize();
  process.exit(counts.rejected ? 1 : 0);
}

if (process.argv[1] && path.resolve(process.argv[1]) === path.resolve(import.meta.filename)) {
  main().catch(async (e) => {
    console.error(`The import failed: ${(e as Error).message}`);
    await closeSequelize().catch(() => {});
    process.exit(2);
  });
}
