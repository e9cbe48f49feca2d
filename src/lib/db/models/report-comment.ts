import { DataTypes, type Sequelize } from 'sequelize';

const { INTEGER, BIGINT, STRING, TEXT, BOOLEAN, DOUBLE, JSON: JSONT, BLOB, DATE } = DataTypes;

const attributes = {
  id: { type: INTEGER, primaryKey: true, autoIncrement: true },
  reportId: { type: INTEGER, allowNull: false },
  authorId: { type: STRING(36), allowNull: false },
  action: { type: STRING(16) },
  body: { type: TEXT, allowNull: false },
  createdAt: { type: DATE(3), allowNull: false },
};

export function defineReportComment(sequelize: Sequelize) {
  return sequelize.define('report_comment', attributes, { tableName: 'report_comment' });
}
