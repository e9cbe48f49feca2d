import { DataTypes, type Sequelize } from 'sequelize';

const { INTEGER, BIGINT, STRING, TEXT, BOOLEAN, DOUBLE, JSON: JSONT, BLOB, DATE } = DataTypes;

/** Consecutive failed sign-ins per e-mail address, for the account lockout. */
const attributes = {
  email: { type: STRING(255), primaryKey: true },
  failures: { type: INTEGER, allowNull: false, defaultValue: 0 },
  firstFailureAt: { type: DATE(3), allowNull: false },
  lockedUntil: { type: DATE(3) },
};

export function defineSignInFailure(sequelize: Sequelize) {
  return sequelize.define('sign_in_failure', attributes, { tableName: 'sign_in_failure' });
}
