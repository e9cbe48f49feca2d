import { DataTypes, type Sequelize } from 'sequelize';

const { INTEGER, BIGINT, STRING, TEXT, BOOLEAN, DOUBLE, JSON: JSONT, BLOB, DATE } = DataTypes;

/** An electronic signature: signer, meaning, UTC time, digest of what was signed. */
const attributes = {
  id: { type: INTEGER, primaryKey: true, autoIncrement: true },
  signerId: { type: STRING(36), allowNull: false },
  signerName: { type: STRING(255), allowNull: false },
  meaning: { type: STRING(255), allowNull: false },
  subjectType: { type: STRING(24), allowNull: false },
  subjectId: { type: INTEGER, allowNull: false },
  contentDigest: { type: STRING(64) },
  signedAt: { type: DATE(3), allowNull: false },
};

export function defineSignature(sequelize: Sequelize) {
  return sequelize.define('signature', attributes, { tableName: 'signature' });
}
