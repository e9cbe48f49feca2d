import { DataTypes, type Sequelize } from 'sequelize';

const { INTEGER, BIGINT, STRING, TEXT, BOOLEAN, DOUBLE, JSON: JSONT, BLOB, DATE } = DataTypes;

/** A compound identity shared by replicate spectra (duplicate detection). */
const attributes = {
  id: { type: INTEGER, primaryKey: true, autoIncrement: true },
  name: { type: STRING(255), allowNull: false },
  nameKey: { type: STRING(255), allowNull: false },
  formula: { type: STRING(120) },
  casRegistryNo: { type: STRING(20) },
  createdAt: { type: DATE(3), allowNull: false },
  updatedAt: { type: DATE(3), allowNull: false },
};

export function defineCompound(sequelize: Sequelize) {
  return sequelize.define('compound', attributes, { tableName: 'compound' });
}
