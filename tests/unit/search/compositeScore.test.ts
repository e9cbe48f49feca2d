import { describe, expect, it } from 'vitest';
import { compositeParts, compositeScore } from '../../../src/lib/search/compositeScore';
import { weightPeaks } from '../../../src/lib/search/weightPeaks';

describe('compositeScore', () => {
  it('matches a hand-worked example of the definition', () => {
    // Stein & Scott 1994, J. Am. Soc. Mass Spectrom. 5:859: composite = (N_U F_D + N_UL F_R) / (N_U + N_UL).
    // U = {10: 3, 20: 4, 30: 12}, L = {10: 4, 20: 3, 40: 5} (already weighted). N_U = 3, N_UL = 2.
    // F_D = (3*4 + 4*3)^2 / ((9 + 16 + 144) * (16 + 9 + 25)) = 576 / 8450.
    // One adjacent pair: r = (L20 / L10) * (U10 / U20) = (3/4) * (3/4) = 0.5625 <= 1, F_R = 0.5625 / (N_UL - 1).
    // composite = (3 * 576/8450 + 2 * 0.5625) / 5 = 0.2658994082840237.
    const u: [number, number][] = [[10, 3], [20, 4], [30, 12]];
    const l: [number, number][] = [[10, 4], [20, 3], [40, 5]];
    const parts = compositeParts(u, l);
    expect(parts.fD).toBeCloseTo(576 / 8450, 15);
    expect(parts.fR).toBeCloseTo(0.5625, 15);
    expect(compositeScore(u, l)).toBeCloseTo(0.2658994082840237, 14);
  });
  it('takes the inverse ratio when r > 1', () => {
    // r = (L20/L10) * (U10/U20) = (8/1) * (1/2) = 4 -> 1/4.
    expect(compositeParts([[10, 1], [20, 2]], [[10, 1], [20, 8]]).fR).toBeCloseTo(0.25, 15);
  });
  it('uses F_D alone when fewer than two peaks are shared', () => {
    const parts = compositeParts([[10, 3], [20, 4]], [[10, 4], [30, 3]]);
    expect(parts.fR).toBeNull();
    expect(parts.composite).toBeCloseTo((3 * 4) ** 2 / (25 * 25), 15);
  });
  it('scores identical spectra exactly 1 (F_R averaged over N_UL - 1 pairs), disjoint 0, and ignores intensity scale', () => {
    const a = weightPeaks([[41, 20], [43, 100], [57, 30], [71, 8]]);
    expect(compositeScore(a, a)).toBeCloseTo(1, 14);
    expect(compositeScore(a, weightPeaks([[50, 1], [51, 2]]))).toBe(0);
    const b = weightPeaks([[41, 2], [43, 10], [57, 1], [58, 3]]);
    const b1000 = weightPeaks([[41, 2000], [43, 10000], [57, 1000], [58, 3000]]);
    expect(compositeScore(a, b1000)).toBeCloseTo(compositeScore(a, b), 14);
  });
});
