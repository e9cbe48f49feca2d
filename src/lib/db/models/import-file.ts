import { DataTypes, type Sequelize } from 'sequelize';

const { INTEGER, BIGINT, STRING, TEXT, BOOLEAN, DOUBLE, JSON: JSONT, BLOB, DATE } = DataTypes;

/** One file of an import batch and its per-file report. */
const attributes = {
  id: { type: INTEGER, primaryKey: true, autoIncrement: true },
  batchId: { type: STRING(36), allowNull: false },
  fileName: { type: STRING(255), allowNull: false },
  size: { type: INTEGER, allowNull: false, defaultValue: 0 },
  sha256: { type: STRING(64) },
  status: { type: STRING(24), allowNull: false, defaultValue: 'queued' },
  report: { type: JSONT },
  error: { type: TEXT },
  pending: { type: TEXT('long') },
  createdAt: { type: DATE(3), allowNull: false },
  updatedAt: { type: DATE(3), allowNull: false },
};

export function defineImportFile(sequelize: Sequelize) {
  return sequelize.define('import_file', attributes, { tableName: 'import_file' });
}
