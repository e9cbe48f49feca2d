// The lab's acceptance criteria, evaluated for the selected hit of a report.
// Pure: everything it needs is passed in, so a test (or a script) can run it.
import type {
  AcceptanceCriteria, Alternative, CriteriaEvaluation, CriterionResult, KeyIonResult, Peak, SnapshotHit,
} from './types';

/** Peaks on a unit-mass axis, intensities relative to the base peak (= 100). */
export function unitRelative(peaks: readonly Peak[]): Map<number, number> {
  const bins = new Map<number, number>();
  for (const [mz, i] of peaks) {
    if (!Number.isFinite(mz) || !Number.isFinite(i) || i <= 0) continue;
    const m = Math.round(mz);
    bins.set(m, (bins.get(m) ?? 0) + i);
  }
  let max = 0;
  for (const v of bins.values()) max = Math.max(max, v);
  const out = new Map<number, number>();
  if (max <= 0) return out;
  for (const [m, v] of bins) out.set(m, (v / max) * 100);
  return out;
}

/**
 * The N most intense ions of the reference must appear in the query with a
 * relative intensity within `tolerance` (relative) of the reference's.
 */
export function compareKeyIons(query: readonly Peak[], reference: readonly Peak[], count: number, tolerance: number): KeyIonResult[] {
  if (!Number.isInteger(count) || count < 1) throw new RangeError('count must be a positive integer');
  if (!(tolerance >= 0)) throw new RangeError('tolerance must be at least 0');
  const q = unitRelative(query);
  const r = [...unitRelative(reference).entries()].sort((a, b) => b[1] - a[1] || a[0] - b[0]).slice(0, count);
  return r.map(([mz, ref]) => {
    const qi = q.get(mz) ?? null;
    const deviation = qi === null ? null : Math.abs(qi - ref) / ref;
    return {
      mz,
      reference: round(ref, 2),
      query: qi === null ? null : round(qi, 2),
      deviation: deviation === null ? null : round(deviation, 4),
      pass: deviation !== null && deviation <= tolerance + 1e-9,
    };
  });
}

function round(x: number, d: number) {
  const f = 10 ** d;
  return Math.round(x * f) / f;
}

/** Does the reasoning name this hit (by name, or as "#id" / "record id")? */
export function mentions(reasoning: string, hit: { name: string; spectrumId: number }): boolean {
  const text = reasoning.toLowerCase();
  if (hit.name && text.includes(hit.name.toLowerCase())) return true;
  return new RegExp(`(#|record\\s+)${hit.spectrumId}(?!\\d)`, 'i').test(reasoning);
}

/** Hits other than the selected one whose score is within the margin of the top score. */
export function findAlternatives(hits: readonly SnapshotHit[], selected: { recordId: number; version: number } | null, margin: number, reasoning = ''): Alternative[] {
  if (hits.length === 0) return [];
  const top = Math.max(...hits.map((h) => h.score));
  return hits
    .filter((h) => !(selected && h.spectrumId === selected.recordId && h.version === selected.version))
    .filter((h) => top - h.score <= margin + 1e-12)
    .sort((a, b) => b.score - a.score || a.rank - b.rank)
    .map((h) => ({
      rank: h.rank,
      recordId: h.spectrumId,
      version: h.version,
      name: h.name,
      score: h.score,
      delta: round(top - h.score, 6),
      addressed: mentions(reasoning, h),
    }));
}

export interface EvaluateInput {
  criteria: AcceptanceCriteria;
  criteriaVersion: number | null;
  hits: readonly SnapshotHit[];
  selected: { recordId: number; version: number } | null;
  queryPeaks: readonly Peak[];
  /** Peaks of the selected record at its cited version. */
  referencePeaks: readonly Peak[] | null;
  /** The unknown's retention index, if measured. */
  sampleRi: number | null;
  /** The reference's retention index on the same phase (library record or co-analysed standard). */
  referenceRi: number | null;
  reasoning: string;
  now?: Date;
}

export function evaluateCriteria(input: EvaluateInput): CriteriaEvaluation {
  const c = input.criteria;
  const hit = input.selected ? input.hits.find((h) => h.spectrumId === input.selected!.recordId && h.version === input.selected!.version) ?? null : null;
  const results: CriterionResult[] = [];
  const alternatives = findAlternatives(input.hits, input.selected, c.isomerMargin, input.reasoning);

  if (!hit) {
    const none = (key: CriterionResult['key'], label: string): CriterionResult => ({ key, label, status: 'not_evaluated', detail: 'No hit is selected.' });
    results.push(none('minimumScore', 'Ranking score'), none('retentionIndex', 'Retention index'), none('keyIons', 'Key ions'), none('isomerMargin', 'Isomer margin'));
  } else {
    results.push({
      key: 'minimumScore',
      label: 'Ranking score',
      status: hit.score >= c.minimumScore ? 'pass' : 'fail',
      value: hit.score,
      threshold: c.minimumScore,
      detail: `Score ${hit.score.toFixed(3)}; the lab's minimum is ${c.minimumScore.toFixed(3)}.`,
    });

    if (input.sampleRi === null || input.referenceRi === null) {
      results.push({
        key: 'retentionIndex',
        label: 'Retention index',
        status: 'not_evaluated',
        value: null,
        threshold: c.riWindow,
        detail: input.sampleRi === null ? 'No retention index was entered for the sample.' : 'The reference has no retention index on this phase.',
      });
    } else {
      const delta = input.sampleRi - input.referenceRi;
      results.push({
        key: 'retentionIndex',
        label: 'Retention index',
        status: Math.abs(delta) <= c.riWindow ? 'pass' : 'fail',
        value: round(delta, 2),
        threshold: c.riWindow,
        detail: `Sample ${round(input.sampleRi, 1)}, reference ${round(input.referenceRi, 1)}: difference ${round(delta, 1)}; window ±${c.riWindow}.`,
      });
    }

    if (!input.referencePeaks || input.referencePeaks.length === 0) {
      results.push({ key: 'keyIons', label: 'Key ions', status: 'not_evaluated', detail: 'The reference spectrum could not be read.' });
    } else {
      const ions = compareKeyIons(input.queryPeaks, input.referencePeaks, c.keyIonCount, c.keyIonTolerance);
      const failed = ions.filter((i) => !i.pass);
      results.push({
        key: 'keyIons',
        label: 'Key ions',
        status: failed.length === 0 ? 'pass' : 'fail',
        ions,
        threshold: c.keyIonTolerance,
        detail: failed.length === 0
          ? `The ${ions.length} most intense reference ions are present within ${Math.round(c.keyIonTolerance * 100)} % relative intensity.`
          : `Outside ${Math.round(c.keyIonTolerance * 100)} %: m/z ${failed.map((i) => i.mz).join(', ')}.`,
      });
    }

    const top = Math.max(...input.hits.map((h) => h.score));
    const behind = top - hit.score;
    results.push({
      key: 'isomerMargin',
      label: 'Isomer margin',
      status: behind <= c.isomerMargin + 1e-12 ? 'pass' : 'fail',
      value: round(behind, 6),
      threshold: c.isomerMargin,
      detail: behind <= 1e-12
        ? `The selected hit has the top score; ${alternatives.length} other hit(s) within ${c.isomerMargin}.`
        : `The selected hit is ${behind.toFixed(3)} below the top score (margin ${c.isomerMargin}).`,
    });
  }

  const unaddressed = alternatives.filter((a) => !a.addressed);
  results.push({
    key: 'alternativesAddressed',
    label: 'Alternatives addressed',
    status: unaddressed.length === 0 ? 'pass' : 'fail',
    detail: alternatives.length === 0
      ? 'No other hit lies within the isomer margin.'
      : unaddressed.length === 0
        ? `The reasoning addresses all ${alternatives.length} alternative(s).`
        : `The reasoning does not yet address: ${unaddressed.map((a) => `${a.name} (#${a.recordId})`).join('; ')}.`,
  });

  return {
    settings: { name: 'acceptance-criteria', version: input.criteriaVersion, value: c },
    selected: hit ? { recordId: hit.spectrumId, version: hit.version, name: hit.name, score: hit.score } : null,
    results,
    alternatives,
    allPass: results.every((r) => r.status === 'pass'),
    evaluatedAt: (input.now ?? new Date()).toISOString(),
  };
}

/**
 * Why a conclusion is not allowed, or [] when it is. "Identified" needs a
 * co-analysed reference standard (lot and analysis date) and every criterion
 * passing; anything else may stand with weaker evidence.
 */
export function conclusionProblems(
  conclusion: string | null,
  evaluation: CriteriaEvaluation | null,
  referenceStandard: { lot?: string; analysisDate?: string } | null,
): string[] {
  if (conclusion !== 'identified') return [];
  const problems: string[] = [];
  if (!referenceStandard?.lot || !referenceStandard?.analysisDate) {
    problems.push('"Identified" needs a co-analysed authentic reference standard (its lot and analysis date); without one the strongest conclusion is "tentative".');
  }
  if (!evaluation?.selected) problems.push('"Identified" needs a selected hit.');
  for (const r of evaluation?.results ?? []) {
    if (r.status !== 'pass') problems.push(`${r.label}: ${r.status === 'fail' ? 'fails' : 'not evaluated'} — ${r.detail}`);
  }
  return problems;
}
