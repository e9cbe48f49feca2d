import { DataTypes, type Sequelize } from 'sequelize';

const { INTEGER, BIGINT, STRING, TEXT, BOOLEAN, DOUBLE, JSON: JSONT, BLOB, DATE } = DataTypes;

const attributes = {
  reportId: { type: INTEGER, allowNull: false, primaryKey: true },
  recordId: { type: INTEGER, allowNull: false, primaryKey: true },
  version: { type: INTEGER, allowNull: false, primaryKey: true },
  role: { type: STRING(16), allowNull: false, defaultValue: 'hit' },
};

export function defineReportCitation(sequelize: Sequelize) {
  return sequelize.define('report_citation', attributes, { tableName: 'report_citation' });
}
