// The versioning and review workflow of records (API.md "Records and
// versions"): edits, submit, approve (an electronic signature, four-eyes),
// return with a comment, retire. Every change is audited in the same
// transaction, with the changed fields before and after.
import crypto from 'node:crypto';
import { QueryTypes, type Transaction } from 'sequelize';
import { getSequelize } from '../db/sequelize';
import { getModels } from '../db/index';
import { appendAudit, canonicalJson } from '../audit';
import { bumpLibraryVersion } from '../library-state';
import { HttpError } from '../http';
import { can } from '../roles';
import { verifySignature } from '../signature';
import { casCheckDigitValid } from '../spectra/casCheckDigitValid';
import { decodePeaks } from '../spectra/decodePeaks';
import { deriveChemistry } from './chemistry';
import { compoundNameKey } from './compoundKey';
import { EDIT_FIELDS, type EditField, type PatchInput } from './editSchema';
import { setRecordTags } from './tags';
import { CONTENT_FIELDS, jsonValue, sameValue } from './versionRow';
import type { Actor, ImportWarning } from './types';

export const APPROVAL_MEANING = 'reviewed and approved for release';

type Row = Record<string, any>;

async function lockRecord(recordId: number, t: Transaction): Promise<Row> {
  const [record] = await getSequelize().query<Row>('SELECT * FROM spectrum_record WHERE id = ? FOR UPDATE', {
    replacements: [recordId], type: QueryTypes.SELECT, transaction: t,
  });
  if (!record) throw new HttpError(404, 'not_found', `There is no record ${recordId}`);
  return record;
}

async function versionRow(recordId: number, version: number, t: Transaction): Promise<Row> {
  const [v] = await getSequelize().query<Row>('SELECT * FROM spectrum_version WHERE recordId = ? AND version = ? FOR UPDATE', {
    replacements: [recordId, version], type: QueryTypes.SELECT, transaction: t,
  });
  if (!v) throw new HttpError(404, 'not_found', `Record ${recordId} has no version ${version}`);
  return v;
}

async function retentionIndicesOf(versionId: number, t?: Transaction) {
  const rows = await getSequelize().query<Row>('SELECT phase, value, ladder, `column` FROM retention_index WHERE spectrumVersionId = ? ORDER BY id', {
    replacements: [versionId], type: QueryTypes.SELECT, transaction: t,
  });
  return rows.map((r) => ({ phase: String(r.phase), value: Number(r.value), ladder: r.ladder ?? null, column: r.column ?? null }));
}

function fieldError(field: string, message: string): HttpError {
  return new HttpError(400, 'invalid_input', `${field}: ${message}`, [{ field, message }]);
}

/** Checks that need more than the schema: the formula parses, the registry number's check digit, the structure reads. */
function validateEdit(next: Record<string, any>, peaks: [number, number][]) {
  const errors: { field: string; message: string }[] = [];
  const chem = deriveChemistry({
    formula: next.formula, casRegistryNo: next.casRegistryNo, smiles: next.smiles, molfile: next.molfile,
    ionizationEnergy: next.ionizationEnergy, peaks,
  });
  if (chem.formulaError) errors.push({ field: 'formula', message: chem.formulaError });
  if (next.casRegistryNo && !casCheckDigitValid(next.casRegistryNo)) {
    errors.push({ field: 'casRegistryNo', message: 'not a registry number with a valid check digit (NNNNNNN-NN-N)' });
  }
  if (chem.structureError) errors.push({ field: next.molfile ? 'molfile' : 'smiles', message: chem.structureError });
  if (next.massRangeMin !== null && next.massRangeMax !== null && next.massRangeMin !== undefined && next.massRangeMax !== undefined && next.massRangeMin >= next.massRangeMax) {
    errors.push({ field: 'massRangeMax', message: 'the highest m/z must be above the lowest' });
  }
  if (errors.length > 0) throw new HttpError(400, 'invalid_input', `${errors[0].field}: ${errors[0].message}`, errors);
  return chem;
}

export interface EditResult {
  id: number;
  version: number;
  status: string;
  /** true when this edit created a new version */
  createdVersion: boolean;
  changed: string[];
  tags: string[];
  warnings: ImportWarning[];
}

/**
 * PATCH a record: metadata edits go to the newest version when it is a draft;
 * on a released record they need a reason and create version n+1 as a draft
 * (version n stays released until n+1 is approved). Tags belong to the record
 * and change without a new version.
 */
export async function editRecord(recordId: number, input: PatchInput, actor: Actor): Promise<EditResult> {
  const sequelize = getSequelize();
  const m = getModels(sequelize);
  const fields = EDIT_FIELDS.filter((f) => input[f] !== undefined);
  if (fields.length === 0 && input.tags === undefined) throw new HttpError(400, 'invalid_input', 'Nothing to change: send at least one field or tags');
  let bump = false;
  const result = await sequelize.transaction(async (t) => {
    const record = await lockRecord(recordId, t);
    const latest = await versionRow(recordId, Number(record.latestVersion), t);
    if (input.baseVersion !== undefined && input.baseVersion !== Number(latest.version)) {
      throw new HttpError(409, 'stale_version', `Record ${recordId} has a newer version (${latest.version}) than the one edited (${input.baseVersion}); reload it`);
    }
    let target = latest;
    let createdVersion = false;
    const changed: string[] = [];
    let warnings: ImportWarning[] = [];
    if (fields.length > 0) {
      const status = String(latest.status);
      if (status === 'in_review') throw new HttpError(409, 'wrong_state', `Version ${latest.version} is in review; it can be edited after it is returned`);
      if (status === 'retired' || status === 'superseded') throw new HttpError(409, 'wrong_state', `Record ${recordId} is ${status} and cannot be edited`);
      const released = status === 'released';
      if (released && !input.reason) {
        throw new HttpError(400, 'reason_required', 'A released record is changed only with a reason for the change (it creates a new draft version)', [{ field: 'reason', message: 'say why this released record changes' }]);
      }
      const beforeRi = await retentionIndicesOf(Number(latest.id), t);
      const before: Record<string, any> = { retentionIndices: beforeRi };
      for (const f of EDIT_FIELDS) if (f !== 'retentionIndices') before[f] = f === 'synonyms' ? jsonValue(latest[f], []) : latest[f] ?? null;
      const next: Record<string, any> = { ...before };
      for (const f of fields) next[f] = input[f] ?? (f === 'synonyms' || f === 'retentionIndices' ? [] : null);
      for (const f of fields) if (!sameValue(before[f], next[f])) changed.push(f);
      const chem = validateEdit(next, decodePeaks(latest.peaks as Buffer));
      warnings = chem.warnings.filter((w) => w.code !== 'formula_missing');
      const derived = {
        formula: chem.formula, nominalMass: chem.nominalMass, monoisotopicMass: chem.monoisotopicMass, averageMass: chem.averageMass,
        ihd: chem.ihd, elements: chem.elements,
      };
      const derivedBefore = { formula: latest.formula ?? null, nominalMass: latest.nominalMass ?? null, monoisotopicMass: latest.monoisotopicMass ?? null, averageMass: latest.averageMass ?? null, ihd: latest.ihd ?? null, elements: latest.elements ?? null };
      if (changed.length > 0) {
        const now = new Date();
        const editors = [...new Set([...jsonValue<string[]>(latest.editors, []), ...(actor.id ? [actor.id] : [])])];
        const values: Record<string, any> = {};
        for (const f of changed) if (f !== 'retentionIndices') values[f] = next[f];
        Object.assign(values, derived);
        const beforeChanged: Record<string, unknown> = {};
        const afterChanged: Record<string, unknown> = {};
        for (const f of changed) { beforeChanged[f] = before[f]; afterChanged[f] = next[f]; }
        for (const k of Object.keys(derived) as (keyof typeof derived)[]) {
          if (!sameValue(derivedBefore[k], derived[k]) && !(k in afterChanged)) { beforeChanged[k] = derivedBefore[k]; afterChanged[k] = derived[k]; }
        }
        let versionId: number;
        if (released) {
          const n = Number(latest.version) + 1;
          const copy: Record<string, any> = {};
          for (const f of CONTENT_FIELDS) copy[f] = f === 'synonyms' || f === 'metadata' ? jsonValue(latest[f], f === 'synonyms' ? [] : {}) : latest[f];
          const created = await m.SpectrumVersion.create({
            ...copy, ...values, recordId, version: n, status: 'draft', peaks: latest.peaks, sourceText: latest.sourceText,
            importBatchId: latest.importBatchId, createdBy: actor.id, editors: actor.id ? [actor.id] : [], changeReason: input.reason ?? null,
            createdAt: now, updatedAt: now,
          }, { transaction: t });
          versionId = Number(created.get('id'));
          const ri = changed.includes('retentionIndices') ? next.retentionIndices : beforeRi;
          if (ri.length) await m.RetentionIndex.bulkCreate(ri.map((r: any) => ({ ...r, ladder: r.ladder ?? null, column: r.column ?? null, spectrumVersionId: versionId })), { transaction: t });
          await m.SpectrumRecord.update({ latestVersion: n, updatedAt: now }, { where: { id: recordId }, transaction: t });
          target = { ...latest, id: versionId, version: n, status: 'draft' };
          createdVersion = true;
        } else {
          versionId = Number(latest.id);
          await m.SpectrumVersion.update({ ...values, editors, changeReason: input.reason ?? latest.changeReason ?? null, updatedAt: now }, { where: { id: versionId }, transaction: t });
          if (changed.includes('retentionIndices')) {
            await m.RetentionIndex.destroy({ where: { spectrumVersionId: versionId }, transaction: t });
            if (next.retentionIndices.length) await m.RetentionIndex.bulkCreate(next.retentionIndices.map((r: any) => ({ ...r, ladder: r.ladder ?? null, column: r.column ?? null, spectrumVersionId: versionId })), { transaction: t });
          }
          await m.SpectrumRecord.update({ updatedAt: now }, { where: { id: recordId }, transaction: t });
        }
        // The record's compound follows the identity its newest version states.
        if (changed.some((f) => f === 'name' || f === 'formula' || f === 'casRegistryNo')) {
          await repointCompound(recordId, String(next.name), chem.formula, next.casRegistryNo ?? null, t);
        }
        await appendAudit({
          actorId: actor.id, actorEmail: actor.email, action: createdVersion ? 'spectrum.new_version' : 'spectrum.edit',
          targetType: 'spectrum_version', targetId: versionId, recordId, version: Number(target.version), reason: input.reason ?? null,
          details: { fields: Object.keys(afterChanged), before: beforeChanged, after: afterChanged, ...(createdVersion ? { from: Number(latest.version) } : {}) },
        }, t);
        bump = true;
      }
    }
    let tags: string[] = [];
    if (input.tags !== undefined) {
      const r = await setRecordTags(recordId, input.tags, actor, t, input.reason ?? null);
      tags = r.tags;
      if (r.changed && record.releasedVersion !== null) bump = true;
      if (r.changed) changed.push('tags');
    }
    if (bump) await bumpLibraryVersion(t);
    return { id: recordId, version: Number(target.version), status: String(target.status), createdVersion, changed, tags, warnings };
  });
  return result;
}

async function repointCompound(recordId: number, name: string, formula: string | null, cas: string | null, t: Transaction) {
  const sequelize = getSequelize();
  const m = getModels(sequelize);
  const nameKey = compoundNameKey(name);
  const [found] = await sequelize.query<{ id: number }>(
    `SELECT id FROM compound WHERE formula <=> ? AND (nameKey = ?${cas ? ' OR casRegistryNo = ?' : ''}) ORDER BY id LIMIT 1`,
    { replacements: cas ? [formula, nameKey, cas] : [formula, nameKey], type: QueryTypes.SELECT, transaction: t },
  );
  const now = new Date();
  const compoundId = found
    ? Number(found.id)
    : Number((await m.Compound.create({ name, nameKey, formula, casRegistryNo: cas, createdAt: now, updatedAt: now }, { transaction: t })).get('id'));
  await m.SpectrumRecord.update({ compoundId, updatedAt: now }, { where: { id: recordId }, transaction: t });
}

/** Digest of what an approver signs: the version's content, peaks included. */
export function versionDigest(v: Row): string {
  const content: Record<string, unknown> = { recordId: Number(v.recordId), version: Number(v.version) };
  for (const f of CONTENT_FIELDS) content[f] = f === 'synonyms' || f === 'metadata' ? jsonValue(v[f], f === 'synonyms' ? [] : {}) : v[f] ?? null;
  return crypto.createHash('sha256').update(canonicalJson(content)).digest('hex');
}

export interface ReviewInput {
  action: 'submit' | 'approve' | 'return' | 'retire';
  comment?: string;
  reason?: string;
  password?: string;
  /** the version the reviewer looked at; another one answers 409 */
  version?: number;
}

export interface ReviewResult {
  id: number;
  version: number;
  status: string;
  releasedVersion: number | null;
  supersededVersion?: number;
  signature?: { id: number | null; signerName: string; meaning: string; signedAt: string };
}

/** Whether this person edited, created or submitted the version (and so may not approve it). */
export function touchedVersion(v: Row, actorId: string | null): boolean {
  if (!actorId) return false;
  const editors = jsonValue<string[]>(v.editors, []);
  return editors.includes(actorId) || v.createdBy === actorId || v.submittedBy === actorId;
}

export async function reviewRecord(recordId: number, input: ReviewInput, actor: Actor): Promise<ReviewResult> {
  const sequelize = getSequelize();
  const m = getModels(sequelize);
  if ((input.action === 'approve' || input.action === 'return') && !can(actor.roles, 'approve')) {
    throw new HttpError(403, 'forbidden', `Your roles (${actor.roles.join(', ') || 'none'}) do not allow this (needs "approve")`);
  }
  return sequelize.transaction(async (t) => {
    const record = await lockRecord(recordId, t);
    const latest = await versionRow(recordId, Number(record.latestVersion), t);
    const n = Number(latest.version);
    if (input.version !== undefined && input.version !== n && input.action !== 'retire') {
      throw new HttpError(409, 'stale_version', `Record ${recordId} is at version ${n}, not ${input.version}; reload it`);
    }
    const now = new Date();
    const audit = (action: string, version: number, versionId: number, details: unknown, reason: string | null = null) =>
      appendAudit({ actorId: actor.id, actorEmail: actor.email, action, targetType: 'spectrum_version', targetId: versionId, recordId, version, reason, details }, t);

    switch (input.action) {
      case 'submit': {
        if (latest.status !== 'draft') throw new HttpError(409, 'wrong_state', `Version ${n} is ${latest.status}; only a draft can be submitted`);
        await m.SpectrumVersion.update({ status: 'in_review', submittedBy: actor.id, submittedAt: now, updatedAt: now }, { where: { id: latest.id }, transaction: t });
        await m.SpectrumRecord.update({ updatedAt: now }, { where: { id: recordId }, transaction: t });
        await audit('spectrum.submit', n, Number(latest.id), { before: { status: 'draft' }, after: { status: 'in_review' } }, input.comment ?? null);
        await bumpLibraryVersion(t);
        return { id: recordId, version: n, status: 'in_review', releasedVersion: record.releasedVersion === null ? null : Number(record.releasedVersion) };
      }
      case 'return': {
        if (latest.status !== 'in_review') throw new HttpError(409, 'wrong_state', `Version ${n} is ${latest.status}; only a version in review can be returned`);
        if (!input.comment?.trim()) throw new HttpError(400, 'comment_required', 'Say what needs to change (comment)', [{ field: 'comment', message: 'a comment is required' }]);
        await m.SpectrumVersion.update({ status: 'draft', submittedBy: null, submittedAt: null, updatedAt: now }, { where: { id: latest.id }, transaction: t });
        await m.SpectrumRecord.update({ updatedAt: now }, { where: { id: recordId }, transaction: t });
        await audit('spectrum.return', n, Number(latest.id), { before: { status: 'in_review', submittedBy: latest.submittedBy }, after: { status: 'draft', submittedBy: null }, comment: input.comment.trim() }, input.comment.trim());
        await bumpLibraryVersion(t);
        return { id: recordId, version: n, status: 'draft', releasedVersion: record.releasedVersion === null ? null : Number(record.releasedVersion) };
      }
      case 'approve': {
        if (latest.status !== 'in_review') throw new HttpError(409, 'wrong_state', `Version ${n} is ${latest.status}; only a version in review can be approved`);
        if (!actor.id || touchedVersion(latest, actor.id)) {
          throw new HttpError(403, 'four_eyes', 'You edited or submitted this version: another curator must approve it');
        }
        if (!input.password) {
          throw new HttpError(400, 'password_required', 'Approval is an electronic signature: re-enter your password', [{ field: 'password', message: 'enter your password to sign' }]);
        }
        const signature = await verifySignature({
          userId: actor.id, password: input.password, meaning: APPROVAL_MEANING, subjectType: 'spectrum_version',
          subjectId: Number(latest.id), contentDigest: versionDigest(latest),
        }, t);
        let supersededVersion: number | undefined;
        const prev = record.releasedVersion === null ? null : Number(record.releasedVersion);
        if (prev !== null && prev !== n) {
          const old = await versionRow(recordId, prev, t);
          await m.SpectrumVersion.update({ status: 'superseded', updatedAt: now }, { where: { id: old.id }, transaction: t });
          await audit('spectrum.supersede', prev, Number(old.id), { before: { status: 'released' }, after: { status: 'superseded' }, supersededBy: n });
          supersededVersion = prev;
        }
        await m.SpectrumVersion.update({ status: 'released', approvedBy: actor.id, approvedAt: now, updatedAt: now }, { where: { id: latest.id }, transaction: t });
        await m.SpectrumRecord.update({ releasedVersion: n, updatedAt: now }, { where: { id: recordId }, transaction: t });
        const sig = signatureInfo(signature, actor, now);
        await audit('spectrum.approve', n, Number(latest.id), {
          before: { status: 'in_review', approvedBy: null }, after: { status: 'released', approvedBy: actor.id },
          signature: { id: sig.id, signer: sig.signerName, meaning: APPROVAL_MEANING, signedAt: sig.signedAt }, comment: input.comment ?? null,
        }, input.comment ?? null);
        await bumpLibraryVersion(t);
        return { id: recordId, version: n, status: 'released', releasedVersion: n, supersededVersion, signature: sig };
      }
      case 'retire': {
        const reason = input.reason?.trim() || input.comment?.trim();
        if (!reason) throw new HttpError(400, 'reason_required', 'Say why the record is retired (reason)', [{ field: 'reason', message: 'a reason is required' }]);
        const open = await sequelize.query<Row>(
          "SELECT id, version, status FROM spectrum_version WHERE recordId = ? AND status IN ('draft','in_review','released') ORDER BY version FOR UPDATE",
          { replacements: [recordId], type: QueryTypes.SELECT, transaction: t },
        );
        if (open.length === 0) throw new HttpError(409, 'wrong_state', `Record ${recordId} has nothing to retire`);
        for (const v of open) {
          await m.SpectrumVersion.update({ status: 'retired', retiredAt: now, updatedAt: now }, { where: { id: v.id }, transaction: t });
          await audit('spectrum.retire', Number(v.version), Number(v.id), { before: { status: v.status }, after: { status: 'retired' } }, reason);
        }
        await m.SpectrumRecord.update({ releasedVersion: null, updatedAt: now }, { where: { id: recordId }, transaction: t });
        await bumpLibraryVersion(t);
        return { id: recordId, version: Number(open.at(-1)!.version), status: 'retired', releasedVersion: null };
      }
      default:
        throw new HttpError(400, 'invalid_input', `Unknown action ${(input as { action: string }).action}`);
    }
  });
}

function signatureInfo(signature: unknown, actor: Actor, at: Date) {
  const s = (signature ?? {}) as Record<string, any>;
  return {
    id: s.id !== undefined && s.id !== null ? Number(s.id) : null,
    signerName: String(s.signerName ?? actor.name),
    meaning: APPROVAL_MEANING,
    signedAt: new Date(s.signedAt ?? at).toISOString(),
  };
}
