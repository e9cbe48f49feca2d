import { DataTypes, type Sequelize } from 'sequelize';

const { INTEGER, BIGINT, STRING, TEXT, BOOLEAN, DOUBLE, JSON: JSONT, BLOB, DATE } = DataTypes;

/** A retention index of a version for one stationary-phase class. */
const attributes = {
  id: { type: INTEGER, primaryKey: true, autoIncrement: true },
  spectrumVersionId: { type: INTEGER, allowNull: false },
  phase: { type: STRING(40), allowNull: false },
  value: { type: DOUBLE, allowNull: false },
  ladder: { type: STRING(255) },
  column: { type: STRING(255) },
};

export function defineRetentionIndex(sequelize: Sequelize) {
  return sequelize.define('retention_index', attributes, { tableName: 'retention_index' });
}
