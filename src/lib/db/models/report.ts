import { DataTypes, type Sequelize } from 'sequelize';

const { INTEGER, BIGINT, STRING, TEXT, BOOLEAN, DOUBLE, JSON: JSONT, BLOB, DATE } = DataTypes;

/** An identification report and the search snapshot it was made from. */
const attributes = {
  id: { type: INTEGER, primaryKey: true, autoIncrement: true },
  title: { type: STRING(255), allowNull: false },
  status: { type: STRING(16), allowNull: false, defaultValue: 'draft' },
  authorId: { type: STRING(36), allowNull: false },
  reviewerId: { type: STRING(36) },
  conclusion: { type: STRING(20) },
  reasoning: { type: TEXT },
  sample: { type: JSONT, allowNull: false, defaultValue: {} },
  snapshot: { type: JSONT, allowNull: false },
  selectedRecordId: { type: INTEGER },
  selectedVersion: { type: INTEGER },
  criteria: { type: JSONT },
  criteriaSettingsVersion: { type: INTEGER },
  referenceStandard: { type: JSONT },
  supersedesReportId: { type: INTEGER },
  hmac: { type: STRING(64) },
  submittedAt: { type: DATE(3) },
  decidedAt: { type: DATE(3) },
  createdAt: { type: DATE(3), allowNull: false },
  updatedAt: { type: DATE(3), allowNull: false },
};

export function defineReport(sequelize: Sequelize) {
  return sequelize.define('report', attributes, { tableName: 'report' });
}
