import { describe, it, expect, afterAll } from 'vitest';
import { QueryTypes } from 'sequelize';
import { useTestDatabase } from '../helpers/db';
import { migrate } from '../../src/lib/db/migrate';
import { closeSequelize } from '../../src/lib/db/sequelize';
import { appendAudit, verifyAuditChain } from '../../src/lib/audit';

const sequelize = useTestDatabase();
afterAll(() => closeSequelize());

describe('migrations', () => {
  it('run twice without change', async () => {
    const before = await sequelize.query<{ TABLE_NAME: string }>(
      "SELECT TABLE_NAME FROM information_schema.TABLES WHERE TABLE_SCHEMA = DATABASE() ORDER BY TABLE_NAME",
      { type: QueryTypes.SELECT },
    );
    const ran = await migrate(sequelize);
    expect(ran).toEqual([]);
    const after = await sequelize.query("SELECT TABLE_NAME FROM information_schema.TABLES WHERE TABLE_SCHEMA = DATABASE() ORDER BY TABLE_NAME", { type: QueryTypes.SELECT });
    expect(after).toEqual(before);
    const names = before.map((r) => r.TABLE_NAME);
    for (const t of ['spectrum_record', 'spectrum_version', 'audit_event', 'user', 'session', 'account', 'verification', 'apikey', 'report', 'signature', 'setting', 'migrations']) {
      expect(names).toContain(t);
    }
  });

  it('uses utf8mb4 with a binary collation', async () => {
    const [row] = await sequelize.query<{ c: string }>('SELECT @@collation_server AS c', { type: QueryTypes.SELECT });
    expect(row.c).toBe('utf8mb4_bin');
  });
});

describe('audit trail', () => {
  it('chains events and detects a changed row', async () => {
    await appendAudit({ action: 'test.one', details: { a: 1 } });
    await appendAudit({ action: 'test.two', reason: 'why', details: { before: { x: 'é' }, after: { x: 'ü' } } });
    expect((await verifyAuditChain()).ok).toBe(true);
    await sequelize.query("UPDATE audit_event SET reason = 'tampered' WHERE action = 'test.two'");
    const r = await verifyAuditChain();
    expect(r.ok).toBe(false);
    expect(r.message).toMatch(/changed/);
    await sequelize.query("UPDATE audit_event SET reason = 'why' WHERE action = 'test.two'");
    expect((await verifyAuditChain()).ok).toBe(true);
  });
});
