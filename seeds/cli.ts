// `node --import tsx seeds/cli.ts`: seed the demo scenario into the database at
// DATABASE_URL, or the private instance (src/lib/config.ts), with DEMO_PASSWORD.
// Migrations must have run (npm start runs them). Refuses a non-empty database.
import { appDatabaseUrl, getConfig } from '../src/lib/config';
import { createSequelize } from '../src/lib/db/sequelize';
import { seedDemo } from './index';

async function main(): Promise<number> {
  const cfg = getConfig();
  const url = appDatabaseUrl(cfg);
  const sequelize = createSequelize(url, { pool: 2 });
  try {
    const result = await seedDemo(sequelize, { password: cfg.demoPassword, log: (line) => console.log(line) });
    if (!result.seeded) {
      console.log(`Not seeded: ${result.reason}`);
      return 0;
    }
    console.log('Seeded the demo scenario (invented laboratory and people; synthetic spectra, not for identification):');
    for (const [k, v] of Object.entries(result.counts)) console.log(`  ${k.padEnd(18)} ${v}`);
    console.log(`Demo users sign in with DEMO_PASSWORD (${process.env.DEMO_PASSWORD ? 'from the environment' : 'default "ionotheca-demo"'}).`);
    return 0;
  } catch (e) {
    const err = e as Error & { parent?: { code?: string } };
    console.error(`Seeding failed: ${err.message}`);
    if (/ECONNREFUSED|connect/i.test(err.message)) console.error(`Is the database at ${url.replace(/\/\/[^@]*@/, '//…@')} running and migrated? (npm start does both)`);
    return 1;
  } finally {
    await sequelize.close();
  }
}

main().then((code) => process.exit(code));
