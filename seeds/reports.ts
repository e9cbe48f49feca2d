// Identification reports of the demo scenario, one in each state, written and
// reviewed by the invented lab's people and citing released demo records.
// Each query is a released record's synthetic spectrum, perturbed a little,
// searched against the released demo library with the real search code, so
// the hit lists and scores are what the app itself would show. The spectra
// are synthetic: these reports demonstrate the workflow, not an analysis.
import { QueryTypes, type Sequelize, type Transaction } from 'sequelize';
import { appendAudit } from '../src/lib/audit';
import { APP_VERSION, getSecret } from '../src/lib/config';
import { bruteForceSearch } from '../src/lib/search/bruteForceSearch';
import type { LibraryEntry } from '../src/lib/search/types';
import { decodePeaks } from '../src/lib/spectra/decodePeaks';
import { evaluateCriteria } from '../src/lib/reports/evaluateCriteria';
import { contentDigest, reportContent, reportHmac } from '../src/lib/reports/integrity';
import { DEFAULT_ACCEPTANCE_CRITERIA, normalizeCriteriaValue } from '../src/lib/reports/settings';
import { APPROVAL_MEANING, type AcceptanceCriteria, type CriteriaEvaluation, type Peak, type SnapshotHit } from '../src/lib/reports/types';

type Row = Record<string, any>;

const PEOPLE = {
  analyst: 'analyst@demo.ionotheca.test',
  curator: 'curator@demo.ionotheca.test',
  curator2: 'curator2@demo.ionotheca.test',
} as const;

const SEARCH = { filters: {}, options: { rankBy: 'composite', weights: { mz: 3, intensity: 0.6 } }, limit: 10 };
const DAY = 86_400_000;

/** Deterministic pseudo-random numbers (mulberry32). */
function seeded(seed: number) {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** The reference spectrum as an unknown would give it: intensities within a few per cent, two small extra ions. */
function perturb(peaks: Peak[], rnd: () => number): Peak[] {
  const max = Math.max(...peaks.map((p) => p[1]));
  const out: Peak[] = peaks.map(([mz, i]) => [mz, i === max ? i : Math.max(0.1, i * (0.94 + rnd() * 0.12))]);
  const taken = new Set(peaks.map((p) => Math.round(p[0])));
  for (const extra of [28, 32, 44, 73]) if (!taken.has(extra) && out.length < peaks.length + 2) out.push([extra, max * (0.005 + rnd() * 0.015)]);
  return out.sort((a, b) => a[0] - b[0]).map(([mz, i]) => [mz, Math.round(i * 100) / 100]);
}

interface Libraryish { entries: LibraryEntry[]; byRecord: Map<number, LibraryEntry & { riNonPolar: number | null }> }

async function releasedLibrary(sequelize: Sequelize, t?: Transaction): Promise<Libraryish> {
  const rows = await sequelize.query<Row>(
    `SELECT v.id, v.recordId, v.version, v.status, v.name, v.formula, v.nominalMass, v.ihd, v.elements, v.peaks,
            (SELECT ri.value FROM retention_index ri WHERE ri.spectrumVersionId = v.id AND ri.phase = 'non-polar' LIMIT 1) AS ri
       FROM spectrum_version v WHERE v.status = 'released' ORDER BY v.recordId`,
    { type: QueryTypes.SELECT, transaction: t },
  );
  const entries: LibraryEntry[] = [];
  const byRecord = new Map<number, LibraryEntry & { riNonPolar: number | null }>();
  for (const r of rows) {
    const e = {
      spectrumId: Number(r.id), recordId: Number(r.recordId), version: Number(r.version), name: String(r.name), formula: r.formula ?? null,
      nominalMass: r.nominalMass === null ? null : Number(r.nominalMass), ihd: r.ihd === null ? null : Number(r.ihd),
      elements: r.elements ? String(r.elements).split(',') : [], tags: [], status: 'released' as const,
      ri: r.ri === null ? [] : [{ phase: 'non-polar', value: Number(r.ri) }], peaks: decodePeaks(r.peaks as Buffer),
    };
    entries.push(e);
    byRecord.set(e.recordId, { ...e, riNonPolar: r.ri === null ? null : Number(r.ri) });
  }
  return { entries, byRecord };
}

function search(lib: Libraryish, query: Peak[]): SnapshotHit[] {
  const r = bruteForceSearch(lib.entries, query, { rankBy: 'composite', weights: { mz: 3, intensity: 0.6 }, limit: SEARCH.limit });
  return r.hits.map((h) => ({
    rank: h.rank, spectrumId: h.recordId, version: h.version, name: h.name, formula: h.formula, nominalMass: h.nominalMass, ihd: h.ihd,
    scores: { cosine: round(h.scores.cosine), reverseCosine: round(h.scores.reverseCosine), composite: round(h.scores.composite), entropy: round(h.scores.entropy) },
    score: round(h.score),
  }));
}

const round = (x: number) => Math.round(x * 1e6) / 1e6;

export interface DemoReportsResult { reports: number; auditEvents: number }

/**
 * Add the demo reports (approved with a valid seal, submitted, returned, draft).
 * Joins the caller's transaction when given one (seedDemo does); does nothing
 * when the demo people or released records are missing, or reports exist.
 */
export async function seedDemoReports(sequelize: Sequelize, { transaction, log = () => {} }: { transaction?: Transaction; log?: (l: string) => void } = {}): Promise<DemoReportsResult> {
  const run = async (t: Transaction): Promise<DemoReportsResult> => {
    const [{ n }] = await sequelize.query<Row>('SELECT COUNT(*) AS n FROM report', { type: QueryTypes.SELECT, transaction: t });
    if (Number(n) > 0) return { reports: 0, auditEvents: 0 };
    const users = await sequelize.query<Row>('SELECT id, name, email FROM `user` WHERE email IN (?)', { replacements: [Object.values(PEOPLE)], type: QueryTypes.SELECT, transaction: t });
    const who = (email: string) => users.find((u) => u.email === email);
    const analyst = who(PEOPLE.analyst), curator = who(PEOPLE.curator), curator2 = who(PEOPLE.curator2);
    if (!analyst || !curator || !curator2) {
      log('demo reports: the demo people are missing; skipped');
      return { reports: 0, auditEvents: 0 };
    }
    const lib = await releasedLibrary(sequelize, t);
    if (lib.entries.length < 5) return { reports: 0, auditEvents: 0 };
    const [setting] = await sequelize.query<Row>("SELECT version, value FROM setting WHERE name = 'acceptance-criteria' ORDER BY version DESC LIMIT 1", { type: QueryTypes.SELECT, transaction: t });
    const criteria: AcceptanceCriteria = { ...DEFAULT_ACCEPTANCE_CRITERIA };
    if (setting) {
      const v = normalizeCriteriaValue(typeof setting.value === 'string' ? JSON.parse(setting.value) : setting.value);
      for (const k of Object.keys(criteria) as (keyof AcceptanceCriteria)[]) if (typeof v[k] === 'number') criteria[k] = v[k] as number;
    }
    const criteriaVersion = setting ? Number(setting.version) : null;
    const [state] = await sequelize.query<Row>('SELECT version FROM library_state WHERE id = 1', { type: QueryTypes.SELECT, transaction: t });
    const library = { version: Number(state?.version ?? 0), size: lib.entries.length };
    const rnd = seeded(20250314);
    const now = Date.now();
    let auditEvents = 0;
    const audit = async (actor: Row, action: string, id: number, at: Date, details: unknown, reason: string | null = null) => {
      auditEvents++;
      await appendAudit({ actorId: actor.id, actorEmail: actor.email, action, targetType: 'report', targetId: id, reason, details: { ...(details as object), demo: true, at: at.toISOString() } }, t);
    };

    /** A query made from a released record, with its hits; prefers records whose evaluation passes or fails as asked. */
    // Not the n-alkanes of the retention-index ladder: the reports are about unknowns.
    const ladder = new Set((await sequelize.query<Row>(
      "SELECT rt.recordId FROM record_tag rt JOIN tag g ON g.id = rt.tagId WHERE g.name = 'RI ladder'", { type: QueryTypes.SELECT, transaction: t },
    )).map((r) => Number(r.recordId)));
    const candidates = [...lib.byRecord.values()]
      .filter((e) => e.peaks.length >= 8 && !ladder.has(e.recordId))
      .map((e) => ({ e, k: rnd() }))
      .sort((a, b) => a.k - b.k)
      .map((x) => x.e);
    const used = new Set<number>();
    function makeCase(wantAllPass: boolean, riOffset: number) {
      for (const e of candidates) {
        if (used.has(e.recordId)) continue;
        if (wantAllPass && e.riNonPolar === null) continue;
        const query = perturb(e.peaks, rnd);
        const hits = search(lib, query);
        if (hits[0]?.spectrumId !== e.recordId) continue;
        const selected = { recordId: e.recordId, version: e.version };
        const sampleRi = e.riNonPolar === null ? null : Math.round(e.riNonPolar + riOffset);
        const evaluation = evaluateCriteria({
          criteria, criteriaVersion, hits, selected, queryPeaks: query, referencePeaks: e.peaks, sampleRi, referenceRi: e.riNonPolar, reasoning: '',
          now: new Date(now),
        });
        const passesOtherwise = evaluation.results.filter((r) => r.key !== 'alternativesAddressed').every((r) => r.status === 'pass');
        if (wantAllPass && !passesOtherwise) continue;
        used.add(e.recordId);
        return { entry: e, query, hits, selected, sampleRi, evaluation };
      }
      return null;
    }

    const addressing = (ev: CriteriaEvaluation) =>
      ev.alternatives.length === 0 ? '' : ` Alternatives within the isomer margin: ${ev.alternatives.map((a) => `${a.name} (#${a.recordId})`).join(', ')}, set aside because their key-ion ratios and retention indices do not agree with the sample.`;

    async function insertReport(p: {
      title: string; author: Row; status: 'draft' | 'submitted' | 'approved' | 'returned'; c: NonNullable<ReturnType<typeof makeCase>>;
      conclusion: string | null; reasoning: string | null; standard: Record<string, unknown> | null; sample: Record<string, unknown>;
      createdAt: Date; submittedAt: Date | null; decidedAt: Date | null; reviewer: Row | null;
    }) {
      const evaluation = evaluateCriteria({
        criteria, criteriaVersion, hits: p.c.hits, selected: p.c.selected, queryPeaks: p.c.query, referencePeaks: p.c.entry.peaks,
        sampleRi: p.c.sampleRi, referenceRi: p.c.entry.riNonPolar, reasoning: p.reasoning ?? '', now: p.submittedAt ?? p.createdAt,
      });
      const snapshot = {
        query: { peaks: p.c.query, sourceFileName: `${String(p.sample.sampleId).toLowerCase()}.jdx` },
        search: SEARCH, hits: p.c.hits, interpretation: null, riLadder: { phase: 'non-polar', note: 'n-alkane ladder C8–C20 of the same sequence' },
        library, appVersion: APP_VERSION, takenAt: p.createdAt.toISOString(),
      };
      const [id] = await sequelize.query(
        `INSERT INTO report (title, status, authorId, reviewerId, conclusion, reasoning, sample, snapshot, selectedRecordId, selectedVersion, criteria, criteriaSettingsVersion, referenceStandard, submittedAt, decidedAt, createdAt, updatedAt)
         VALUES (?,?,?,?,?,?,?,?,?,?,?,?,?,?,?,?,?)`,
        {
          replacements: [p.title, p.status, p.author.id, p.reviewer?.id ?? null, p.conclusion, p.reasoning, JSON.stringify(p.sample), JSON.stringify(snapshot),
            p.c.selected.recordId, p.c.selected.version, JSON.stringify(evaluation), criteriaVersion, p.standard ? JSON.stringify(p.standard) : null,
            p.submittedAt, p.decidedAt, p.createdAt, p.decidedAt ?? p.submittedAt ?? p.createdAt],
          type: QueryTypes.INSERT, transaction: t,
        },
      );
      const reportId = Number(id);
      const cites = p.c.hits.map((h) => [reportId, h.spectrumId, h.version, h.spectrumId === p.c.selected.recordId ? 'selected' : 'hit']);
      await sequelize.query(`INSERT INTO report_citation (reportId, recordId, version, role) VALUES ${cites.map(() => '(?,?,?,?)').join(',')}`, {
        replacements: cites.flat(), type: QueryTypes.INSERT, transaction: t,
      });
      await audit(p.author, 'report.create', reportId, p.createdAt, { title: p.title, selected: p.c.selected, hits: p.c.hits.length, libraryVersion: library.version });
      return { reportId, evaluation };
    }
    const comment = async (reportId: number, author: Row, action: string, body: string, at: Date) =>
      sequelize.query('INSERT INTO report_comment (reportId, authorId, action, body, createdAt) VALUES (?,?,?,?,?)', {
        replacements: [reportId, author.id, action, body, at], type: QueryTypes.INSERT, transaction: t,
      });

    let reports = 0;
    // 1. Approved: identified with a co-analysed standard, sealed.
    const c1 = makeCase(true, 4);
    if (c1) {
      const created = new Date(now - 9 * DAY), submitted = new Date(now - 8 * DAY), decided = new Date(now - 7 * DAY);
      const name = c1.entry.name;
      const { reportId } = await insertReport({
        title: `Unknown at 11.42 min in batch PCL-2291, solvent recovery line`, author: analyst, status: 'approved', c: c1,
        conclusion: 'identified',
        reasoning: `Top hit ${name} (#${c1.entry.recordId} v${c1.entry.version}) meets every acceptance criterion; the authentic standard run in the same sequence matched in retention time and spectrum.${addressing(c1.evaluation)} (Demo scenario: synthetic spectra.)`,
        standard: { name: `${name}, authentic standard`, lot: 'TA-STD-24-0917', analysisDate: new Date(now - 10 * DAY).toISOString().slice(0, 10), retentionIndex: c1.sampleRi ?? undefined },
        sample: { sampleId: 'PCL-2291-07', retentionTime: 11.42, retentionIndex: c1.sampleRi ?? undefined, riPhase: 'non-polar', instrument: 'Tarnholm GC-MS bench 1 (single quadrupole)', method: 'PCL-GEN-07 general screening' },
        createdAt: created, submittedAt: submitted, decidedAt: decided, reviewer: curator2,
      });
      await comment(reportId, analyst, 'submit', 'Standard co-analysed in sequence 2291; raw files attached to the batch record.', submitted);
      await audit(analyst, 'report.submit', reportId, submitted, {});
      await comment(reportId, curator2, 'approve', 'Checked against the standard run. Agreed.', decided);
      const [row] = await sequelize.query<Row>('SELECT * FROM report WHERE id = ?', { replacements: [reportId], type: QueryTypes.SELECT, transaction: t });
      const cites = await sequelize.query<Row>('SELECT recordId, version, role FROM report_citation WHERE reportId = ?', { replacements: [reportId], type: QueryTypes.SELECT, transaction: t });
      const comments = await sequelize.query<Row>('SELECT id, authorId, action, body, createdAt FROM report_comment WHERE reportId = ? ORDER BY id', { replacements: [reportId], type: QueryTypes.SELECT, transaction: t });
      const content = reportContent(row, cites as any, comments as any);
      const digest = contentDigest(content);
      await sequelize.query('INSERT INTO signature (signerId, signerName, meaning, subjectType, subjectId, contentDigest, signedAt) VALUES (?,?,?,?,?,?,?)', {
        replacements: [curator2.id, curator2.name, APPROVAL_MEANING, 'report', reportId, digest, decided], type: QueryTypes.INSERT, transaction: t,
      });
      await sequelize.query('UPDATE report SET hmac = ? WHERE id = ?', { replacements: [reportHmac(content, getSecret('REPORT_SIGNING_KEY')), reportId], type: QueryTypes.UPDATE, transaction: t });
      await audit(curator2, 'report.approve', reportId, decided, { meaning: APPROVAL_MEANING, contentDigest: digest }, 'Checked against the standard run. Agreed.');
      reports++;
    }

    // 2. Submitted: tentative, waiting for a reviewer.
    const c2 = makeCase(false, 9);
    if (c2) {
      const created = new Date(now - 2 * DAY), submitted = new Date(now - 1 * DAY);
      const { reportId } = await insertReport({
        title: 'Late-eluting peak in stability sample ST-118, 3-month pull', author: analyst, status: 'submitted', c: c2, conclusion: 'tentative',
        reasoning: `Spectrum agrees with ${c2.entry.name} (#${c2.entry.recordId}); no authentic standard has been run yet, so the conclusion is tentative.${addressing(c2.evaluation)} (Demo scenario: synthetic spectra.)`,
        standard: null,
        sample: { sampleId: 'ST-118-M3', retentionTime: 17.9, ...(c2.sampleRi !== null ? { retentionIndex: c2.sampleRi, riPhase: 'non-polar' } : {}), instrument: 'Tarnholm GC-MS bench 2 (single quadrupole)', method: 'PCL-GEN-07 general screening' },
        createdAt: created, submittedAt: submitted, decidedAt: null, reviewer: null,
      });
      await audit(analyst, 'report.submit', reportId, submitted, {});
      reports++;
    }

    // 3. Returned: the reviewer asks for the standard.
    const c3 = makeCase(false, 31);
    if (c3) {
      const created = new Date(now - 5 * DAY), submitted = new Date(now - 4 * DAY), decided = new Date(now - 3 * DAY);
      const { reportId } = await insertReport({
        title: 'Extra peak in the reagent blank, lot RB-0344', author: analyst, status: 'returned', c: c3, conclusion: 'tentative',
        reasoning: `Best match ${c3.entry.name} (#${c3.entry.recordId}).${addressing(c3.evaluation)} (Demo scenario: synthetic spectra.)`,
        standard: null,
        sample: { sampleId: 'RB-0344-B1', retentionTime: 8.05, ...(c3.sampleRi !== null ? { retentionIndex: c3.sampleRi, riPhase: 'non-polar' } : {}), instrument: 'Tarnholm GC-MS bench 1 (single quadrupole)', method: 'PCL-GEN-07 general screening' },
        createdAt: created, submittedAt: submitted, decidedAt: decided, reviewer: curator,
      });
      await audit(analyst, 'report.submit', reportId, submitted, {});
      await comment(reportId, curator, 'return', 'The retention index is outside the lab window for this hit. Please check the alkane ladder of that sequence and discuss the RI difference in the reasoning before resubmitting.', decided);
      await audit(curator, 'report.return', reportId, decided, {}, 'RI outside the window; check the ladder.');
      reports++;
    }

    // 4. Draft: a curator's own report, not yet concluded.
    const c4 = makeCase(false, -6);
    if (c4) {
      const created = new Date(now - 3 * 3600_000);
      await insertReport({
        title: 'Shoulder on the main peak, pilot batch PB-07', author: curator, status: 'draft', c: c4, conclusion: null, reasoning: null, standard: null,
        sample: { sampleId: 'PB-07-S2', retentionTime: 13.3, instrument: 'Tarnholm GC-MS bench 2 (single quadrupole)' },
        createdAt: created, submittedAt: null, decidedAt: null, reviewer: null,
      });
      reports++;
    }
    log(`demo reports: ${reports}`);
    return { reports, auditEvents };
  };
  return transaction ? run(transaction) : sequelize.transaction(run);
}
