import { DataTypes, type Sequelize } from 'sequelize';

const { INTEGER, BIGINT, STRING, TEXT, BOOLEAN, DOUBLE, JSON: JSONT, BLOB, DATE } = DataTypes;

/** A named setting; each change is a new version row. */
const attributes = {
  id: { type: INTEGER, primaryKey: true, autoIncrement: true },
  name: { type: STRING(80), allowNull: false },
  version: { type: INTEGER, allowNull: false },
  value: { type: JSONT, allowNull: false },
  createdBy: { type: STRING(36) },
  createdAt: { type: DATE(3), allowNull: false },
};

export function defineSetting(sequelize: Sequelize) {
  return sequelize.define('setting', attributes, { tableName: 'setting' });
}
