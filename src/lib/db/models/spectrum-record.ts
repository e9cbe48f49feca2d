import { DataTypes, type Sequelize } from 'sequelize';

const { INTEGER, BIGINT, STRING, TEXT, BOOLEAN, DOUBLE, JSON: JSONT, BLOB, DATE } = DataTypes;

/** A record: stable id across versions. */
const attributes = {
  id: { type: INTEGER, primaryKey: true, autoIncrement: true },
  compoundId: { type: INTEGER, allowNull: false },
  latestVersion: { type: INTEGER, allowNull: false, defaultValue: 1 },
  releasedVersion: { type: INTEGER },
  synthetic: { type: BOOLEAN, allowNull: false, defaultValue: false },
  createdBy: { type: STRING(36) },
  createdAt: { type: DATE(3), allowNull: false },
  updatedAt: { type: DATE(3), allowNull: false },
};

export function defineSpectrumRecord(sequelize: Sequelize) {
  return sequelize.define('spectrum_record', attributes, { tableName: 'spectrum_record' });
}
