// GET /api/spectra/export.csv: the current library view as CSV, one line a
// peak (m/z and intensity in plain columns) with the record's metadata on each
// line, so that a spreadsheet can filter and pivot it without parsing.
import { QueryTypes } from 'sequelize';
import { getSequelize } from '../db/sequelize';
import { decodePeaks } from '../spectra/decodePeaks';
import { listRecords } from './listRecords';
import type { RecordStatus, SpectraListQuery } from './listQuery';
import { toCsv } from './toCsv';

export const CSV_HEADER = [
  'record_id', 'version', 'name', 'formula', 'nominal_mass', 'ihd', 'cas_registry_no', 'tags', 'status', 'synthetic_demo', 'peak_count', 'base_peak_mz', 'mz', 'intensity',
] as const;

/** Most records one export holds. */
export const MAX_EXPORT_RECORDS = 5000;

/**
 * The view's records (every page, in the view's order) as CSV.
 * @returns the CSV text and how many records it holds
 */
export async function exportRecordsCsv(query: SpectraListQuery, statuses: RecordStatus[] = []): Promise<{ csv: string; records: number; truncated: boolean }> {
  const list = await listRecords(query, { statuses, all: true, maxAll: MAX_EXPORT_RECORDS });
  const ids = list.items.map((i) => i.versionId);
  const peaks = new Map<number, [number, number][]>();
  // Peaks in slices, so one export never holds a huge result set at once.
  for (let i = 0; i < ids.length; i += 500) {
    const rows = await getSequelize().query<Record<string, any>>('SELECT id, peaks FROM spectrum_version WHERE id IN (?)', {
      replacements: [ids.slice(i, i + 500)],
      type: QueryTypes.SELECT,
    });
    for (const r of rows) peaks.set(Number(r.id), decodePeaks(r.peaks as Buffer));
  }
  const lines: unknown[][] = [];
  for (const item of list.items) {
    const meta = [item.id, item.version, item.name, item.formula, item.nominalMass, item.ihd, item.casRegistryNo, item.tags.join('; '), item.status, item.synthetic ? 'yes' : 'no', item.peakCount, item.basePeak];
    const list = peaks.get(item.versionId) ?? [];
    if (list.length === 0) lines.push([...meta, null, null]);
    for (const [mz, intensity] of list) lines.push([...meta, mz, Math.round(intensity * 1e4) / 1e4]);
  }
  return { csv: toCsv(CSV_HEADER, lines), records: list.items.length, truncated: list.total > list.items.length };
}
