import { DataTypes, type Sequelize } from 'sequelize';

const { INTEGER, BIGINT, STRING, TEXT, BOOLEAN, DOUBLE, JSON: JSONT, BLOB, DATE } = DataTypes;

const attributes = {
  id: { type: INTEGER, primaryKey: true, autoIncrement: true },
  email: { type: STRING(255), allowNull: false },
  name: { type: STRING(255) },
  roles: { type: STRING(120), allowNull: false },
  tokenHash: { type: STRING(64), allowNull: false, unique: true },
  expiresAt: { type: DATE(3), allowNull: false },
  usedAt: { type: DATE(3) },
  invitedBy: { type: STRING(36) },
  createdAt: { type: DATE(3), allowNull: false },
  updatedAt: { type: DATE(3), allowNull: false },
};

export function defineInvitation(sequelize: Sequelize) {
  return sequelize.define('invitation', attributes, { tableName: 'invitation' });
}
