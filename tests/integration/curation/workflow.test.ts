// Versions and the review workflow: edits, submit, four-eyes approval as an
// electronic signature, return, retire, tags, the audit chain, and export
// then import giving a duplicate.
import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import { QueryTypes } from 'sequelize';
import { useTestDatabase } from '../../helpers/db';
import { closeSequelize } from '../../../src/lib/db/sequelize';
import { verifyAuditChain } from '../../../src/lib/audit';
import { readLibraryVersion } from '../../../src/lib/library-state';
import {
  importFile, editRecord, reviewRecord, exportRecordJcamp, reviewQueue, createTag, updateTag, mergeTag, assignTags, listTags,
  APPROVAL_MEANING, type Actor,
} from '../../../src/lib/curation';
import { jsonValue } from '../../../src/lib/curation/versionRow';
import { readJcamp } from '../../../src/lib/spectra/readJcamp';
import { RUN, PASSWORD, createUser, libraryCounts, peakTableFile, storedPeaks, expectPeaksEqual, rng, randomPeaks, fixture, IMPORT_FIXTURES } from './helpers';

const sequelize = useTestDatabase();
afterAll(() => closeSequelize());

let a: Actor; // imports and edits
let b: Actor; // second curator
let c: Actor; // third curator
let analyst: Actor;
const next = rng(777);

beforeAll(async () => {
  a = await createUser(sequelize, 'curator-a', ['curator']);
  b = await createUser(sequelize, 'curator-b', ['curator']);
  c = await createUser(sequelize, 'curator-c', ['curator']);
  analyst = await createUser(sequelize, 'analyst', ['analyst']);
});

async function freshRecord(label: string, actor = a): Promise<number> {
  const r = await importFile({
    fileName: `${label}.jdx`, actor,
    bytes: Buffer.from(peakTableFile({ title: `${label} ${RUN}`, formula: 'C6H6', cas: '71-43-2', peaks: [[39, 100 + Math.floor(next() * 800)], [51, 180], [52, 190], [77, 250], [78, 999], [79, 66]] })),
  });
  expect(r.report.status).toBe('imported');
  return r.report.spectra[0].id;
}

async function versions(recordId: number) {
  return sequelize.query<any>('SELECT version, status, name, editors, submittedBy, approvedBy, changeReason FROM spectrum_version WHERE recordId = ? ORDER BY version', {
    replacements: [recordId], type: QueryTypes.SELECT,
  });
}

async function record(recordId: number) {
  const [r] = await sequelize.query<any>('SELECT * FROM spectrum_record WHERE id = ?', { replacements: [recordId], type: QueryTypes.SELECT });
  return r;
}

describe('versions and review', () => {
  it('draft -> in_review -> released; an edit of a released record makes n+1 a draft; approving n+1 supersedes n', async () => {
    const id = await freshRecord('Versioned');
    // a draft is edited in place, no reason needed
    const e1 = await editRecord(id, { notes: 'first note', referenceLot: 'LOT-1' }, a);
    expect(e1).toMatchObject({ version: 1, createdVersion: false, status: 'draft' });
    expect(e1.changed.sort()).toEqual(['notes', 'referenceLot']);
    expect((await versions(id))).toHaveLength(1);

    const s1 = await reviewRecord(id, { action: 'submit' }, a);
    expect(s1.status).toBe('in_review');
    await expect(editRecord(id, { notes: 'while in review' }, a)).rejects.toMatchObject({ status: 409, code: 'wrong_state' });
    await expect(reviewRecord(id, { action: 'submit' }, a)).rejects.toMatchObject({ status: 409 });

    // four-eyes: the importer, editor and submitter may not approve
    await expect(reviewRecord(id, { action: 'approve', password: PASSWORD }, a)).rejects.toMatchObject({ status: 403, code: 'four_eyes' });
    // approval is a signature: without the password it is refused, a wrong one is refused, nothing changes
    await expect(reviewRecord(id, { action: 'approve' }, b)).rejects.toMatchObject({ status: 400, code: 'password_required' });
    await expect(reviewRecord(id, { action: 'approve', password: 'not-the-password' }, b)).rejects.toMatchObject({ status: 403, code: 'signature_failed' });
    expect((await versions(id))[0].status).toBe('in_review');
    // an analyst cannot approve at all
    await expect(reviewRecord(id, { action: 'approve', password: PASSWORD }, analyst)).rejects.toMatchObject({ status: 403 });

    const libBefore = await readLibraryVersion();
    const ap = await reviewRecord(id, { action: 'approve', password: PASSWORD }, b);
    expect(ap).toMatchObject({ status: 'released', version: 1, releasedVersion: 1 });
    expect(ap.signature?.signerName).toBe(b.name);
    expect(await readLibraryVersion()).toBeGreaterThan(libBefore);
    const sigs = await sequelize.query<any>("SELECT * FROM signature WHERE subjectType = 'spectrum_version' AND signerId = ?", { replacements: [b.id], type: QueryTypes.SELECT });
    expect(sigs).toHaveLength(1);
    expect(sigs[0].meaning).toBe(APPROVAL_MEANING);
    expect(sigs[0].contentDigest).toMatch(/^[0-9a-f]{64}$/);
    expect((await record(id)).releasedVersion).toBe(1);

    // a released record changes only with a reason, into a new draft version
    await expect(editRecord(id, { name: `Benzene renamed ${RUN}` }, b)).rejects.toMatchObject({ status: 400, code: 'reason_required' });
    const e2 = await editRecord(id, { name: `Benzene renamed ${RUN}`, ionizationEnergy: 70, reason: 'name as on the certificate' }, b);
    expect(e2).toMatchObject({ version: 2, createdVersion: true, status: 'draft' });
    let vs = await versions(id);
    expect(vs.map((v) => [v.version, v.status])).toEqual([[1, 'released'], [2, 'draft']]);
    expect(vs[1].changeReason).toBe('name as on the certificate');
    expect((await record(id)).releasedVersion).toBe(1);
    // peaks and retention indices travel to the new version
    expectPeaksEqual(await storedPeaks(sequelize, id, 2), await storedPeaks(sequelize, id, 1));

    await reviewRecord(id, { action: 'submit' }, b);
    await expect(reviewRecord(id, { action: 'approve', password: PASSWORD }, b)).rejects.toMatchObject({ status: 403, code: 'four_eyes' });
    // a edited version 1 but not version 2: a may approve version 2
    const queue = await reviewQueue(a);
    const item = queue.find((q) => q.recordId === id)!;
    expect(item.canApprove).toBe(true);
    expect(item.diff.map((d) => d.field)).toContain('name');
    expect(item.diff.find((d) => d.field === 'name')).toMatchObject({ before: `Versioned ${RUN}`, after: `Benzene renamed ${RUN}` });
    expect((await reviewQueue(b)).find((q) => q.recordId === id)).toMatchObject({ canApprove: false, blockedBecause: 'you edited or submitted this version' });

    const ap2 = await reviewRecord(id, { action: 'approve', password: PASSWORD }, a);
    expect(ap2).toMatchObject({ status: 'released', version: 2, supersededVersion: 1 });
    vs = await versions(id);
    expect(vs.map((v) => [v.version, v.status])).toEqual([[1, 'superseded'], [2, 'released']]);
    expect((await record(id)).releasedVersion).toBe(2);
  });

  it('an editor who did not submit still may not approve', async () => {
    const id = await freshRecord('Edited by c', a);
    await editRecord(id, { method: 'EI scan 35-400' }, c);
    await reviewRecord(id, { action: 'submit' }, a);
    await expect(reviewRecord(id, { action: 'approve', password: PASSWORD }, c)).rejects.toMatchObject({ status: 403, code: 'four_eyes' });
    await expect(reviewRecord(id, { action: 'approve', password: PASSWORD }, a)).rejects.toMatchObject({ status: 403, code: 'four_eyes' });
    expect((await reviewRecord(id, { action: 'approve', password: PASSWORD }, b)).status).toBe('released');
  });

  it('return needs a comment and sends the version back to draft; retire needs a reason', async () => {
    const id = await freshRecord('Returned');
    await reviewRecord(id, { action: 'submit' }, a);
    await expect(reviewRecord(id, { action: 'return' }, b)).rejects.toMatchObject({ status: 400, code: 'comment_required' });
    const r = await reviewRecord(id, { action: 'return', comment: 'registry number missing' }, b);
    expect(r.status).toBe('draft');
    const [ev] = await sequelize.query<any>("SELECT reason FROM audit_event WHERE recordId = ? AND action = 'spectrum.return'", { replacements: [id], type: QueryTypes.SELECT });
    expect(ev.reason).toBe('registry number missing');
    await editRecord(id, { casRegistryNo: '71-43-2' }, a);
    await reviewRecord(id, { action: 'submit' }, a);
    await reviewRecord(id, { action: 'approve', password: PASSWORD }, b);
    await expect(reviewRecord(id, { action: 'retire' }, a)).rejects.toMatchObject({ status: 400, code: 'reason_required' });
    const ret = await reviewRecord(id, { action: 'retire', reason: 'standard found contaminated' }, a);
    expect(ret.status).toBe('retired');
    expect((await versions(id)).map((v) => v.status)).toEqual(['retired']);
    expect((await record(id)).releasedVersion).toBeNull();
    await expect(editRecord(id, { notes: 'x' }, a)).rejects.toMatchObject({ status: 409 });
  });

  it('edits are validated field by field', async () => {
    const id = await freshRecord('Validated');
    await expect(editRecord(id, { formula: 'C6H6Qq' }, a)).rejects.toMatchObject({ status: 400, details: [{ field: 'formula' }] });
    await expect(editRecord(id, { casRegistryNo: '71-43-3' }, a)).rejects.toMatchObject({ status: 400, details: [{ field: 'casRegistryNo' }] });
    await expect(editRecord(id, { smiles: 'C1CC(' }, a)).rejects.toMatchObject({ status: 400, details: [{ field: 'smiles' }] });
    await expect(editRecord(id, { massRangeMin: 400, massRangeMax: 35 }, a)).rejects.toMatchObject({ status: 400, details: [{ field: 'massRangeMax' }] });
    await expect(editRecord(id, { notes: 'x', baseVersion: 7 }, a)).rejects.toMatchObject({ status: 409, code: 'stale_version' });
    const ok = await editRecord(id, {
      formula: 'C6H6', smiles: 'c1ccccc1', retentionIndices: [{ phase: 'non-polar', value: 657, ladder: 'C6-C12 n-alkanes' }, { phase: 'polar', value: 940 }],
      derivative: null, saltForm: null, analyzerType: 'quadrupole', sourceTemperature: 230, massRangeMin: 35, massRangeMax: 400,
    }, a);
    expect(ok.warnings.map((w) => w.code)).not.toContain('structure_formula_mismatch');
    const mismatch = await editRecord(id, { smiles: 'CCO' }, a);
    expect(mismatch.warnings.map((w) => w.code)).toContain('structure_formula_mismatch');
    const ris = await sequelize.query<any>('SELECT r.phase, r.value, r.ladder FROM retention_index r JOIN spectrum_version v ON v.id = r.spectrumVersionId WHERE v.recordId = ? ORDER BY r.id', { replacements: [id], type: QueryTypes.SELECT });
    expect(ris).toEqual([{ phase: 'non-polar', value: 657, ladder: 'C6-C12 n-alkanes' }, { phase: 'polar', value: 940, ladder: null }]);
  });

  it('every change is audited with before and after, and the chain stays intact', async () => {
    const id = await freshRecord('Audited');
    await editRecord(id, { notes: 'before approval' }, a);
    await reviewRecord(id, { action: 'submit' }, a);
    await reviewRecord(id, { action: 'approve', password: PASSWORD }, b);
    await editRecord(id, { notes: 'after approval', reason: 'typo' }, a);
    const events = await sequelize.query<any>('SELECT action, actorId, version, reason, details FROM audit_event WHERE recordId = ? ORDER BY id', { replacements: [id], type: QueryTypes.SELECT });
    expect(events.map((e) => e.action)).toEqual(['spectrum.import', 'spectrum.edit', 'spectrum.submit', 'spectrum.approve', 'spectrum.new_version']);
    const edit = jsonValue<any>(events[1].details, {});
    expect(edit.before.notes).toBeNull();
    expect(edit.after.notes).toBe('before approval');
    const nv = jsonValue<any>(events[4].details, {});
    expect(nv).toMatchObject({ before: { notes: 'before approval' }, after: { notes: 'after approval' }, from: 1 });
    expect(events[4]).toMatchObject({ reason: 'typo', version: 2, actorId: a.id });
    expect(jsonValue<any>(events[3].details, {}).signature.meaning).toBe(APPROVAL_MEANING);
    const chain = await verifyAuditChain();
    expect(chain.ok, chain.message).toBe(true);
  });
});

describe('tags', () => {
  it('create, rename, colour, merge and bulk assign, each audited', async () => {
    const r1 = await freshRecord('Tagged 1');
    const r2 = await freshRecord('Tagged 2');
    const t1 = await createTag({ name: `solvents ${RUN}`, colour: '#AA3300' }, a);
    expect(t1).toMatchObject({ name: `solvents ${RUN}`, colour: '#aa3300', recordCount: 0 });
    await expect(createTag({ name: `SOLVENTS ${RUN}` }, a)).rejects.toMatchObject({ status: 409 });
    await expect(createTag({ name: 'x', colour: 'red' }, a)).rejects.toMatchObject({ status: 400 });
    const t2 = await createTag({ name: `aromatics ${RUN}` }, a);
    const added = await assignTags({ recordIds: [r1, r2], tagIds: [t1.id], tagNames: [`new tag ${RUN}`], action: 'add' }, a);
    expect(added.changed).toBe(4);
    expect((await assignTags({ recordIds: [r1, r2], tagIds: [t1.id], action: 'add' }, a)).changed).toBe(0);
    const renamed = await updateTag(t1.id, { name: `process solvents ${RUN}`, colour: '#112233' }, a);
    expect(renamed).toMatchObject({ name: `process solvents ${RUN}`, colour: '#112233', recordCount: 2 });
    await expect(updateTag(t1.id, { name: `aromatics ${RUN}` }, a)).rejects.toMatchObject({ status: 409 });
    await assignTags({ recordIds: [r1], tagIds: [t2.id], action: 'add' }, a);
    const merged = await mergeTag(t1.id, t2.id, a);
    expect(merged).toMatchObject({ id: t2.id, recordCount: 2 });
    expect((await listTags()).some((t) => t.id === t1.id)).toBe(false);
    const removed = await assignTags({ recordIds: [r1, r2], tagNames: [`aromatics ${RUN}`], action: 'remove' }, a);
    expect(removed.changed).toBe(2);
    const actions = await sequelize.query<any>("SELECT action FROM audit_event WHERE (targetType = 'tag' AND targetId IN (?)) OR recordId IN (?) ORDER BY id", {
      replacements: [[String(t1.id), String(t2.id)], [r1, r2]], type: QueryTypes.SELECT,
    });
    const list = actions.map((x) => x.action);
    for (const expected of ['tag.create', 'record.tag_add', 'tag.rename', 'tag.merge', 'record.tag_remove']) expect(list).toContain(expected);
  });

  it('PATCH tags on a released record needs no reason, makes no version, and bumps the library version', async () => {
    const id = await freshRecord('Released tags');
    await reviewRecord(id, { action: 'submit' }, a);
    await reviewRecord(id, { action: 'approve', password: PASSWORD }, b);
    const before = await readLibraryVersion();
    const r = await editRecord(id, { tags: [`reference ${RUN}`, `qc ${RUN}`] }, a);
    expect(r).toMatchObject({ version: 1, createdVersion: false, tags: [`qc ${RUN}`, `reference ${RUN}`] });
    expect(await readLibraryVersion()).toBeGreaterThan(before);
    expect((await versions(id)).length).toBe(1);
  });
});

describe('JCAMP-DX export', () => {
  it('export then import gives back identical peaks and metadata and is reported as a duplicate', async () => {
    const source = Buffer.from(fixture(IMPORT_FIXTURES, 'chlorotoluene-xyw.jdx').toString('utf8').replace(/4-Chlorotoluene\n/, `4-Chlorotoluene ${RUN}\n`));
    // the same peaks may be in the shared test library under another name: confirm then
    const imported = await importFile({ fileName: 'export-src.jdx', actor: a, bytes: source, confirmed: true });
    expect(imported.report.status).toBe('imported');
    const id = imported.report.spectra[0].id;
    await editRecord(id, { retentionIndices: [{ phase: 'non-polar', value: 1000 }], acquiredBy: 'A. Example', saltForm: null }, a);
    const out = await exportRecordJcamp(id, { privileged: true });
    expect(out.text).toMatch(/^##TITLE=/);
    expect(out.text).toContain('##JCAMP-DX=5.01');
    const read = readJcamp(out.text);
    if (!read.ok) throw new Error(read.error);
    const [s] = read.spectra;
    expectPeaksEqual(s.peaks, await storedPeaks(sequelize, id));
    expect(s.names[0]).toBe(`4-Chlorotoluene ${RUN}`);
    expect(s.casRegistryNo).toBe('106-43-4');
    expect(s.ionizationEnergy).toBe(70);
    expect(s.retentionIndex).toBe(1000);
    expect(s.userLabels['ANALYST']).toBe('A. Example');

    const before = await libraryCounts(sequelize);
    const again = await importFile({ fileName: out.fileName, bytes: Buffer.from(out.text), actor: b });
    expect(again.report.status).toBe('duplicate');
    expect(again.report.duplicateOf).toBe(id);
    expect(await libraryCounts(sequelize)).toEqual(before);

    // imported into an empty library the export gives the same record fields
    const [v] = await sequelize.query<any>('SELECT * FROM spectrum_version WHERE recordId = ? AND version = 1', { replacements: [id], type: QueryTypes.SELECT });
    const { deriveChemistry } = await import('../../../src/lib/curation');
    expect(deriveChemistry({ formula: s.formula }).formula).toBe(v.formula);
    expect(s.userLabels['ANALYZER TYPE']).toBe(v.analyzerType);
    expect(Number(s.userLabels['SOURCE TEMPERATURE'])).toBe(v.sourceTemperature);
  });

  it('a draft is not exported to someone who may not see drafts', async () => {
    const id = await freshRecord('Draft export');
    await expect(exportRecordJcamp(id, { privileged: false })).rejects.toMatchObject({ status: 404 });
    expect((await exportRecordJcamp(id, { privileged: true })).version).toBe(1);
  });
});

describe('the command-line actor', () => {
  it('imports with createdBy null and actorEmail "cli"', async () => {
    const { CLI_ACTOR } = await import('../../../src/lib/curation');
    const r = await importFile({ fileName: 'cli.jdx', actor: CLI_ACTOR, bytes: Buffer.from(peakTableFile({ title: `Cli ${RUN}`, formula: 'C3H8O', peaks: randomPeaks(next) })) });
    expect(r.report.status).toBe('imported');
    const id = r.report.spectra[0].id;
    expect((await record(id)).createdBy).toBeNull();
    const [ev] = await sequelize.query<any>("SELECT actorId, actorEmail FROM audit_event WHERE recordId = ? AND action = 'spectrum.import'", { replacements: [id], type: QueryTypes.SELECT });
    expect(ev).toEqual({ actorId: null, actorEmail: 'cli' });
    // nobody signed in touched it: any curator may approve after someone submits
    await reviewRecord(id, { action: 'submit' }, a);
    expect((await reviewRecord(id, { action: 'approve', password: PASSWORD }, b)).status).toBe('released');
  });
});
