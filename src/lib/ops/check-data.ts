// Invariants of the stored data, checked by `npm run check-data` (and by the
// crash tests): no partial record, no orphan version, exactly one released
// version where the record says so, decodable peaks, an unbroken audit chain
// and an audit event for every import and approval.
import { QueryTypes, type Sequelize } from 'sequelize';
import { verifyAuditChain } from '../audit';
import { decodePeaks } from '../spectra/index';

export interface DataCheck { ok: boolean; problems: string[]; counts: Record<string, number> }

type Row = Record<string, any>;

export async function checkData(sequelize: Sequelize): Promise<DataCheck> {
  const q = (sql: string, replacements: unknown[] = []) => sequelize.query<Row>(sql, { type: QueryTypes.SELECT, replacements });
  const problems: string[] = [];

  for (const r of await q('SELECT r.id FROM spectrum_record r LEFT JOIN spectrum_version v ON v.recordId = r.id WHERE v.id IS NULL')) {
    problems.push(`record ${r.id} has no version (partial record)`);
  }
  for (const r of await q('SELECT v.id, v.recordId FROM spectrum_version v LEFT JOIN spectrum_record r ON r.id = v.recordId WHERE r.id IS NULL')) {
    problems.push(`version row ${r.id} belongs to no record (orphan version of record ${r.recordId})`);
  }
  for (const r of await q('SELECT r.id, r.latestVersion, MAX(v.version) AS maxV, COUNT(*) AS n FROM spectrum_record r JOIN spectrum_version v ON v.recordId = r.id GROUP BY r.id, r.latestVersion HAVING maxV <> r.latestVersion OR n <> maxV')) {
    problems.push(`record ${r.id}: latestVersion ${r.latestVersion} but versions run to ${r.maxV} (${r.n} rows)`);
  }
  for (const r of await q("SELECT recordId, COUNT(*) AS n FROM spectrum_version WHERE status = 'released' GROUP BY recordId HAVING n > 1")) {
    problems.push(`record ${r.recordId} has ${r.n} released versions`);
  }
  for (const r of await q("SELECT r.id, r.releasedVersion, v.status FROM spectrum_record r LEFT JOIN spectrum_version v ON v.recordId = r.id AND v.version = r.releasedVersion WHERE r.releasedVersion IS NOT NULL AND (v.id IS NULL OR v.status <> 'released')")) {
    problems.push(`record ${r.id}: releasedVersion ${r.releasedVersion} is ${r.status ?? 'missing'}`);
  }
  for (const r of await q("SELECT r.id FROM spectrum_record r JOIN spectrum_version v ON v.recordId = r.id AND v.status = 'released' WHERE r.releasedVersion IS NULL OR r.releasedVersion <> v.version")) {
    problems.push(`record ${r.id} has a released version that the record does not point to`);
  }
  let lastId = 0;
  for (;;) {
    const rows = await q('SELECT id, recordId, version, peaks, peakCount FROM spectrum_version WHERE id > ? ORDER BY id LIMIT 2000', [lastId]);
    if (!rows.length) break;
    for (const r of rows) {
      lastId = Number(r.id);
      try {
        const peaks = decodePeaks(r.peaks);
        if (peaks.length !== Number(r.peakCount)) problems.push(`record ${r.recordId} v${r.version}: ${peaks.length} peaks stored, peakCount says ${r.peakCount}`);
      } catch (e) {
        problems.push(`record ${r.recordId} v${r.version}: peaks cannot be read (${(e as Error).message})`);
      }
    }
  }
  // Audit: every record has an event that created it; every approval is audited and signed.
  for (const r of await q('SELECT r.id FROM spectrum_record r WHERE NOT EXISTS (SELECT 1 FROM audit_event a WHERE a.recordId = r.id)')) {
    problems.push(`record ${r.id} has no audit event (audit gap)`);
  }
  for (const r of await q("SELECT v.recordId, v.version FROM spectrum_version v WHERE v.approvedAt IS NOT NULL AND NOT EXISTS (SELECT 1 FROM audit_event a WHERE a.recordId = v.recordId AND a.version = v.version AND a.action LIKE '%approve%')")) {
    problems.push(`record ${r.recordId} v${r.version} was approved without an audit event`);
  }
  for (const r of await q("SELECT id FROM report WHERE status = 'approved' AND (hmac IS NULL OR NOT EXISTS (SELECT 1 FROM signature s WHERE s.subjectType = 'report' AND s.subjectId = report.id))")) {
    problems.push(`report ${r.id} is approved without a signature or integrity code`);
  }
  const chain = await verifyAuditChain();
  if (!chain.ok) problems.push(`audit trail: ${chain.message}`);

  const counts: Record<string, number> = {};
  for (const t of ['spectrum_record', 'spectrum_version', 'audit_event', 'report', 'user']) {
    const [c] = await q(`SELECT COUNT(*) AS n FROM \`${t}\``);
    counts[t] = Number(c.n);
  }
  return { ok: problems.length === 0, problems, counts };
}
