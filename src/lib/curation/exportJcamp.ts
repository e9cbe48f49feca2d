// GET /api/spectra/:id/jcamp: a record version as a JCAMP-DX 5.01 file,
// written by src/lib/spectra's writeJcamp with the record's metadata, so that
// importing the file again finds it as a duplicate.
import { QueryTypes } from 'sequelize';
import { getSequelize } from '../db/sequelize';
import { HttpError } from '../http';
import { decodePeaks } from '../spectra/decodePeaks';
import { writeJcamp, type JcampSpectrumInput } from '../spectra/writeJcamp';
import { USER_LABEL_FIELDS, isFieldLabel } from './userLabelFields';
import { jsonValue } from './versionRow';

type Row = Record<string, any>;
const PUBLIC = ['released', 'superseded', 'retired'];

export async function loadVersionForRead(recordId: number, opts: { version?: number; privileged: boolean }): Promise<Row> {
  const s = getSequelize();
  const rows = await s.query<Row>('SELECT * FROM spectrum_version WHERE recordId = ? ORDER BY version', { replacements: [recordId], type: QueryTypes.SELECT });
  const visible = rows.filter((r) => opts.privileged || PUBLIC.includes(r.status));
  if (visible.length === 0) throw new HttpError(404, 'not_found', `There is no record ${recordId}`);
  if (opts.version !== undefined) {
    const v = visible.find((r) => Number(r.version) === opts.version);
    if (!v) throw new HttpError(404, 'not_found', `Record ${recordId} has no version ${opts.version} you may read`);
    return v;
  }
  if (opts.privileged) return visible.at(-1)!;
  return visible.find((r) => r.status === 'released') ?? visible.at(-1)!;
}

export function versionToJcampInput(v: Row, retentionIndices: { phase: string; value: number }[]): JcampSpectrumInput {
  const metadata = jsonValue<Record<string, any>>(v.metadata, {});
  const synonyms = jsonValue<string[]>(v.synonyms, []);
  const userLabels: Record<string, string> = {};
  for (const f of USER_LABEL_FIELDS) {
    const value = v[f.field];
    if (value !== null && value !== undefined && String(value).trim() !== '') userLabels[f.label] = String(value);
  }
  for (const [key, value] of Object.entries(jsonValue<Record<string, string>>(metadata.userLabels, {}))) {
    if (isFieldLabel(key) || /^RETENTION ?INDEX$/i.test(key.trim()) || /^RI$/i.test(key.trim())) continue;
    userLabels[key] = String(value);
  }
  if (v.synthetic) userLabels['SYNTHETIC'] = 'synthetic demo data, not for identification';
  const ri = retentionIndices[0]?.value ?? (typeof metadata.retentionIndex === 'number' ? metadata.retentionIndex : null);
  const statedMw = typeof metadata.statedMw === 'number' ? metadata.statedMw : null;
  return {
    title: String(metadata.title || v.name),
    names: [String(v.name), ...synonyms],
    formula: v.formula ?? null,
    casRegistryNo: v.casRegistryNo ?? null,
    mw: statedMw ?? (v.nominalMass === null ? null : Number(v.nominalMass)),
    origin: v.origin ?? null,
    owner: v.owner ?? null,
    spectrometer: v.instrument ?? null,
    ionizationMode: v.ionizationMode ?? null,
    ionizationEnergy: v.ionizationEnergy === null ? null : Number(v.ionizationEnergy),
    retentionIndex: ri,
    retentionTime: v.retentionTime === null ? null : Number(v.retentionTime),
    userLabels,
    peaks: decodePeaks(v.peaks as Buffer),
  };
}

export async function exportRecordJcamp(recordId: number, opts: { version?: number; privileged: boolean }): Promise<{ fileName: string; text: string; version: number }> {
  const v = await loadVersionForRead(recordId, opts);
  const ris = await getSequelize().query<Row>('SELECT phase, value FROM retention_index WHERE spectrumVersionId = ? ORDER BY id', {
    replacements: [v.id], type: QueryTypes.SELECT,
  });
  const text = writeJcamp(versionToJcampInput(v, ris.map((r) => ({ phase: String(r.phase), value: Number(r.value) }))));
  const base = String(v.name).replace(/[^A-Za-z0-9._-]+/g, '-').replace(/^-+|-+$/g, '').slice(0, 80) || 'spectrum';
  return { fileName: `${base}-record-${recordId}-v${v.version}.jdx`, text, version: Number(v.version) };
}
