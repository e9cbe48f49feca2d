// `npm run check-data`: verify the stored data's invariants; exit 1 on any problem.
import { openDatabaseTarget } from '../src/lib/ops/database-target';
import { createSequelize, setSequelize } from '../src/lib/db/sequelize';
import { checkData } from '../src/lib/ops/check-data';

const target = await openDatabaseTarget().catch((e) => {
  console.error(`check-data: ${e.message}`);
  process.exit(2);
});
const s = createSequelize(target.url, { pool: 2 });
setSequelize(s);
try {
  const r = await checkData(s);
  console.log(`Checked ${r.counts.spectrum_record} records, ${r.counts.spectrum_version} versions, ${r.counts.audit_event} audit events, ${r.counts.report} reports.`);
  if (r.ok) console.log('All invariants hold.');
  else {
    console.log(`${r.problems.length} problem(s):`);
    for (const p of r.problems) console.log(`  - ${p}`);
  }
  process.exitCode = r.ok ? 0 : 1;
} catch (e) {
  console.error(`check-data: ${(e as Error).message}`);
  process.exitCode = 2;
} finally {
  await s.close();
  await target.release();
}
