// The one Sequelize instance (one pool) of a process. Everything that touches
// MariaDB — the domain models and better-auth's adapter — goes through it.
import { Sequelize } from 'sequelize';
import mariadb from 'mariadb';
import { appDatabaseUrl } from '../config';

let instance: Sequelize | null = null;

export function createSequelize(url: string, opts: { pool?: number; logging?: boolean } = {}): Sequelize {
  const u = new URL(url);
  return new Sequelize(u.pathname.replace(/^\//, ''), decodeURIComponent(u.username), decodeURIComponent(u.password), {
    host: u.hostname,
    port: Number(u.port || 3306),
    dialect: 'mariadb',
    dialectModule: mariadb,
    logging: opts.logging ? console.log : false,
    timezone: '+00:00',
    pool: { max: opts.pool ?? 10, min: 0, acquire: 10000, idle: 10000 },
    dialectOptions: { connectTimeout: 5000, bigIntAsNumber: true, insertIdAsNumber: true, decimalAsNumber: true },
    define: { freezeTableName: true, timestamps: false },
  });
}

export function getSequelize(): Sequelize {
  if (!instance) instance = createSequelize(appDatabaseUrl());
  return instance;
}

/** For tests and scripts: point the process at another database. */
export function setSequelize(s: Sequelize | null): void {
  instance = s;
}

export async function closeSequelize(): Promise<void> {
  if (instance) {
    const s = instance;
    instance = null;
    await s.close();
  }
}
