// Runs the migration history (db/migrations) through umzug, recorded in the
// `migrations` table. Idempotent; a named lock keeps two servers that start
// together from migrating at once.
import { Umzug, SequelizeStorage } from 'umzug';
import { QueryTypes, type Sequelize } from 'sequelize';
import { migrations } from '../../../db/migrations/index';

export async function migrate(sequelize: Sequelize): Promise<string[]> {
  const qi = sequelize.getQueryInterface();
  const umzug = new Umzug({
    migrations: migrations.map((m) => ({
      name: m.name,
      up: async () => m.up({ context: qi }),
      down: async () => m.down({ context: qi }),
    })),
    context: qi,
    storage: new SequelizeStorage({ sequelize, tableName: 'migrations' }),
    logger: undefined,
  });
  // The lock belongs to one connection: hold it on a transaction's connection
  // while the migrations run on the pool.
  return sequelize.transaction(async (transaction) => {
    const [lock] = await sequelize.query<{ got: number }>("SELECT GET_LOCK('ionotheca_migrate', 60) AS got", {
      type: QueryTypes.SELECT,
      transaction,
    });
    if (!lock || Number(lock.got) !== 1) throw new Error('Could not take the migration lock within 60 s');
    try {
      const done = await umzug.up();
      return done.map((m) => m.name);
    } finally {
      await sequelize.query("SELECT RELEASE_LOCK('ionotheca_migrate') AS r", { type: QueryTypes.SELECT, transaction });
    }
  });
}
