// Row counts and content checksums of every table, in one consistent
// snapshot: the backup manifest, and what a restore is compared against.
import crypto from 'node:crypto';
import { QueryTypes, type Sequelize } from 'sequelize';

export type TableSums = Record<string, { rows: number; sha256: string }>;

function cell(v: unknown): unknown {
  if (Buffer.isBuffer(v)) return `hex:${v.toString('hex')}`;
  if (v instanceof Date) return v.toISOString();
  if (typeof v === 'bigint') return v.toString();
  return v;
}

export async function tableChecksums(sequelize: Sequelize): Promise<TableSums> {
  return sequelize.transaction(async (t) => {
    await sequelize.query('SET TRANSACTION ISOLATION LEVEL REPEATABLE READ', { transaction: t }).catch(() => {});
    const tables = await sequelize.query<{ name: string }>(
      "SELECT TABLE_NAME AS name FROM information_schema.TABLES WHERE TABLE_SCHEMA = DATABASE() AND TABLE_TYPE = 'BASE TABLE' ORDER BY TABLE_NAME",
      { type: QueryTypes.SELECT, transaction: t },
    );
    const out: TableSums = {};
    for (const { name } of tables) {
      const keys = await sequelize.query<{ c: string }>(
        "SELECT COLUMN_NAME AS c FROM information_schema.KEY_COLUMN_USAGE WHERE TABLE_SCHEMA = DATABASE() AND TABLE_NAME = ? AND CONSTRAINT_NAME = 'PRIMARY' ORDER BY ORDINAL_POSITION",
        { type: QueryTypes.SELECT, replacements: [name], transaction: t },
      );
      const order = keys.length ? keys.map((k) => `\`${k.c}\``).join(', ') : '1';
      const hash = crypto.createHash('sha256');
      let rows = 0;
      let offset = 0;
      for (;;) {
        const batch = await sequelize.query<Record<string, unknown>>(`SELECT * FROM \`${name}\` ORDER BY ${order} LIMIT 2000 OFFSET ${offset}`, {
          type: QueryTypes.SELECT,
          transaction: t,
        });
        for (const r of batch) {
          hash.update(JSON.stringify(Object.keys(r).sort().map((k) => [k, cell(r[k])])));
          hash.update('\n');
        }
        rows += batch.length;
        offset += batch.length;
        if (batch.length < 2000) break;
      }
      out[name] = { rows, sha256: hash.digest('hex') };
    }
    return out;
  });
}
