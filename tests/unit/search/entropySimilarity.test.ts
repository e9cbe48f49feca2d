import { describe, expect, it } from 'vitest';
import { entropySharedTerm, entropySimilarity } from '../../../src/lib/search/entropySimilarity';
import { entropyWeights } from '../../../src/lib/search/entropyWeights';

describe('entropySimilarity', () => {
  it('matches a hand-worked example without reweighting effects', () => {
    // Li et al. 2021, Nat. Methods 18:1524: similarity = 1 - (2 S_AB - S_A - S_B) / ln 4.
    // A = {10: 1, 20: 1} -> (0.5, 0.5) (equal intensities stay equal after I^w), B = {10: 1} -> (1).
    // AB = {10: 0.75, 20: 0.25}; S_AB = -(0.75 ln 0.75 + 0.25 ln 0.25); S_A = ln 2; S_B = 0.
    const sAB = -(0.75 * Math.log(0.75) + 0.25 * Math.log(0.25));
    const expected = 1 - (2 * sAB - Math.log(2)) / Math.log(4);
    expect(expected).toBeCloseTo(0.6887218755408672, 14);
    expect(entropySimilarity([[10, 1], [20, 1]], [[10, 1]])).toBeCloseTo(expected, 14);
  });
  it('applies the low-entropy weighting before comparing', () => {
    // A = {10: 3, 20: 1}: S = 0.5623, w = 0.25 + 0.25 S; A' = (0.75^w, 0.25^w) / sum = (0.60566, 0.39434); B = (0.5, 0.5).
    expect(entropySimilarity([[10, 3], [20, 1]], [[10, 1], [20, 1]])).toBeCloseTo(0.9918400263598262, 12);
  });
  it('equals the shared-peak form', () => {
    // Li & Fiehn 2023 (flash entropy search): the similarity as a sum over shared peaks.
    const a = entropyWeights([[10, 5], [20, 1], [30, 2], [45, 7]]);
    const b = entropyWeights([[10, 1], [30, 9], [50, 3]]);
    const shared = (entropySharedTerm(a[0][1], b[0][1]) + entropySharedTerm(a[2][1], b[1][1])) / Math.log(4);
    expect(entropySimilarity([[10, 5], [20, 1], [30, 2], [45, 7]], [[10, 1], [30, 9], [50, 3]])).toBeCloseTo(shared, 13);
  });
  it('scores identical spectra 1, disjoint 0, and ignores intensity scale', () => {
    const a: [number, number][] = [[41, 20], [43, 100], [57, 30]];
    expect(entropySimilarity(a, a)).toBeCloseTo(1, 14);
    expect(entropySimilarity(a, [[50, 1]])).toBe(0);
    const b: [number, number][] = [[41, 2], [43, 10], [58, 3]];
    expect(entropySimilarity(a, b.map(([m, i]) => [m, i * 1000] as [number, number]))).toBeCloseTo(entropySimilarity(a, b), 14);
  });
});
