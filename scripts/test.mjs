// `npm test`: build when stale (browser tests run against the built server),
// then every vitest project: unit, integration (private MariaDB), e2e (Chromium).
import { spawnSync } from 'node:child_process';

const node = process.execPath;
const build = spawnSync(node, ['--import', 'tsx', 'scripts/build-if-stale.ts'], { stdio: 'inherit' });
if (build.status !== 0) process.exit(build.status ?? 1);
const args = ['node_modules/vitest/vitest.mjs', 'run', ...process.argv.slice(2)];
const r = spawnSync(node, args, { stdio: 'inherit', env: { ...process.env, NODE_OPTIONS: `${process.env.NODE_OPTIONS ?? ''} --max-old-space-size=4096`.trim() } });
process.exit(r.status ?? 1);
