import { DataTypes, type Sequelize } from 'sequelize';

const { INTEGER, BIGINT, STRING, TEXT, BOOLEAN, DOUBLE, JSON: JSONT, BLOB, DATE } = DataTypes;

/** Append-only: rows are only ever inserted (src/lib/audit.ts). */
const attributes = {
  id: { type: BIGINT, primaryKey: true, autoIncrement: true },
  at: { type: DATE(3), allowNull: false },
  actorId: { type: STRING(36) },
  actorEmail: { type: STRING(255) },
  action: { type: STRING(64), allowNull: false },
  targetType: { type: STRING(32) },
  targetId: { type: STRING(64) },
  recordId: { type: INTEGER },
  version: { type: INTEGER },
  reason: { type: TEXT },
  details: { type: JSONT },
  prevHash: { type: STRING(64), allowNull: false },
  hash: { type: STRING(64), allowNull: false },
};

export function defineAuditEvent(sequelize: Sequelize) {
  return sequelize.define('audit_event', attributes, { tableName: 'audit_event' });
}
