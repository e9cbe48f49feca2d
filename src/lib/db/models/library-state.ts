import { DataTypes, type Sequelize } from 'sequelize';

const { INTEGER, BIGINT, STRING, TEXT, BOOLEAN, DOUBLE, JSON: JSONT, BLOB, DATE } = DataTypes;

/** The single row holding the library version that every server polls. */
const attributes = {
  id: { type: INTEGER, primaryKey: true },
  version: { type: BIGINT, allowNull: false, defaultValue: 0 },
  updatedAt: { type: DATE(3), allowNull: false },
};

export function defineLibraryState(sequelize: Sequelize) {
  return sequelize.define('library_state', attributes, { tableName: 'library_state' });
}
