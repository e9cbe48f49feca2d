import { DataTypes, type Sequelize } from 'sequelize';

const { INTEGER, BIGINT, STRING, TEXT, BOOLEAN, DOUBLE, JSON: JSONT, BLOB, DATE } = DataTypes;

const attributes = {
  id: { type: INTEGER, primaryKey: true, autoIncrement: true },
  name: { type: STRING(80), allowNull: false, unique: true },
  colour: { type: STRING(16), allowNull: false, defaultValue: '#2f6f73' },
  createdAt: { type: DATE(3), allowNull: false },
  updatedAt: { type: DATE(3), allowNull: false },
};

export function defineTag(sequelize: Sequelize) {
  return sequelize.define('tag', attributes, { tableName: 'tag' });
}
