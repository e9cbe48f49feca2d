// The identification report's life: created from a search snapshot, edited
// while a draft or returned, submitted, then approved (an electronic
// signature; read-only from then on, sealed with an HMAC) or returned with a
// comment and resubmitted. Every step writes an audit event in the same
// transaction; e-mail notices go out after the commit.
import { QueryTypes, type Transaction } from 'sequelize';
import type { z } from 'zod';
import { getSequelize } from '../db/sequelize';
import { appendAudit } from '../audit';
import { APP_VERSION, getSecret } from '../config';
import { HttpError } from '../http';
import { can } from '../roles';
import { getLibraryIndex, libraryIndexStatus } from '../library-index';
import { verifySignature } from '../signature';
import { evaluateCriteria, conclusionProblems } from './evaluateCriteria';
import { contentDigest, reportContent, reportHmac } from './integrity';
import { notifyAuthor, notifyReviewers } from './notify';
import { getAcceptanceCriteria } from './settings';
import { canView, jsonValue, readCitations, readCitedVersion, readReportRow, reviewersFor, userNames, type Row } from './store';
import type { createReportSchema, patchReportSchema, reviewSchema } from './schemas';
import {
  APPROVAL_MEANING, type Actor, type CriteriaEvaluation, type ReferenceStandard, type ReportSnapshot, type SampleDetails, type SnapshotHit,
} from './types';

type CreateInput = z.infer<typeof createReportSchema>;
type PatchInput = z.infer<typeof patchReportSchema>;
type ReviewInput = z.infer<typeof reviewSchema>;

const DEFAULT_RI_PHASE = 'non-polar';

async function libraryFacts(): Promise<{ version: number; size: number }> {
  const status = libraryIndexStatus();
  if (status.ready) return { version: Number(getLibraryIndex().libraryVersion ?? status.version), size: status.spectra };
  // The index is not loaded in this process (a script or a test): ask the database.
  const s = getSequelize();
  const [st] = await s.query<Row>('SELECT version FROM library_state WHERE id = 1', { type: QueryTypes.SELECT });
  const [n] = await s.query<Row>("SELECT COUNT(*) AS n FROM spectrum_version WHERE status = 'released'", { type: QueryTypes.SELECT });
  return { version: Number(st?.version ?? 0), size: Number(n?.n ?? 0) };
}

/** Evaluate the current acceptance criteria for a report's selected hit. */
export async function evaluateForReport(
  p: { snapshot: ReportSnapshot; selected: { recordId: number; version: number } | null; sample: SampleDetails; reasoning: string | null; referenceStandard: ReferenceStandard | null },
  transaction?: Transaction,
): Promise<CriteriaEvaluation> {
  const { version, value } = await getAcceptanceCriteria(transaction);
  const ref = p.selected ? await readCitedVersion(p.selected.recordId, p.selected.version, transaction) : null;
  const phase = (p.sample.riPhase || DEFAULT_RI_PHASE).toLowerCase();
  const libraryRi = ref?.retentionIndices.find((r) => r.phase.toLowerCase() === phase)?.value ?? null;
  return evaluateCriteria({
    criteria: value,
    criteriaVersion: version,
    hits: p.snapshot.hits,
    selected: p.selected,
    queryPeaks: p.snapshot.query.peaks,
    referencePeaks: ref?.peaks ?? null,
    sampleRi: p.sample.retentionIndex ?? null,
    referenceRi: libraryRi ?? p.referenceStandard?.retentionIndex ?? null,
    reasoning: p.reasoning ?? '',
  });
}

function assertConclusion(conclusion: string | null | undefined, evaluation: CriteriaEvaluation, standard: ReferenceStandard | null) {
  const problems = conclusionProblems(conclusion ?? null, evaluation, standard);
  if (problems.length) {
    throw new HttpError(400, 'conclusion_not_supported', problems[0], problems.map((message) => ({ field: 'conclusion', message })));
  }
}

function assertSelectedInHits(selected: { recordId: number; version: number } | null | undefined, hits: SnapshotHit[]) {
  if (selected && !hits.some((h) => h.spectrumId === selected.recordId && h.version === selected.version)) {
    throw new HttpError(400, 'invalid_input', `selected: record ${selected.recordId} version ${selected.version} is not among the report's hits`);
  }
}

async function writeCitations(reportId: number, hits: SnapshotHit[], selected: { recordId: number; version: number } | null, t: Transaction) {
  const s = getSequelize();
  await s.query('DELETE FROM report_citation WHERE reportId = ?', { replacements: [reportId], type: QueryTypes.DELETE, transaction: t });
  const seen = new Set<string>();
  const rows: unknown[][] = [];
  for (const h of hits) {
    const key = `${h.spectrumId}/${h.version}`;
    if (seen.has(key)) continue;
    seen.add(key);
    const role = selected && selected.recordId === h.spectrumId && selected.version === h.version ? 'selected' : 'hit';
    rows.push([reportId, h.spectrumId, h.version, role]);
  }
  if (rows.length === 0) return;
  await s.query(`INSERT INTO report_citation (reportId, recordId, version, role) VALUES ${rows.map(() => '(?,?,?,?)').join(',')}`, {
    replacements: rows.flat(),
    type: QueryTypes.INSERT,
    transaction: t,
  });
}

/** The hits as sent, with identity fields taken from the cited versions themselves. */
async function checkedHits(hits: CreateInput['hits'], t: Transaction): Promise<SnapshotHit[]> {
  if (hits.length === 0) return [];
  const pairs = hits.map((h) => [h.spectrumId, h.version]);
  const rows = await getSequelize().query<Row>(
    `SELECT recordId, version, name, formula, nominalMass, ihd FROM spectrum_version WHERE (recordId, version) IN (${pairs.map(() => '(?,?)').join(',')})`,
    { replacements: pairs.flat(), type: QueryTypes.SELECT, transaction: t },
  );
  const byKey = new Map(rows.map((r) => [`${r.recordId}/${r.version}`, r]));
  const missing = hits.filter((h) => !byKey.has(`${h.spectrumId}/${h.version}`));
  if (missing.length) {
    throw new HttpError(400, 'invalid_input', `hits: record ${missing[0].spectrumId} has no version ${missing[0].version}`, missing.map((m) => ({ field: 'hits', message: `record ${m.spectrumId} version ${m.version} does not exist` })));
  }
  return hits.map((h) => {
    const r = byKey.get(`${h.spectrumId}/${h.version}`)!;
    return {
      rank: h.rank,
      spectrumId: h.spectrumId,
      version: h.version,
      name: String(r.name),
      formula: r.formula ?? null,
      nominalMass: r.nominalMass === null ? null : Number(r.nominalMass),
      ihd: r.ihd === null ? null : Number(r.ihd),
      scores: { cosine: h.scores.cosine, reverseCosine: h.scores.reverseCosine, composite: h.scores.composite, entropy: h.scores.entropy },
      score: h.score,
      ...(h.riDelta !== undefined ? { riDelta: h.riDelta } : {}),
    };
  });
}

function audit(actor: Actor, action: string, reportId: number, details: unknown, t: Transaction, reason?: string | null) {
  return appendAudit({ actorId: actor.id, actorEmail: actor.email, action, targetType: 'report', targetId: reportId, reason: reason ?? null, details }, t);
}

/** POST /api/reports: a new draft from a search snapshot. */
export async function createReport(input: CreateInput, actor: Actor): Promise<{ id: number }> {
  const s = getSequelize();
  const library = await libraryFacts();
  return s.transaction(async (t) => {
    const hits = await checkedHits(input.hits, t);
    const selected = input.selected ?? null;
    assertSelectedInHits(selected, hits);
    if (input.supersedesReportId) {
      const old = await readReportRow(input.supersedesReportId, t);
      if (!old || !canView(actor, old)) throw new HttpError(404, 'not_found', `There is no report ${input.supersedesReportId}`);
      if (old.status !== 'approved') throw new HttpError(409, 'wrong_state', 'Only an approved report is corrected by a new report; edit the draft itself instead');
    }
    const snapshot: ReportSnapshot = {
      query: { peaks: input.query.peaks, sourceFileName: input.query.sourceFileName ?? null },
      search: { filters: input.search.filters ?? {}, options: input.search.options ?? {}, limit: input.search.limit ?? null },
      hits,
      interpretation: input.interpretation ?? null,
      riLadder: input.riLadder ?? null,
      library,
      appVersion: APP_VERSION,
      takenAt: new Date().toISOString(),
    };
    const sample = input.sample ?? {};
    const standard = input.referenceStandard ?? null;
    const evaluation = await evaluateForReport({ snapshot, selected, sample, reasoning: input.reasoning ?? null, referenceStandard: standard }, t);
    assertConclusion(input.conclusion, evaluation, standard);
    const now = new Date();
    const [id] = await s.query(
      `INSERT INTO report (title, status, authorId, conclusion, reasoning, sample, snapshot, selectedRecordId, selectedVersion, criteria, criteriaSettingsVersion, referenceStandard, supersedesReportId, createdAt, updatedAt)
       VALUES (?, 'draft', ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?)`,
      {
        replacements: [
          input.title, actor.id, input.conclusion ?? null, input.reasoning ?? null, JSON.stringify(sample), JSON.stringify(snapshot),
          selected?.recordId ?? null, selected?.version ?? null, JSON.stringify(evaluation), evaluation.settings.version,
          standard ? JSON.stringify(standard) : null, input.supersedesReportId ?? null, now, now,
        ],
        type: QueryTypes.INSERT,
        transaction: t,
      },
    );
    const reportId = Number(id);
    await writeCitations(reportId, hits, selected, t);
    await audit(actor, 'report.create', reportId, {
      title: input.title, selected, hits: hits.length, libraryVersion: library.version, supersedesReportId: input.supersedesReportId ?? null,
      criteriaVersion: evaluation.settings.version, allPass: evaluation.allPass,
    }, t);
    return { id: reportId };
  });
}

function rowSnapshot(row: Row): ReportSnapshot {
  return jsonValue<ReportSnapshot>(row.snapshot, null as unknown as ReportSnapshot);
}

function assertEditable(row: Row, actor: Actor) {
  if (row.status === 'approved') throw new HttpError(409, 'report_read_only', 'An approved report is read-only; a correction is a new report that supersedes it');
  if (row.authorId !== actor.id) throw new HttpError(403, 'not_author', 'Only the author may change or submit this report');
  if (row.status === 'submitted') throw new HttpError(409, 'wrong_state', 'The report is with the reviewers; it can be changed again once it is returned');
}

async function visibleRowForUpdate(id: number, actor: Actor, t: Transaction): Promise<Row> {
  const row = await readReportRow(id, t, true);
  if (!row || !canView(actor, row)) throw new HttpError(404, 'not_found', `There is no report ${id}`);
  return row;
}

/** PATCH /api/reports/:id: the author edits a draft or a returned report. */
export async function updateReport(id: number, patch: PatchInput, actor: Actor): Promise<void> {
  const s = getSequelize();
  await s.transaction(async (t) => {
    const row = await visibleRowForUpdate(id, actor, t);
    assertEditable(row, actor);
    const snapshot = rowSnapshot(row);
    const selected = patch.selected !== undefined
      ? patch.selected
      : row.selectedRecordId ? { recordId: Number(row.selectedRecordId), version: Number(row.selectedVersion) } : null;
    assertSelectedInHits(selected, snapshot.hits);
    if (patch.interpretation !== undefined) snapshot.interpretation = patch.interpretation;
    const sample = patch.sample ?? jsonValue<SampleDetails>(row.sample, {});
    const standard = patch.referenceStandard !== undefined ? patch.referenceStandard : jsonValue<ReferenceStandard | null>(row.referenceStandard, null);
    const reasoning = patch.reasoning !== undefined ? patch.reasoning : row.reasoning;
    const conclusion = patch.conclusion !== undefined ? patch.conclusion : row.conclusion;
    const title = patch.title ?? row.title;
    const evaluation = await evaluateForReport({ snapshot, selected, sample, reasoning, referenceStandard: standard }, t);
    assertConclusion(conclusion, evaluation, standard);
    await s.query(
      `UPDATE report SET title = ?, conclusion = ?, reasoning = ?, sample = ?, snapshot = ?, selectedRecordId = ?, selectedVersion = ?,
              criteria = ?, criteriaSettingsVersion = ?, referenceStandard = ?, updatedAt = ? WHERE id = ?`,
      {
        replacements: [
          title, conclusion ?? null, reasoning ?? null, JSON.stringify(sample), JSON.stringify(snapshot), selected?.recordId ?? null, selected?.version ?? null,
          JSON.stringify(evaluation), evaluation.settings.version, standard ? JSON.stringify(standard) : null, new Date(), id,
        ],
        type: QueryTypes.UPDATE,
        transaction: t,
      },
    );
    if (patch.selected !== undefined) await writeCitations(id, snapshot.hits, selected, t);
    await audit(actor, 'report.update', id, { fields: Object.keys(patch), conclusion: conclusion ?? null, selected, allPass: evaluation.allPass }, t);
  });
}

async function addComment(reportId: number, authorId: string, action: string, body: string, t: Transaction) {
  await getSequelize().query('INSERT INTO report_comment (reportId, authorId, action, body, createdAt) VALUES (?,?,?,?,?)', {
    replacements: [reportId, authorId, action, body, new Date()],
    type: QueryTypes.INSERT,
    transaction: t,
  });
}

async function readComments(reportId: number, t?: Transaction) {
  const rows = await getSequelize().query<Row>('SELECT id, authorId, action, body, createdAt FROM report_comment WHERE reportId = ? ORDER BY id', {
    replacements: [reportId],
    type: QueryTypes.SELECT,
    transaction: t,
  });
  return rows.map((r) => ({ id: Number(r.id), authorId: String(r.authorId), action: r.action ?? null, body: String(r.body), createdAt: r.createdAt as Date }));
}

/** The canonical content of a stored report, read inside the given transaction. */
export async function storedContent(id: number, t?: Transaction): Promise<{ row: Row; content: string } | null> {
  const row = await readReportRow(id, t);
  if (!row) return null;
  return { row, content: reportContent(row, await readCitations(id, t), await readComments(id, t)) };
}

export interface ReviewOutcome {
  status: string;
  mail: { sent: number; failed: string[] };
  signature?: { signerName: string; meaning: string; signedAt: string };
}

/** POST /api/reports/:id/review: submit (author), approve or return (another curator), comment. */
export async function reviewReport(id: number, input: ReviewInput, actor: Actor): Promise<ReviewOutcome> {
  const s = getSequelize();
  type After = () => Promise<{ sent: number; failed: string[] }>;
  let after: After = async () => ({ sent: 0, failed: [] });
  let signature: ReviewOutcome['signature'];
  const status = await s.transaction(async (t) => {
    const row = await visibleRowForUpdate(id, actor, t);
    if (row.status === 'approved') throw new HttpError(409, 'report_read_only', 'An approved report is read-only; a correction is a new report that supersedes it');
    const now = new Date();
    const names = await userNames([row.authorId, actor.id]);
    const author = names.get(row.authorId) ?? { id: row.authorId, name: row.authorId, email: '' };
    const me = names.get(actor.id) ?? { id: actor.id, name: actor.name, email: actor.email };

    if (input.action === 'submit') {
      assertEditable(row, actor);
      if (!row.conclusion) throw new HttpError(400, 'report_incomplete', 'conclusion: choose identified, tentative or not in library before submitting');
      if (!row.reasoning || !String(row.reasoning).trim()) throw new HttpError(400, 'report_incomplete', "reasoning: write the reasoning behind the conclusion before submitting");
      const snapshot = rowSnapshot(row);
      const selected = row.selectedRecordId ? { recordId: Number(row.selectedRecordId), version: Number(row.selectedVersion) } : null;
      const standard = jsonValue<ReferenceStandard | null>(row.referenceStandard, null);
      const evaluation = await evaluateForReport({ snapshot, selected, sample: jsonValue<SampleDetails>(row.sample, {}), reasoning: row.reasoning, referenceStandard: standard }, t);
      assertConclusion(row.conclusion, evaluation, standard);
      const open = evaluation.alternatives.filter((a) => !a.addressed);
      if (row.conclusion !== 'not_in_library' && open.length > 0) {
        throw new HttpError(400, 'alternatives_not_addressed', `reasoning: address the alternatives within the isomer margin: ${open.map((a) => `${a.name} (#${a.recordId})`).join('; ')}`, open);
      }
      const resubmit = row.status === 'returned';
      await s.query('UPDATE report SET status = ?, submittedAt = ?, decidedAt = NULL, reviewerId = NULL, criteria = ?, criteriaSettingsVersion = ?, updatedAt = ? WHERE id = ?', {
        replacements: ['submitted', now, JSON.stringify(evaluation), evaluation.settings.version, now, id],
        type: QueryTypes.UPDATE,
        transaction: t,
      });
      if (input.comment) await addComment(id, actor.id, resubmit ? 'resubmit' : 'submit', input.comment, t);
      await audit(actor, resubmit ? 'report.resubmit' : 'report.submit', id, { criteriaVersion: evaluation.settings.version, allPass: evaluation.allPass }, t, input.comment ?? null);
      const reviewers = await reviewersFor(row.authorId, t);
      after = () => notifyReviewers({ id, title: row.title }, author, reviewers, resubmit);
      return 'submitted';
    }

    if (input.action === 'comment') {
      if (!can(actor.roles, 'report')) throw new HttpError(403, 'forbidden', 'Your roles do not allow commenting on reports');
      await addComment(id, actor.id, 'comment', input.comment!, t);
      await audit(actor, 'report.comment', id, { length: input.comment!.length }, t);
      return row.status;
    }

    // approve / return: another curator's decision on a submitted report
    if (!can(actor.roles, 'approve')) throw new HttpError(403, 'forbidden', 'Only a curator may approve or return a report');
    if (row.authorId === actor.id) throw new HttpError(403, 'own_report', 'The reviewer must be a curator other than the author; you cannot review your own report');
    if (row.status !== 'submitted') throw new HttpError(409, 'wrong_state', `The report is ${row.status}; only a submitted report can be approved or returned`);

    if (input.action === 'return') {
      await s.query("UPDATE report SET status = 'returned', reviewerId = ?, decidedAt = ?, updatedAt = ? WHERE id = ?", {
        replacements: [actor.id, now, now, id],
        type: QueryTypes.UPDATE,
        transaction: t,
      });
      await addComment(id, actor.id, 'return', input.comment!, t);
      await audit(actor, 'report.return', id, {}, t, input.comment);
      after = () => notifyAuthor({ id, title: row.title }, author, me, 'returned');
      return 'returned';
    }

    // approve: the signed content is the report as it will be stored
    if (input.comment) await addComment(id, actor.id, 'approve', input.comment, t);
    await s.query("UPDATE report SET status = 'approved', reviewerId = ?, decidedAt = ?, updatedAt = ? WHERE id = ?", {
      replacements: [actor.id, now, now, id],
      type: QueryTypes.UPDATE,
      transaction: t,
    });
    const stored = (await storedContent(id, t))!;
    const sig = await verifySignature(
      { userId: actor.id, password: input.password!, meaning: APPROVAL_MEANING, subjectType: 'report', subjectId: id, contentDigest: contentDigest(stored.content) },
      t,
    );
    const hmac = reportHmac(stored.content, getSecret('REPORT_SIGNING_KEY'));
    await s.query('UPDATE report SET hmac = ? WHERE id = ?', { replacements: [hmac, id], type: QueryTypes.UPDATE, transaction: t });
    await audit(actor, 'report.approve', id, { signatureId: sig.id, meaning: sig.meaning, signedAt: sig.signedAt.toISOString(), contentDigest: contentDigest(stored.content) }, t, input.comment ?? null);
    signature = { signerName: sig.signerName, meaning: sig.meaning, signedAt: sig.signedAt.toISOString() };
    after = () => notifyAuthor({ id, title: row.title }, author, me, 'approved');
    return 'approved';
  });
  const mail = await after();
  return { status, mail, ...(signature ? { signature } : {}) };
}
