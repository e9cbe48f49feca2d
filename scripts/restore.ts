// `npm run restore FILE`: restore a backup into an empty database and compare
// every table with the backup's manifest.
import path from 'node:path';
import { openDatabaseTarget } from '../src/lib/ops/database-target';
import { createSequelize } from '../src/lib/db/sequelize';
import { restoreDatabase } from '../src/lib/ops/backup';

const file = process.argv[2];
if (!file) {
  console.error('usage: npm run restore FILE.sql');
  process.exit(2);
}
const target = await openDatabaseTarget().catch((e) => {
  console.error(`restore: ${e.message}`);
  process.exit(2);
});
const s = createSequelize(target.url, { pool: 2 });
try {
  const r = await restoreDatabase(s, target.conn, path.resolve(file));
  if (r.mismatches.length) {
    console.error(`Restored, but ${r.mismatches.length} table(s) differ from the manifest:\n  ${r.mismatches.join('\n  ')}`);
    process.exitCode = 1;
  } else console.log(`Restored ${Object.keys(r.tables).length} tables; every row count and checksum equals the manifest.`);
} catch (e) {
  console.error(`restore failed: ${(e as Error).message}`);
  process.exitCode = 1;
} finally {
  await s.close();
  await target.release();
}
