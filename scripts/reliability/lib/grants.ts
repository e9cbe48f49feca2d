// The production database accounts (README, "Scaling out"): migrations run
// with a privileged account (DATABASE_MIGRATION_URL); the app's own account
// (DATABASE_URL) may read and write the data tables but only INSERT and
// SELECT the audit trail, so not even the app's own code could change or
// remove an audit row. Table-level grants: run again after a migration that
// adds a table.

/** Tables the app account reads but never writes. */
export const READ_ONLY_TABLES = ['migrations'];
/** Tables the app account may only append to and read. */
export const APPEND_ONLY_TABLES = ['audit_event'];

export function appAccountGrants(tables: string[], account: string, database = 'ionotheca'): string[] {
  return tables.map((t) => {
    const privileges = APPEND_ONLY_TABLES.includes(t) ? 'SELECT, INSERT' : READ_ONLY_TABLES.includes(t) ? 'SELECT' : 'SELECT, INSERT, UPDATE, DELETE';
    return `GRANT ${privileges} ON \`${database}\`.\`${t}\` TO ${account}`;
  });
}
