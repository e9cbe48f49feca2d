import { DataTypes, type Sequelize } from 'sequelize';

const { INTEGER, BIGINT, STRING, TEXT, BOOLEAN, DOUBLE, JSON: JSONT, BLOB, DATE } = DataTypes;

/** A message captured by the local fake SMTP server. */
const attributes = {
  id: { type: INTEGER, primaryKey: true, autoIncrement: true },
  to: { type: TEXT, allowNull: false },
  from: { type: STRING(255) },
  subject: { type: STRING(500) },
  text: { type: TEXT('medium') },
  html: { type: TEXT('medium') },
  receivedAt: { type: DATE(3), allowNull: false },
};

export function defineMailMessage(sequelize: Sequelize) {
  return sequelize.define('mail_message', attributes, { tableName: 'mail_message' });
}
