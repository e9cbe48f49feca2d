import { describe, expect, it } from 'vitest';
import { cosineScore } from '../../../src/lib/search/cosineScore';
import { reverseCosineScore } from '../../../src/lib/search/reverseCosineScore';
import { weightPeaks } from '../../../src/lib/search/weightPeaks';

describe('reverseCosineScore', () => {
  it('ignores the unknown peaks the library spectrum lacks (hand-worked)', () => {
    // Shared: 10 and 20. dot = 3*4 + 4*3 = 24; sqrt(3^2 + 4^2) = 5; |L| = 5 -> 24/25.
    const query: [number, number][] = [[10, 3], [20, 4], [30, 12]];
    const library: [number, number][] = [[10, 4], [20, 3]];
    expect(reverseCosineScore(query, library)).toBeCloseTo(0.96, 15);
    // The forward cosine counts the extra peak: 24 / (13 * 5).
    expect(cosineScore(query, library)).toBeCloseTo(24 / 65, 15);
  });
  it('scores identical spectra 1, disjoint 0, and ignores intensity scale', () => {
    const a = weightPeaks([[41, 20], [43, 100], [57, 30]]);
    expect(reverseCosineScore(a, a)).toBeCloseTo(1, 14);
    expect(reverseCosineScore(a, weightPeaks([[50, 1]]))).toBe(0);
    const b = weightPeaks([[41, 2], [43, 10], [58, 3]]);
    expect(reverseCosineScore(a, weightPeaks([[41, 200], [43, 1000], [58, 300]]))).toBeCloseTo(reverseCosineScore(a, b), 14);
  });
});
