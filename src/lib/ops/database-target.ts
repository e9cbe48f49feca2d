// Which database an operations command (backup, restore, check-data, import)
// works on: DATABASE_URL, or the private instance of DATA_DIR (started for the
// command when the app is not running).
import { getConfig, appDatabaseUrl, migrationDatabaseUrl } from '../config';
import { usePrivateMariadb } from '../../../db/mariadb.mjs';

export interface DatabaseTarget {
  url: string;
  migrationUrl: string;
  /** host/port/user/password/database for command-line clients */
  conn: { host: string; port: number; user: string; password: string; database: string };
  release: () => Promise<void>;
}

export async function openDatabaseTarget(): Promise<DatabaseTarget> {
  const cfg = getConfig();
  let release = async () => {};
  if (!cfg.databaseUrl) {
    const db = await usePrivateMariadb({ dataDir: cfg.dataDir, port: cfg.dbPort, log: () => {} });
    release = db.stop;
  }
  const url = appDatabaseUrl(cfg);
  const u = new URL(url);
  return {
    url,
    migrationUrl: migrationDatabaseUrl(cfg),
    conn: {
      host: u.hostname,
      port: Number(u.port || 3306),
      user: decodeURIComponent(u.username),
      password: decodeURIComponent(u.password),
      database: u.pathname.replace(/^\//, ''),
    },
    release,
  };
}
