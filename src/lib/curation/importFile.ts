// One file through the importer: read and validate it (src/lib/spectra),
// check the stated identity (src/lib/chem), then, in ONE database transaction,
// classify each spectrum against the library (duplicate, same peaks under
// another compound, near-duplicate, new) and store the new ones as draft
// records. A rejected file, a file that needs a page selection and a file
// that needs confirmation write nothing.
import { QueryTypes, type Transaction } from 'sequelize';
import { getSequelize } from '../db/sequelize';
import { getModels } from '../db/index';
import { appendAudit } from '../audit';
import { bumpLibraryVersion } from '../library-state';
import { decodeText } from '../spectra/decodeText';
import { readJcamp } from '../spectra/readJcamp';
import { validateFileName } from '../spectra/validateFileName';
import { peakContentHash } from '../spectra/peakContentHash';
import { encodePeaks } from '../spectra/encodePeaks';
import { decodePeaks } from '../spectra/decodePeaks';
import type { ParsedSpectrum } from '../spectra/types';
import { isDatabaseDown } from '../http';
import { deriveChemistry } from './chemistry';
import { compoundNameKey } from './compoundKey';
import { unitCosine } from './unitCosine';
import { fieldsFromUserLabels } from './userLabelFields';
import type { Actor, FileReport, FoundSpectrum, ImportWarning, PageSelection } from './types';

export interface ImportFileOptions {
  fileName: string;
  /** the file's bytes as uploaded; or `text` when re-importing a kept file */
  bytes?: Uint8Array;
  text?: string;
  actor: Actor;
  batchId?: string | null;
  /** NTUPLES pages to keep (1-based), or 'all' */
  pages?: PageSelection;
  /** store even when the same peaks exist under another compound */
  confirmed?: boolean;
  /**
   * A run with more pages than this needs a page selection.
   * @default 20
   */
  maxAutoPages?: number;
  /**
   * Cosine above which a spectrum of the same compound is a near duplicate.
   * @default 0.98
   */
  nearDuplicateCosine?: number;
  /** mark the records as synthetic demo data @default false */
  synthetic?: boolean;
}

export interface ImportFileResult {
  report: FileReport;
  /** the file's text, kept for a later selection or confirmation */
  pendingText: string | null;
}

interface Entry {
  spectrum: ParsedSpectrum;
  index: number;
  page: number | null;
  label: string;
  name: string;
  synonyms: string[];
  cas: string | null;
  nameKey: string;
  hash: string;
  chem: ReturnType<typeof deriveChemistry>;
  warnings: ImportWarning[];
}

const MAX_SOURCE_TEXT = 1024 * 1024;
/** Beyond any mass spectrometer's range: such an m/z is a damaged number, not a peak. */
export const MAX_MZ = 100_000;

function clip(value: string | null | undefined, max: number): string | null {
  if (value === null || value === undefined) return null;
  const v = String(value).trim();
  return v === '' ? null : v.slice(0, max);
}

function summary(e: Entry, outcome: FoundSpectrum['outcome']): FoundSpectrum {
  const peaks = e.spectrum.peaks;
  let base: number | null = null;
  let top = -Infinity;
  for (const [mz, i] of peaks) if (i > top) { top = i; base = mz; }
  return {
    index: e.index, page: e.page, title: e.spectrum.title, name: e.name, formula: e.chem.formula ?? e.spectrum.formula,
    peakCount: peaks.length, basePeakMz: base, retentionTime: e.spectrum.retentionTime, dataForm: e.spectrum.dataForm, outcome,
  };
}

/** Merge per-spectrum warnings: said once when every spectrum has it, else with the spectra named. */
function mergeWarnings(entries: Entry[]): ImportWarning[] {
  const byKey = new Map<string, { w: ImportWarning; labels: string[] }>();
  for (const e of entries) {
    for (const w of e.warnings) {
      const key = `${w.code}\u0000${w.message}`;
      const slot = byKey.get(key) ?? { w, labels: [] };
      slot.labels.push(e.label);
      byKey.set(key, slot);
    }
  }
  const out: ImportWarning[] = [];
  for (const { w, labels } of byKey.values()) {
    if (entries.length === 1 || labels.length === entries.length) out.push(w);
    else out.push({ code: w.code, message: `${labels.slice(0, 5).join(', ')}${labels.length > 5 ? ` and ${labels.length - 5} more` : ''}: ${w.message}` });
  }
  return out;
}

export async function importFile(opts: ImportFileOptions): Promise<ImportFileResult> {
  const { fileName, actor, batchId = null, confirmed = false, maxAutoPages = 20, nearDuplicateCosine = 0.98, synthetic = false } = opts;
  const report: FileReport = { file: fileName, status: 'rejected', spectra: [], warnings: [], found: [], fieldsRead: [], pageCount: 0 };
  const reject = (error: string): ImportFileResult => ({ report: { ...report, status: 'rejected', error }, pendingText: null });

  const nameCheck = validateFileName(fileName);
  if (!nameCheck.ok) return reject(nameCheck.error);
  let text: string;
  if (opts.text !== undefined) text = opts.text;
  else if (opts.bytes) text = decodeText(opts.bytes);
  else return reject('the file is empty');
  const read = readJcamp(text, { fileName });
  if (!read.ok) return reject(read.error);
  for (const [k, spectrum] of read.spectra.entries()) {
    const top = spectrum.peaks.reduce((m, [mz]) => (mz > m ? mz : m), 0);
    if (top > MAX_MZ) {
      return reject(`spectrum ${k + 1}${spectrum.page !== null ? ` (page ${spectrum.page})` : ''}: m/z ${top} is beyond ${MAX_MZ}, not a plausible peak`);
    }
  }

  let ordinal = 0;
  const all = read.spectra.map((spectrum, i) => ({ spectrum, index: i + 1, page: spectrum.page !== null ? ++ordinal : null }));
  report.pageCount = ordinal;
  report.fieldsRead = [...new Set(read.spectra.flatMap((s) => s.fieldsRead))];
  const fileWarnings: ImportWarning[] = [...read.warnings];

  const entries: Entry[] = all.map(({ spectrum, index, page }) => {
    const name = clip(spectrum.names[0] ?? null, 255) ?? clip(spectrum.title, 255) ?? fileName.slice(0, 255);
    const label = page !== null ? `page ${page}` : all.length > 1 ? `spectrum ${index} ("${name.slice(0, 40)}")` : name;
    const chem = deriveChemistry({
      formula: spectrum.formula, mw: spectrum.mw, casRegistryNo: spectrum.casRegistryNo, ionizationEnergy: spectrum.ionizationEnergy,
      smiles: (fieldsFromUserLabels(spectrum.userLabels).smiles as string | undefined) ?? null, peaks: spectrum.peaks,
    });
    const warnings = [...chem.warnings];
    if ((spectrum.names[0]?.length ?? 0) > 255) warnings.push({ code: 'name_truncated', message: 'the name is longer than 255 characters and was shortened' });
    const cas = clip(spectrum.casRegistryNo, 20);
    return {
      spectrum, index, page, label, name, synonyms: spectrum.names.slice(1).map((n) => n.trim()).filter(Boolean), cas,
      nameKey: compoundNameKey(name), hash: peakContentHash(spectrum.peaks), chem, warnings,
    };
  });

  // Page selection for NTUPLES runs.
  let selected = entries;
  const pages = opts.pages;
  if (Array.isArray(pages)) {
    if (report.pageCount === 0) {
      fileWarnings.push({ code: 'pages_ignored', message: 'a page selection was given but the file has no NTUPLES pages' });
    } else {
      for (const p of pages) {
        if (!Number.isInteger(p) || p < 1 || p > report.pageCount) return reject(`page ${p} does not exist: the file has ${report.pageCount} pages`);
      }
      if (pages.length === 0) return reject('the page selection is empty');
      selected = entries.filter((e) => e.page === null || pages.includes(e.page));
    }
  } else if (pages !== 'all' && report.pageCount > maxAutoPages) {
    return {
      report: {
        ...report, status: 'needs_selection', warnings: fileWarnings,
        found: entries.map((e) => summary(e, 'pending')),
        error: undefined,
      },
      pendingText: text,
    };
  }
  const selectedSet = new Set(selected);

  const sequelize = getSequelize();
  const m = getModels(sequelize);
  const t = await sequelize.transaction();
  const found: FoundSpectrum[] = [];
  const stored: FileReport['spectra'] = [];
  const samePeaksAs: NonNullable<FileReport['samePeaksAs']> = [];
  let firstDuplicate: { id: number; version: number } | null = null;
  let committed = false;
  try {
    // Serialise stores so that two concurrent imports of one spectrum cannot both be new.
    await sequelize.query('SELECT lastHash FROM audit_head WHERE id = 1 FOR UPDATE', { type: QueryTypes.SELECT, transaction: t });
    const now = new Date();
    for (const e of entries) {
      if (!selectedSet.has(e)) {
        found.push(summary(e, 'skipped'));
        continue;
      }
      const compounds = await findCompounds(e, t);
      const compound = compounds[0] ?? null;
      const compoundIds = new Set(compounds.map((c) => Number(c.id)));
      const sameHash = await sequelize.query<{ recordId: number; version: number; name: string; compoundId: number }>(
        `SELECT v.recordId, v.version, v.name, r.compoundId FROM spectrum_version v JOIN spectrum_record r ON r.id = v.recordId
          WHERE v.contentHash = ? AND v.status <> 'retired' ORDER BY v.recordId, v.version LIMIT 50`,
        { replacements: [e.hash], type: QueryTypes.SELECT, transaction: t },
      );
      const dup = sameHash.find((r) => compoundIds.has(Number(r.compoundId)));
      if (dup) {
        const ref = { id: Number(dup.recordId), version: Number(dup.version) };
        firstDuplicate ??= ref;
        found.push({ ...summary(e, 'duplicate'), duplicateOf: ref });
        continue;
      }
      if (sameHash.length > 0 && !confirmed) {
        for (const r of sameHash) {
          if (!samePeaksAs.some((s) => s.id === Number(r.recordId))) samePeaksAs.push({ id: Number(r.recordId), version: Number(r.version), name: r.name });
        }
        e.warnings.push({
          code: 'same_peaks_other_compound',
          message: `the same peaks are in the library as ${sameHash.slice(0, 3).map((r) => `"${r.name}" (record ${r.recordId})`).join(', ')}: probably a mislabelled file; confirm to store it anyway`,
        });
        found.push(summary(e, 'other_compound'));
        continue;
      }
      if (sameHash.length > 0) {
        e.warnings.push({ code: 'same_peaks_other_compound', message: `stored after confirmation although the same peaks are in record ${sameHash[0].recordId} ("${sameHash[0].name}")` });
      }
      if (compound) {
        const near = await nearDuplicate(Number(compound.id), e.spectrum.peaks, nearDuplicateCosine, t);
        if (near) {
          e.warnings.push({ code: 'near_duplicate', message: `cosine ${near.cosine.toFixed(4)} to record ${near.recordId} version ${near.version} of the same compound (a replicate?)` });
        }
      }
      const compoundId = compound ? Number(compound.id) : Number((await m.Compound.create({
        name: e.name, nameKey: e.nameKey, formula: e.chem.formula, casRegistryNo: e.cas, createdAt: now, updatedAt: now,
      }, { transaction: t })).get('id'));
      const record = await m.SpectrumRecord.create({
        compoundId, latestVersion: 1, releasedVersion: null, synthetic: synthetic || Object.keys(e.spectrum.userLabels).some((k) => k.trim().toUpperCase() === 'SYNTHETIC'), createdBy: actor.id, createdAt: now, updatedAt: now,
      }, { transaction: t });
      const recordId = Number(record.get('id'));
      const s = e.spectrum;
      const peaks = s.peaks;
      let baseMz: number | null = null;
      let top = -Infinity;
      for (const [mz, i] of peaks) if (i > top) { top = i; baseMz = mz; }
      const userLabels = s.userLabels;
      const labelled = fieldsFromUserLabels(userLabels);
      // our own export marks demo records; keep the mark on the way back in
      const isSynthetic = synthetic || Object.keys(userLabels).some((k) => k.trim().toUpperCase() === 'SYNTHETIC');
      const version = await m.SpectrumVersion.create({
        recordId, version: 1, status: 'draft',
        name: e.name, synonyms: e.synonyms, formula: e.chem.formula, nominalMass: e.chem.nominalMass,
        monoisotopicMass: e.chem.monoisotopicMass, averageMass: e.chem.averageMass, ihd: e.chem.ihd, elements: e.chem.elements,
        ...labelled, casRegistryNo: e.cas,
        ionizationMode: clip(s.ionizationMode, 40), ionizationEnergy: s.ionizationEnergy, instrument: clip(s.spectrometer, 255),
        origin: clip(s.origin, 255), owner: clip(s.owner, 255), retentionTime: s.retentionTime,
        metadata: {
          title: s.title, statedFormula: s.formula, statedMw: s.mw, retentionIndex: s.retentionIndex, dataForm: s.dataForm,
          page: e.page, userLabels, fieldsRead: s.fieldsRead, importWarnings: e.warnings,
        },
        peaks: encodePeaks(peaks), peakCount: peaks.length, basePeakMz: baseMz, contentHash: e.hash,
        sourceText: entries.length === 1 && text.length <= MAX_SOURCE_TEXT ? text : null,
        sourceFileName: fileName.slice(0, 255), importBatchId: batchId, synthetic: isSynthetic,
        createdBy: actor.id, editors: actor.id ? [actor.id] : [], createdAt: now, updatedAt: now,
      }, { transaction: t });
      const versionId = Number(version.get('id'));
      if (s.retentionIndex !== null && Number.isFinite(s.retentionIndex)) {
        await m.RetentionIndex.create({ spectrumVersionId: versionId, phase: 'unspecified', value: s.retentionIndex, ladder: null, column: null }, { transaction: t });
      }
      await appendAudit({
        actorId: actor.id, actorEmail: actor.email, action: 'spectrum.import', targetType: 'spectrum_version', targetId: versionId,
        recordId, version: 1,
        details: {
          file: fileName, batchId, page: e.page, confirmed: sameHash.length > 0,
          after: { status: 'draft', name: e.name, formula: e.chem.formula, casRegistryNo: e.cas, contentHash: e.hash, peakCount: peaks.length },
        },
      }, t);
      stored.push({ id: recordId, version: 1, name: e.name, page: e.page });
      found.push(summary(e, 'stored'));
    }

    const warnings = [...fileWarnings, ...mergeWarnings(selected)];
    if (samePeaksAs.length > 0) {
      await t.rollback();
      committed = true;
      return {
        report: {
          ...report, status: 'needs_confirmation', warnings, samePeaksAs,
          found: found.map((f) => (f.outcome === 'stored' ? { ...f, outcome: 'pending' as const } : f)),
        },
        pendingText: text,
      };
    }
    if (stored.length === 0) {
      await t.rollback();
      committed = true;
      return {
        report: { ...report, status: 'duplicate', warnings, found, duplicateOf: firstDuplicate?.id, duplicateVersion: firstDuplicate?.version },
        pendingText: null,
      };
    }
    if (firstDuplicate) {
      warnings.push({ code: 'duplicate_spectrum', message: `${found.filter((f) => f.outcome === 'duplicate').length} spectrum(s) of this file are already in the library and were not stored again` });
    }
    await bumpLibraryVersion(t);
    await t.commit();
    committed = true;
    return { report: { ...report, status: 'imported', spectra: stored, warnings, found, duplicateOf: firstDuplicate?.id, duplicateVersion: firstDuplicate?.version }, pendingText: null };
  } catch (e) {
    if (!committed) await t.rollback().catch(() => {});
    if (isDatabaseDown(e)) throw e;
    return reject(`the file could not be stored: ${(e as Error).message}`);
  }
}

/** Compounds with the same Hill formula and the same name or registry number; the name match first. */
async function findCompounds(e: Entry, t: Transaction): Promise<{ id: number }[]> {
  const sequelize = getSequelize();
  return sequelize.query<{ id: number }>(
    `SELECT id FROM compound WHERE formula <=> ? AND (nameKey = ?${e.cas ? ' OR casRegistryNo = ?' : ''}) ORDER BY nameKey = ? DESC, id LIMIT 20`,
    { replacements: e.cas ? [e.chem.formula, e.nameKey, e.cas, e.nameKey] : [e.chem.formula, e.nameKey, e.nameKey], type: QueryTypes.SELECT, transaction: t },
  );
}

async function nearDuplicate(compoundId: number, peaks: [number, number][], threshold: number, t: Transaction) {
  const rows = await getSequelize().query<{ recordId: number; version: number; peaks: Buffer }>(
    `SELECT v.recordId, v.version, v.peaks FROM spectrum_version v JOIN spectrum_record r ON r.id = v.recordId
      WHERE r.compoundId = ? AND v.status IN ('draft','in_review','released') AND (v.version = r.latestVersion OR v.version = r.releasedVersion)
      LIMIT 500`,
    { replacements: [compoundId], type: QueryTypes.SELECT, transaction: t },
  );
  let best: { recordId: number; version: number; cosine: number } | null = null;
  for (const r of rows) {
    const c = unitCosine(peaks, decodePeaks(r.peaks));
    if (c > threshold && (!best || c > best.cosine)) best = { recordId: Number(r.recordId), version: Number(r.version), cosine: c };
  }
  return best;
}
