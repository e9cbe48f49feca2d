// better-auth's storage through the process's one Sequelize pool, written with
// better-auth's own createAdapterFactory. The factory hands us `where` and
// `data` with database column names, but `select` and `sortBy.field` with the
// logical field names: those are mapped with getFieldName. Values are bound
// as replacements, never spliced into the SQL.
import { createAdapterFactory, type CleanedWhere, type DBAdapter } from 'better-auth/adapters';
import type { BetterAuthOptions } from 'better-auth';
import { QueryTypes, type Sequelize, type Transaction } from 'sequelize';
import { getSequelize } from './sequelize';

export interface SequelizeAdapterOptions {
  /** Where the pool comes from. @default getSequelize */
  sequelize?: () => Sequelize;
  /** Log every adapter call (better-auth's debug logs). @default false */
  debugLogs?: boolean;
}

const quote = (name: string) => '`' + String(name).replace(/`/g, '``') + '`';

/** Escape LIKE's wildcards (and the escape character itself), MariaDB's default escape being `\`. */
export function escapeLike(value: string): string {
  return value.replace(/[\\%_]/g, (c) => '\\' + c);
}

interface Sql {
  sql: string;
  params: unknown[];
}

/** One where-condition as SQL. `column` is already quoted. */
function condition(column: string, w: CleanedWhere): Sql {
  const { operator, value } = w;
  const insensitive = w.mode === 'insensitive' && (typeof value === 'string' || (Array.isArray(value) && value.every((v) => typeof v === 'string')));
  const col = insensitive ? `LOWER(${column})` : column;
  const v = (x: unknown) => (insensitive && typeof x === 'string' ? x.toLowerCase() : x);
  switch (operator) {
    case 'in':
    case 'not_in': {
      const list = (Array.isArray(value) ? value : [value]) as unknown[];
      if (list.length === 0) return { sql: operator === 'in' ? '1 = 0' : '1 = 1', params: [] };
      const nonNull = list.filter((x) => x !== null);
      const hasNull = nonNull.length < list.length;
      const marks = nonNull.map(() => '?').join(', ');
      if (operator === 'in') {
        const parts = [nonNull.length ? `${col} IN (${marks})` : '', hasNull ? `${column} IS NULL` : ''].filter(Boolean);
        return { sql: parts.length > 1 ? `(${parts.join(' OR ')})` : parts[0], params: nonNull.map(v) };
      }
      const parts = [nonNull.length ? `${col} NOT IN (${marks})` : '', hasNull ? `${column} IS NOT NULL` : ''].filter(Boolean);
      return { sql: parts.length > 1 ? `(${parts.join(' AND ')})` : parts[0], params: nonNull.map(v) };
    }
    case 'contains':
      return { sql: `${col} LIKE ?`, params: [`%${escapeLike(String(v(value)))}%`] };
    case 'starts_with':
      return { sql: `${col} LIKE ?`, params: [`${escapeLike(String(v(value)))}%`] };
    case 'ends_with':
      return { sql: `${col} LIKE ?`, params: [`%${escapeLike(String(v(value)))}`] };
    case 'ne':
      if (value === null) return { sql: `${column} IS NOT NULL`, params: [] };
      return { sql: `${col} <> ?`, params: [v(value)] };
    case 'gt':
      return { sql: `${column} > ?`, params: [value] };
    case 'gte':
      return { sql: `${column} >= ?`, params: [value] };
    case 'lt':
      return { sql: `${column} < ?`, params: [value] };
    case 'lte':
      return { sql: `${column} <= ?`, params: [value] };
    case 'eq':
    default:
      if (value === null) return { sql: `${column} IS NULL`, params: [] };
      return { sql: `${col} = ?`, params: [v(value)] };
  }
}

/** AND-connected conditions together, OR-connected ones together, both groups ANDed (as better-auth's own adapters do). */
export function whereClause(where: CleanedWhere[] | undefined): Sql {
  if (!where || where.length === 0) return { sql: '', params: [] };
  const and: Sql[] = [];
  const or: Sql[] = [];
  for (const w of where) (w.connector === 'OR' ? or : and).push(condition(quote(w.field), w));
  const groups: Sql[] = [];
  if (and.length) groups.push({ sql: and.map((c) => c.sql).join(' AND '), params: and.flatMap((c) => c.params) });
  if (or.length) groups.push({ sql: `(${or.map((c) => c.sql).join(' OR ')})`, params: or.flatMap((c) => c.params) });
  return { sql: ' WHERE ' + groups.map((g) => (groups.length > 1 ? `(${g.sql})` : g.sql)).join(' AND '), params: groups.flatMap((g) => g.params) };
}

/** A value as MariaDB takes it: booleans as 0/1 (the factory already does this), undefined as NULL. */
function bindable(value: unknown): unknown {
  if (value === undefined) return null;
  if (typeof value === 'boolean') return value ? 1 : 0;
  if (typeof value === 'bigint') return value.toString();
  return value;
}

export function sequelizeAdapter(adapterOptions: SequelizeAdapterOptions = {}) {
  const db = adapterOptions.sequelize ?? getSequelize;
  let lazyOptions: BetterAuthOptions | null = null;

  const make = (tx: Transaction | null): ((options: BetterAuthOptions) => DBAdapter<BetterAuthOptions>) =>
    createAdapterFactory({
      config: {
        adapterId: 'sequelize-mariadb',
        adapterName: 'Sequelize (MariaDB)',
        usePlural: false,
        debugLogs: adapterOptions.debugLogs ?? false,
        supportsJSON: false,
        supportsDates: true,
        supportsBooleans: false,
        supportsArrays: false,
        supportsNumericIds: true,
        supportsUUIDs: false,
        transaction: tx
          ? false
          : (cb) => db().transaction(async (t) => cb(make(t)(lazyOptions ?? {}) as any)),
      },
      adapter: ({ getFieldName }) => {
        const run = async <T = any>(sql: string, params: unknown[], type: QueryTypes): Promise<T> =>
          (await db().query(sql, { replacements: params.map(bindable), type, transaction: tx ?? undefined, raw: true })) as T;
        const select = async (sql: string, params: unknown[]) => run<Record<string, unknown>[]>(sql, params, QueryTypes.SELECT);
        /** UPDATE/DELETE: the number of rows the statement matched. */
        const affected = async (sql: string, params: unknown[]): Promise<number> => {
          const r: any = await db().query(sql, { replacements: params.map(bindable), type: QueryTypes.RAW, transaction: tx ?? undefined, raw: true });
          const meta = Array.isArray(r) ? r[0] : r;
          return Number(meta?.affectedRows ?? 0);
        };
        const idColumn = (modelKey: string) => getFieldName({ model: modelKey, field: 'id' });
        const columns = (modelKey: string, fields?: string[]) =>
          fields && fields.length ? fields.map((f) => quote(getFieldName({ model: modelKey, field: f }))).join(', ') : '*';
        const byId = async (model: string, modelKey: string, id: unknown) =>
          (await select(`SELECT * FROM ${quote(model)} WHERE ${quote(idColumn(modelKey))} = ? LIMIT 1`, [id]))[0] ?? null;

        return {
          async create({ model, modelKey = model, data }: any) {
            const keys = Object.keys(data).filter((k) => data[k] !== undefined);
            const sql = keys.length
              ? `INSERT INTO ${quote(model)} (${keys.map(quote).join(', ')}) VALUES (${keys.map(() => '?').join(', ')})`
              : `INSERT INTO ${quote(model)} () VALUES ()`;
            const r: any = await db().query(sql, { replacements: keys.map((k) => bindable(data[k])), type: QueryTypes.INSERT, transaction: tx ?? undefined });
            const id = data[idColumn(modelKey)] ?? (Array.isArray(r) ? r[0] : undefined);
            const row = await byId(model, modelKey, id);
            if (!row) throw new Error(`The new ${model} row could not be read back`);
            return row as any;
          },
          async findOne({ model, modelKey = model, where, select: fields }: any) {
            const w = whereClause(where);
            const rows = await select(`SELECT ${columns(modelKey, fields)} FROM ${quote(model)}${w.sql} LIMIT 1`, w.params);
            return (rows[0] ?? null) as any;
          },
          async findMany({ model, modelKey = model, where, limit, offset, sortBy, select: fields }: any) {
            const w = whereClause(where);
            let sql = `SELECT ${columns(modelKey, fields)} FROM ${quote(model)}${w.sql}`;
            if (sortBy?.field) sql += ` ORDER BY ${quote(getFieldName({ model: modelKey, field: sortBy.field }))} ${sortBy.direction === 'desc' ? 'DESC' : 'ASC'}`;
            const params = [...w.params];
            if (limit !== undefined || offset !== undefined) {
              sql += ' LIMIT ?';
              params.push(limit !== undefined ? Math.max(0, Math.floor(Number(limit))) : Number.MAX_SAFE_INTEGER);
              if (offset) {
                sql += ' OFFSET ?';
                params.push(Math.max(0, Math.floor(Number(offset))));
              }
            }
            return (await select(sql, params)) as any;
          },
          async count({ model, where }: any) {
            const w = whereClause(where);
            const [row] = await select(`SELECT COUNT(*) AS c FROM ${quote(model)}${w.sql}`, w.params);
            return Number(row?.c ?? 0);
          },
          async update({ model, modelKey = model, where, update }: any) {
            if (!where || where.length === 0) return null;
            // Update exactly one row: find it, change it by its key, read it back.
            const w = whereClause(where);
            const id = idColumn(modelKey);
            const [hit] = await select(`SELECT ${quote(id)} AS id FROM ${quote(model)}${w.sql} LIMIT 1`, w.params);
            if (!hit) return null;
            const keys = Object.keys(update).filter((k) => update[k] !== undefined);
            if (keys.length) {
              await affected(`UPDATE ${quote(model)} SET ${keys.map((k) => `${quote(k)} = ?`).join(', ')} WHERE ${quote(id)} = ?`, [...keys.map((k) => update[k]), hit.id]);
            }
            const newId = keys.includes(id) ? update[id] : hit.id;
            return (await byId(model, modelKey, newId)) as any;
          },
          async updateMany({ model, where, update }: any) {
            const keys = Object.keys(update).filter((k) => update[k] !== undefined);
            const w = whereClause(where);
            if (!keys.length) return this.count({ model, where } as any);
            return affected(`UPDATE ${quote(model)} SET ${keys.map((k) => `${quote(k)} = ?`).join(', ')}${w.sql}`, [...keys.map((k) => update[k]), ...w.params]);
          },
          async delete({ model, where }: any) {
            const w = whereClause(where);
            await affected(`DELETE FROM ${quote(model)}${w.sql}`, w.params);
          },
          async deleteMany({ model, where }: any) {
            const w = whereClause(where);
            return affected(`DELETE FROM ${quote(model)}${w.sql}`, w.params);
          },
        };
      },
    });

  const root = make(null);
  return (options: BetterAuthOptions): DBAdapter<BetterAuthOptions> => {
    lazyOptions = options;
    return root(options);
  };
}
