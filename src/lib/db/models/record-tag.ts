import { DataTypes, type Sequelize } from 'sequelize';

const { INTEGER, BIGINT, STRING, TEXT, BOOLEAN, DOUBLE, JSON: JSONT, BLOB, DATE } = DataTypes;

const attributes = {
  recordId: { type: INTEGER, allowNull: false, primaryKey: true },
  tagId: { type: INTEGER, allowNull: false, primaryKey: true },
};

export function defineRecordTag(sequelize: Sequelize) {
  return sequelize.define('record_tag', attributes, { tableName: 'record_tag' });
}
