import { describe, it, expect } from 'vitest';
import { compareKeyIons, conclusionProblems, evaluateCriteria, findAlternatives, mentions, unitRelative } from '../../../src/lib/reports/evaluateCriteria';
import type { SnapshotHit } from '../../../src/lib/reports/types';

const criteria = { minimumScore: 0.8, riWindow: 20, keyIonCount: 3, keyIonTolerance: 0.2, isomerMargin: 0.02 };
const h = (rank: number, id: number, score: number, name = `c${id}`): SnapshotHit => ({
  rank, spectrumId: id, version: 1, name, formula: null, nominalMass: null, ihd: null, scores: { cosine: score, reverseCosine: score, composite: score, entropy: score }, score,
});

describe('unitRelative', () => {
  it('sums into unit bins and scales to the base peak = 100', () => {
    expect([...unitRelative([[43.02, 50], [42.98, 50], [58.1, 25], [60, 0]]).entries()]).toEqual([[43, 100], [58, 25]]);
  });
});

describe('compareKeyIons', () => {
  // Key-ion agreement within a relative intensity tolerance: common practice, no source.
  it('passes ions within the relative tolerance and fails those outside or absent', () => {
    const ref: [number, number][] = [[43, 100], [58, 50], [71, 20], [29, 5]];
    const q: [number, number][] = [[43, 1000], [58, 590], [29, 50]];
    const r = compareKeyIons(q, ref, 3, 0.2);
    expect(r.map((i) => i.mz)).toEqual([43, 58, 71]);
    expect(r[0]).toMatchObject({ pass: true, deviation: 0 });
    expect(r[1]).toMatchObject({ pass: true, reference: 50, query: 59, deviation: 0.18 });
    expect(r[2]).toMatchObject({ pass: false, query: null });
  });

  it('treats the tolerance boundary as inside', () => {
    expect(compareKeyIons([[43, 100], [58, 60]], [[43, 100], [58, 50]], 2, 0.2)[1].pass).toBe(true);
    expect(compareKeyIons([[43, 100], [58, 60.2]], [[43, 100], [58, 50]], 2, 0.2)[1].pass).toBe(false);
  });

  it('rejects bad options', () => {
    expect(() => compareKeyIons([], [], 0, 0.2)).toThrow(RangeError);
    expect(() => compareKeyIons([], [], 2, -1)).toThrow(RangeError);
  });
});

describe('alternatives', () => {
  it('lists hits within the margin of the top score, except the selected one', () => {
    const hits = [h(1, 1, 0.9), h(2, 2, 0.885), h(3, 3, 0.879), h(4, 4, 0.5)];
    expect(findAlternatives(hits, { recordId: 1, version: 1 }, 0.02).map((a) => a.recordId)).toEqual([2]);
    expect(findAlternatives(hits, { recordId: 2, version: 1 }, 0.02).map((a) => a.recordId)).toEqual([1]);
  });
  it('counts a hit as addressed when the reasoning names it or its record id', () => {
    expect(mentions('Ruled out 2-Butanone by RI.', { name: '2-butanone', spectrumId: 9 })).toBe(true);
    expect(mentions('Record #12 lacks m/z 91.', { name: 'x', spectrumId: 12 })).toBe(true);
    expect(mentions('Record #123 lacks m/z 91.', { name: 'x', spectrumId: 12 })).toBe(false);
  });
});

describe('evaluateCriteria', () => {
  const base = {
    criteria, criteriaVersion: 3, hits: [h(1, 1, 0.9), h(2, 2, 0.7)], selected: { recordId: 1, version: 1 },
    queryPeaks: [[43, 100], [58, 50], [71, 20]] as [number, number][], referencePeaks: [[43, 100], [58, 50], [71, 20]] as [number, number][],
    sampleRi: 800, referenceRi: 790, reasoning: '',
  };
  it('passes everything for a good match and records the settings version', () => {
    const e = evaluateCriteria(base);
    expect(e.allPass).toBe(true);
    expect(e.settings.version).toBe(3);
    expect(e.results.map((r) => r.key)).toEqual(['minimumScore', 'retentionIndex', 'keyIons', 'isomerMargin', 'alternativesAddressed']);
  });
  it('fails the score, RI window and isomer margin where they are not met', () => {
    const e = evaluateCriteria({ ...base, hits: [h(1, 2, 0.95), h(2, 1, 0.75)], sampleRi: 830 });
    const by = Object.fromEntries(e.results.map((r) => [r.key, r.status]));
    // the better-scoring hit that was not selected is itself an alternative to address
    expect(by).toMatchObject({ minimumScore: 'fail', retentionIndex: 'fail', isomerMargin: 'fail', alternativesAddressed: 'fail' });
    expect(e.allPass).toBe(false);
  });
  it('marks the RI as not evaluated without a sample RI, which is not a pass', () => {
    const e = evaluateCriteria({ ...base, sampleRi: null });
    expect(e.results.find((r) => r.key === 'retentionIndex')!.status).toBe('not_evaluated');
    expect(e.allPass).toBe(false);
  });
  it('needs an unaddressed alternative to be named before all pass', () => {
    const hits = [h(1, 1, 0.9, 'Alpha'), h(2, 2, 0.89, 'Beta')];
    expect(evaluateCriteria({ ...base, hits }).allPass).toBe(false);
    expect(evaluateCriteria({ ...base, hits, reasoning: 'Beta is excluded by RI.' }).allPass).toBe(true);
  });
});

describe('conclusionProblems', () => {
  const good = evaluateCriteria({
    criteria, criteriaVersion: 1, hits: [h(1, 1, 0.9)], selected: { recordId: 1, version: 1 },
    queryPeaks: [[43, 100]], referencePeaks: [[43, 100]], sampleRi: 800, referenceRi: 800, reasoning: '',
  });
  it('allows "identified" only with a reference standard (lot and date) and every criterion passing', () => {
    expect(conclusionProblems('identified', good, null)[0]).toMatch(/reference standard/);
    expect(conclusionProblems('identified', good, { lot: 'L1', analysisDate: '2025-01-02' })).toEqual([]);
    const bad = { ...good, results: good.results.map((r) => (r.key === 'keyIons' ? { ...r, status: 'fail' as const } : r)) };
    expect(conclusionProblems('identified', bad, { lot: 'L1', analysisDate: '2025-01-02' })).toHaveLength(1);
  });
  it('never blocks "tentative" or "not in library"', () => {
    expect(conclusionProblems('tentative', null, null)).toEqual([]);
    expect(conclusionProblems('not_in_library', null, null)).toEqual([]);
  });
});
