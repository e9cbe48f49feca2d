// Run-time settings from the environment (API.md, "Run-time settings").
// Read lazily so that tests and scripts can set the environment first.
import fs from 'node:fs';
import path from 'node:path';
import crypto from 'node:crypto';

export interface AppConfig {
  host: string;
  port: number;
  dataDir: string;
  dbPort: number;
  databaseUrl: string | null;
  databaseMigrationUrl: string | null;
  smtpUrl: string | null;
  mailPort: number;
  demoSeed: boolean;
  demoPassword: string;
  publicOrigin: string;
}

function intFromEnv(name: string, fallback: number): number {
  const raw = process.env[name];
  if (raw === undefined || raw === '') return fallback;
  const n = Number(raw);
  if (!Number.isInteger(n) || n < 1 || n > 65535) {
    throw new RangeError(`${name} must be a port number between 1 and 65535, got "${raw}"`);
  }
  return n;
}

export function getConfig(): AppConfig {
  const host = process.env.HOST || '127.0.0.1';
  const port = intFromEnv('PORT', 4321);
  const dataDir = path.resolve(process.env.DATA_DIR || '.data');
  const dbPort = intFromEnv('DB_PORT', 3307);
  const databaseUrl = process.env.DATABASE_URL || null;
  return {
    host,
    port,
    dataDir,
    dbPort,
    databaseUrl,
    databaseMigrationUrl: process.env.DATABASE_MIGRATION_URL || databaseUrl,
    smtpUrl: process.env.SMTP_URL || null,
    mailPort: intFromEnv('MAIL_PORT', 2525),
    demoSeed: (process.env.DEMO_SEED ?? '0') === '1',
    demoPassword: process.env.DEMO_PASSWORD || 'ionotheca-demo',
    publicOrigin: process.env.PUBLIC_ORIGIN || `http://${host === '0.0.0.0' ? '127.0.0.1' : host}:${port}`,
  };
}

/** The URL the app's pool connects with: DATABASE_URL, or the private instance. */
export function appDatabaseUrl(cfg = getConfig()): string {
  return cfg.databaseUrl ?? `mariadb://root@127.0.0.1:${cfg.dbPort}/ionotheca`;
}

export function migrationDatabaseUrl(cfg = getConfig()): string {
  return cfg.databaseMigrationUrl ?? appDatabaseUrl(cfg);
}

/**
 * A secret from the environment or, for the embedded default, generated once
 * into DATA_DIR. With DATABASE_URL set, several servers share a database and
 * must share the secret, so it has to come from the environment.
 */
export function getSecret(name: 'AUTH_SECRET' | 'REPORT_SIGNING_KEY', cfg = getConfig()): string {
  const fromEnv = process.env[name];
  if (fromEnv) return fromEnv;
  if (cfg.databaseUrl) {
    throw new Error(`${name} must be set when DATABASE_URL is set (every app server needs the same value).`);
  }
  const file = path.join(cfg.dataDir, 'secrets', name.toLowerCase());
  try {
    return fs.readFileSync(file, 'utf8').trim();
  } catch {
    fs.mkdirSync(path.dirname(file), { recursive: true, mode: 0o700 });
    const value = crypto.randomBytes(32).toString('base64url');
    fs.writeFileSync(file, value, { mode: 0o600, flag: 'wx' });
    return fs.readFileSync(file, 'utf8').trim();
  }
}

export const APP_VERSION = '0.1.0';
