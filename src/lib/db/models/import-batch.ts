import { DataTypes, type Sequelize } from 'sequelize';

const { INTEGER, BIGINT, STRING, TEXT, BOOLEAN, DOUBLE, JSON: JSONT, BLOB, DATE } = DataTypes;

const attributes = {
  id: { type: STRING(36), primaryKey: true },
  createdBy: { type: STRING(36) },
  fileCount: { type: INTEGER, allowNull: false, defaultValue: 0 },
  source: { type: STRING(20), allowNull: false, defaultValue: 'web' },
  createdAt: { type: DATE(3), allowNull: false },
  updatedAt: { type: DATE(3), allowNull: false },
};

export function defineImportBatch(sequelize: Sequelize) {
  return sequelize.define('import_batch', attributes, { tableName: 'import_batch' });
}
