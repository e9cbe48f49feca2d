// better-auth's tables (core, API-key plugin, database rate limit) plus the
// lab's own account data: roles, deactivation, invitations, sign-in lockout.
// Column names equal better-auth's field names, so the adapter maps 1:1.
import { DataTypes, type QueryInterface } from 'sequelize';

const { INTEGER, BIGINT, STRING, TEXT, BOOLEAN } = DataTypes;
const DATE3 = 'DATETIME(3)' as unknown as typeof DataTypes.DATE;
const sid = { type: STRING(36), primaryKey: true, allowNull: false };
const userId = { type: STRING(36), allowNull: false, references: { model: 'user', key: 'id' }, onDelete: 'CASCADE' };
const stamps = { createdAt: { type: DATE3, allowNull: false }, updatedAt: { type: DATE3, allowNull: false } };
const opts = { charset: 'utf8mb4', collate: 'utf8mb4_bin', engine: 'InnoDB' };

export async function up({ context: qi }: { context: QueryInterface }) {
  await qi.createTable('user', {
    id: sid,
    name: { type: STRING(255), allowNull: false },
    email: { type: STRING(255), allowNull: false, unique: true },
    emailVerified: { type: BOOLEAN, allowNull: false, defaultValue: false },
    image: { type: TEXT, allowNull: true },
    roles: { type: STRING(120), allowNull: false, defaultValue: 'viewer' },
    active: { type: BOOLEAN, allowNull: false, defaultValue: true },
    ...stamps,
  }, opts);
  await qi.createTable('session', {
    id: sid,
    expiresAt: { type: DATE3, allowNull: false },
    token: { type: STRING(255), allowNull: false, unique: true },
    ipAddress: { type: STRING(64), allowNull: true },
    userAgent: { type: TEXT, allowNull: true },
    userId,
    ...stamps,
  }, opts);
  await qi.createTable('account', {
    id: sid,
    accountId: { type: STRING(255), allowNull: false },
    providerId: { type: STRING(64), allowNull: false },
    userId,
    accessToken: { type: TEXT, allowNull: true },
    refreshToken: { type: TEXT, allowNull: true },
    idToken: { type: TEXT, allowNull: true },
    accessTokenExpiresAt: { type: DATE3, allowNull: true },
    refreshTokenExpiresAt: { type: DATE3, allowNull: true },
    scope: { type: TEXT, allowNull: true },
    password: { type: TEXT, allowNull: true },
    ...stamps,
  }, opts);
  await qi.createTable('verification', {
    id: sid,
    identifier: { type: STRING(255), allowNull: false },
    value: { type: TEXT, allowNull: false },
    expiresAt: { type: DATE3, allowNull: false },
    ...stamps,
  }, opts);
  await qi.addIndex('verification', ['identifier'], { name: 'verification_identifier' });
  await qi.createTable('apikey', {
    id: sid,
    configId: { type: STRING(64), allowNull: false, defaultValue: 'default' },
    name: { type: STRING(255), allowNull: true },
    start: { type: STRING(32), allowNull: true },
    referenceId: { type: STRING(36), allowNull: false },
    prefix: { type: STRING(32), allowNull: true },
    key: { type: STRING(255), allowNull: false },
    refillInterval: { type: INTEGER, allowNull: true },
    refillAmount: { type: INTEGER, allowNull: true },
    lastRefillAt: { type: DATE3, allowNull: true },
    enabled: { type: BOOLEAN, allowNull: true, defaultValue: true },
    rateLimitEnabled: { type: BOOLEAN, allowNull: true },
    rateLimitTimeWindow: { type: BIGINT, allowNull: true },
    rateLimitMax: { type: INTEGER, allowNull: true },
    requestCount: { type: INTEGER, allowNull: true },
    remaining: { type: INTEGER, allowNull: true },
    lastRequest: { type: DATE3, allowNull: true },
    expiresAt: { type: DATE3, allowNull: true },
    permissions: { type: TEXT, allowNull: true },
    metadata: { type: TEXT, allowNull: true },
    ...stamps,
  }, opts);
  await qi.addIndex('apikey', ['key'], { name: 'apikey_key' });
  await qi.addIndex('apikey', ['referenceId'], { name: 'apikey_reference' });
  await qi.createTable('rateLimit', {
    id: sid,
    key: { type: STRING(255), allowNull: false, unique: true },
    count: { type: INTEGER, allowNull: false },
    lastRequest: { type: BIGINT, allowNull: false },
  }, opts);
  await qi.createTable('invitation', {
    id: { type: INTEGER, primaryKey: true, autoIncrement: true, allowNull: false },
    email: { type: STRING(255), allowNull: false },
    name: { type: STRING(255), allowNull: true },
    roles: { type: STRING(120), allowNull: false },
    tokenHash: { type: STRING(64), allowNull: false, unique: true },
    expiresAt: { type: DATE3, allowNull: false },
    usedAt: { type: DATE3, allowNull: true },
    invitedBy: { type: STRING(36), allowNull: true },
    ...stamps,
  }, opts);
  await qi.createTable('sign_in_failure', {
    email: { type: STRING(255), primaryKey: true, allowNull: false },
    failures: { type: INTEGER, allowNull: false, defaultValue: 0 },
    firstFailureAt: { type: DATE3, allowNull: false },
    lockedUntil: { type: DATE3, allowNull: true },
  }, opts);
}

export async function down({ context: qi }: { context: QueryInterface }) {
  for (const t of ['sign_in_failure', 'invitation', 'rateLimit', 'apikey', 'verification', 'account', 'session', 'user']) await qi.dropTable(t);
}
