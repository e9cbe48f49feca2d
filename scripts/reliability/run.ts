// `npm run test:reliability`: the load, database-fault, app-crash and
// two-server runs in sequence, each against servers it starts itself on
// loopback. Prints each run's figures and a closing line; exits non-zero when
// any check of any run failed. One run: `node --import tsx scripts/reliability/run.ts load`.
import { runLoad } from './load';
import { runDbFaults } from './db-faults';
import { runCrash } from './crash';
import { runTwoServers } from './two-servers';
import { snapshotRoot, removeSnapshot } from './lib/server';

const RUNS: Record<string, () => Promise<number>> = { load: runLoad, 'db-faults': runDbFaults, crash: runCrash, 'two-servers': runTwoServers };
const chosen = process.argv.slice(2).length ? process.argv.slice(2) : Object.keys(RUNS);
const t0 = Date.now();
// one private copy of the built app for every run
const root = snapshotRoot();
process.env.RELIABILITY_ROOT = root;
let passed = 0;
let failed = 0;
for (const name of chosen) {
  const run = RUNS[name];
  if (!run) {
    console.error(`No run "${name}"; runs: ${Object.keys(RUNS).join(', ')}`);
    process.exit(2);
  }
  if ((await run()) === 0) passed++;
  else failed++;
}
delete process.env.RELIABILITY_ROOT;
removeSnapshot(root);
console.log(`\nReliability runs (${((Date.now() - t0) / 1000).toFixed(0)} s):`);
console.log(`${passed} passed, ${failed} failed`);
process.exit(failed === 0 ? 0 : 1);
