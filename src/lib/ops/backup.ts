// Backup and restore: a consistent dump (mariadb-dump --single-transaction)
// plus a manifest of row counts and checksums per table.
import { spawn } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';
import { QueryTypes, type Sequelize } from 'sequelize';
import { tableChecksums, type TableSums } from './table-checksums';
import { APP_VERSION } from '../config';

export interface BackupManifest { createdAt: string; appVersion: string; database: string; dumpFile: string; dumpSha256: string; tables: TableSums }

type Conn = { host: string; port: number; user: string; password: string; database: string };

function clientArgs(c: Conn) {
  return [`--host=${c.host}`, `--port=${c.port}`, `--user=${c.user}`, ...(c.password ? [`--password=${c.password}`] : []), '--protocol=TCP'];
}

function run(cmd: string, args: string[], { input, output }: { input?: string; output?: string } = {}): Promise<void> {
  return new Promise((resolve, reject) => {
    const child = spawn(cmd, args, { stdio: [input ? 'pipe' : 'ignore', output ? 'pipe' : 'ignore', 'pipe'] });
    let err = '';
    child.stderr!.on('data', (d) => (err += d));
    if (output) child.stdout!.pipe(fs.createWriteStream(output));
    if (input) fs.createReadStream(input).pipe(child.stdin!);
    child.on('error', (e) => reject(new Error(`${cmd}: ${(e as NodeJS.ErrnoException).code === 'ENOENT' ? 'not installed (it comes with mariadb-server / mariadb-client)' : e.message}`)));
    child.on('close', (code) => (code === 0 ? resolve() : reject(new Error(`${cmd} failed: ${err.trim().split('\n').pop()}`))));
  });
}

async function sha256File(file: string): Promise<string> {
  const { createHash } = await import('node:crypto');
  const h = createHash('sha256');
  for await (const chunk of fs.createReadStream(file)) h.update(chunk as Buffer);
  return h.digest('hex');
}

export async function backupDatabase(sequelize: Sequelize, conn: Conn, outDir: string): Promise<{ dumpFile: string; manifestFile: string; manifest: BackupManifest }> {
  fs.mkdirSync(outDir, { recursive: true });
  const stamp = new Date().toISOString().replace(/[:.]/g, '-');
  const dumpFile = path.join(outDir, `ionotheca-${stamp}.sql`);
  await run('mariadb-dump', [...clientArgs(conn), '--single-transaction', '--quick', '--routines', '--triggers', '--hex-blob', '--default-character-set=utf8mb4', '--skip-tz-utc', conn.database], { output: dumpFile });
  const tables = await tableChecksums(sequelize);
  const manifest: BackupManifest = {
    createdAt: new Date().toISOString(),
    appVersion: APP_VERSION,
    database: conn.database,
    dumpFile: path.basename(dumpFile),
    dumpSha256: await sha256File(dumpFile),
    tables,
  };
  const manifestFile = dumpFile.replace(/\.sql$/, '.manifest.json');
  fs.writeFileSync(manifestFile, JSON.stringify(manifest, null, 2));
  return { dumpFile, manifestFile, manifest };
}

export async function restoreDatabase(sequelize: Sequelize, conn: Conn, dumpFile: string): Promise<{ tables: TableSums; mismatches: string[] }> {
  const manifestFile = dumpFile.replace(/\.sql$/, '.manifest.json');
  if (!fs.existsSync(dumpFile)) throw new Error(`${dumpFile} does not exist`);
  const manifest: BackupManifest | null = fs.existsSync(manifestFile) ? JSON.parse(fs.readFileSync(manifestFile, 'utf8')) : null;
  if (manifest && (await sha256File(dumpFile)) !== manifest.dumpSha256) throw new Error('the dump file does not match its manifest (changed or truncated)');
  const existing = await sequelize.query<{ n: number }>(
    "SELECT COUNT(*) AS n FROM information_schema.TABLES WHERE TABLE_SCHEMA = DATABASE()",
    { type: QueryTypes.SELECT },
  );
  if (Number(existing[0]?.n ?? 0) > 0) throw new Error(`the database "${conn.database}" is not empty: restore only into an empty database`);
  await run('mariadb', [...clientArgs(conn), '--default-character-set=utf8mb4', conn.database], { input: dumpFile });
  const tables = await tableChecksums(sequelize);
  const mismatches: string[] = [];
  if (manifest) {
    for (const [t, m] of Object.entries(manifest.tables)) {
      const got = tables[t];
      if (!got) mismatches.push(`${t}: missing after restore`);
      else if (got.rows !== m.rows || got.sha256 !== m.sha256) mismatches.push(`${t}: ${got.rows} rows (expected ${m.rows}), checksum ${got.sha256 === m.sha256 ? 'equal' : 'differs'}`);
    }
  }
  return { tables, mismatches };
}
