import { DataTypes, type Sequelize } from 'sequelize';

const { INTEGER, BIGINT, STRING, TEXT, BOOLEAN, DOUBLE, JSON: JSONT, BLOB, DATE } = DataTypes;

/** better-auth's user table plus the lab's roles and deactivation flag. */
const attributes = {
  id: { type: STRING(36), primaryKey: true },
  name: { type: STRING(255), allowNull: false },
  email: { type: STRING(255), allowNull: false, unique: true },
  emailVerified: { type: BOOLEAN, allowNull: false, defaultValue: false },
  image: { type: TEXT },
  roles: { type: STRING(120), allowNull: false, defaultValue: 'viewer' },
  active: { type: BOOLEAN, allowNull: false, defaultValue: true },
  createdAt: { type: DATE(3), allowNull: false },
  updatedAt: { type: DATE(3), allowNull: false },
};

export function defineUser(sequelize: Sequelize) {
  return sequelize.define('user', attributes, { tableName: 'user' });
}
