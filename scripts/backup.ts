// `npm run backup [-- DIR]`: a consistent dump and its manifest (default DIR: DATA_DIR/backups).
import path from 'node:path';
import { getConfig } from '../src/lib/config';
import { openDatabaseTarget } from '../src/lib/ops/database-target';
import { createSequelize } from '../src/lib/db/sequelize';
import { backupDatabase } from '../src/lib/ops/backup';

const outDir = path.resolve(process.argv[2] ?? path.join(getConfig().dataDir, 'backups'));
const target = await openDatabaseTarget().catch((e) => {
  console.error(`backup: ${e.message}`);
  process.exit(2);
});
const s = createSequelize(target.url, { pool: 2 });
try {
  const r = await backupDatabase(s, target.conn, outDir);
  const rows = Object.values(r.manifest.tables).reduce((a, t) => a + t.rows, 0);
  console.log(`Backup written: ${r.dumpFile}\nManifest:       ${r.manifestFile}\n${Object.keys(r.manifest.tables).length} tables, ${rows} rows.`);
} catch (e) {
  console.error(`backup failed: ${(e as Error).message}`);
  process.exitCode = 1;
} finally {
  await s.close();
  await target.release();
}
