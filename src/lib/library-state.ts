// The library version: bumped in the same transaction as every change that
// alters what a search can find, polled by every app server.
import { QueryTypes, type Transaction } from 'sequelize';
import { getSequelize } from './db/sequelize';

export async function bumpLibraryVersion(transaction?: Transaction): Promise<void> {
  await getSequelize().query('UPDATE library_state SET version = version + 1, updatedAt = ? WHERE id = 1', {
    replacements: [new Date()],
    type: QueryTypes.UPDATE,
    transaction,
  });
}

export async function readLibraryVersion(): Promise<number> {
  const [row] = await getSequelize().query<{ version: number }>('SELECT version FROM library_state WHERE id = 1', { type: QueryTypes.SELECT });
  return Number(row?.version ?? 0);
}
