// The review queue: versions in review, each with a diff against the version
// before it and whether the person looking may approve it (four-eyes).
import { QueryTypes } from 'sequelize';
import { getSequelize } from '../db/sequelize';
import { can } from '../roles';
import { decodePeaks } from '../spectra/decodePeaks';
import { unitCosine } from './unitCosine';
import { jsonValue } from './versionRow';
import { touchedVersion } from './workflow';
import type { Actor, ImportWarning } from './types';

type Row = Record<string, any>;

export interface FieldDiff {
  field: string;
  label: string;
  before: unknown;
  after: unknown;
}

export interface ReviewItem {
  recordId: number;
  version: number;
  name: string;
  formula: string | null;
  nominalMass: number | null;
  peakCount: number;
  basePeakMz: number | null;
  synthetic: boolean;
  sourceFileName: string | null;
  changeReason: string | null;
  submittedBy: string | null;
  submittedAt: string | null;
  editors: string[];
  previous: { version: number; status: string } | null;
  diff: FieldDiff[];
  peaks: { changed: boolean; before: number | null; after: number; cosine: number | null; list: [number, number][] };
  warnings: ImportWarning[];
  canApprove: boolean;
  /** why the person looking may not approve */
  blockedBecause: string | null;
}

const LABELS: Record<string, string> = {
  name: 'Name', synonyms: 'Synonyms', formula: 'Formula', smiles: 'SMILES', molfile: 'Molfile', casRegistryNo: 'Registry number',
  retentionIndices: 'Retention indices', ionizationEnergy: 'Ionization energy (eV)', ionizationMode: 'Ionization mode',
  massRangeMin: 'Mass range from', massRangeMax: 'Mass range to', analyzerType: 'Analyser', sourceTemperature: 'Source temperature (°C)',
  instrument: 'Instrument', method: 'Method', referenceLot: 'Reference lot', referencePurity: 'Reference purity', acquiredAt: 'Acquired',
  acquiredBy: 'Analyst', derivative: 'Derivative', parentCompound: 'Parent compound', saltForm: 'Salt form', notes: 'Notes',
  origin: 'Origin', owner: 'Owner', retentionTime: 'Retention time', nominalMass: 'Nominal mass', ihd: 'IHD',
};
const DIFF_FIELDS = Object.keys(LABELS);

export async function reviewQueue(actor: Actor): Promise<ReviewItem[]> {
  const s = getSequelize();
  const rows = await s.query<Row>(
    `SELECT v.* FROM spectrum_version v JOIN spectrum_record r ON r.id = v.recordId
      WHERE v.status = 'in_review' AND v.version = r.latestVersion ORDER BY v.submittedAt, v.id LIMIT 500`,
    { type: QueryTypes.SELECT },
  );
  if (rows.length === 0) return [];
  const ids = rows.map((r) => Number(r.id));
  const prevRows = await s.query<Row>(
    `SELECT p.* FROM spectrum_version p JOIN spectrum_version v ON v.recordId = p.recordId AND p.version = v.version - 1 WHERE v.id IN (?)`,
    { replacements: [ids], type: QueryTypes.SELECT },
  );
  const prevByRecord = new Map(prevRows.map((p) => [Number(p.recordId), p]));
  const allVersionIds = [...ids, ...prevRows.map((p) => Number(p.id))];
  const riRows = await s.query<Row>('SELECT spectrumVersionId, phase, value, ladder, `column` FROM retention_index WHERE spectrumVersionId IN (?) ORDER BY id', {
    replacements: [allVersionIds], type: QueryTypes.SELECT,
  });
  const ris = new Map<number, unknown[]>();
  for (const r of riRows) ris.set(Number(r.spectrumVersionId), [...(ris.get(Number(r.spectrumVersionId)) ?? []), { phase: r.phase, value: Number(r.value), ladder: r.ladder ?? null, column: r.column ?? null }]);
  const userIds = [...new Set(rows.flatMap((r) => [r.submittedBy, ...jsonValue<string[]>(r.editors, [])]).filter(Boolean))];
  const names = new Map<string, string>();
  if (userIds.length) {
    for (const u of await s.query<Row>('SELECT id, name FROM `user` WHERE id IN (?)', { replacements: [userIds], type: QueryTypes.SELECT })) names.set(String(u.id), String(u.name));
  }
  const mayApprove = can(actor.roles, 'approve');
  return rows.map((v) => {
    const prev = prevByRecord.get(Number(v.recordId)) ?? null;
    const value = (row: Row | null, f: string) => {
      if (!row) return null;
      if (f === 'retentionIndices') return ris.get(Number(row.id)) ?? [];
      if (f === 'synonyms') return jsonValue<string[]>(row.synonyms, []);
      const x = row[f];
      return x === undefined ? null : x;
    };
    const diff: FieldDiff[] = [];
    for (const f of DIFF_FIELDS) {
      const before = value(prev, f);
      const after = value(v, f);
      const empty = (x: unknown) => x === null || x === '' || (Array.isArray(x) && x.length === 0);
      if (JSON.stringify(before ?? null) !== JSON.stringify(after ?? null) && !(empty(before) && empty(after))) {
        diff.push({ field: f, label: LABELS[f], before, after });
      }
    }
    const peaks = decodePeaks(v.peaks as Buffer);
    const prevPeaks = prev ? decodePeaks(prev.peaks as Buffer) : null;
    const touched = touchedVersion(v, actor.id);
    const blockedBecause = !mayApprove ? 'your roles do not include approval' : touched ? 'you edited or submitted this version' : null;
    const metadata = jsonValue<Record<string, any>>(v.metadata, {});
    return {
      recordId: Number(v.recordId), version: Number(v.version), name: String(v.name), formula: v.formula ?? null,
      nominalMass: v.nominalMass === null ? null : Number(v.nominalMass), peakCount: Number(v.peakCount),
      basePeakMz: v.basePeakMz === null ? null : Number(v.basePeakMz), synthetic: !!v.synthetic, sourceFileName: v.sourceFileName ?? null,
      changeReason: v.changeReason ?? null,
      submittedBy: v.submittedBy ? names.get(String(v.submittedBy)) ?? String(v.submittedBy) : null,
      submittedAt: v.submittedAt ? new Date(v.submittedAt).toISOString() : null,
      editors: jsonValue<string[]>(v.editors, []).map((id) => names.get(id) ?? id),
      previous: prev ? { version: Number(prev.version), status: String(prev.status) } : null,
      diff,
      peaks: {
        changed: prev ? prev.contentHash !== v.contentHash : true,
        before: prev ? Number(prev.peakCount) : null,
        after: Number(v.peakCount),
        cosine: prevPeaks ? unitCosine(peaks, prevPeaks) : null,
        list: peaks,
      },
      warnings: jsonValue<ImportWarning[]>(metadata.importWarnings, []),
      canApprove: blockedBecause === null,
      blockedBecause,
    };
  });
}
