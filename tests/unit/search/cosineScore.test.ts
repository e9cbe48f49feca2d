import { describe, expect, it } from 'vitest';
import { similarity } from 'ml-distance';
import { cosineScore } from '../../../src/lib/search/cosineScore';
import { weightPeaks } from '../../../src/lib/search/weightPeaks';
import { rng } from './helpers';

describe('cosineScore', () => {
  it('matches a hand-worked example', () => {
    // cos = (3*4 + 4*3) / (5 * 5) = 24/25, the definition of the cosine of two vectors.
    expect(cosineScore([[10, 3], [20, 4]], [[10, 4], [20, 3]])).toBeCloseTo(0.96, 15);
  });
  it('equals ml-distance cosine on the same weighted vectors', () => {
    // Reference library: ml-distance (npm), similarities.cosine.
    const r = rng(11);
    for (let trial = 0; trial < 50; trial++) {
      const a = weightPeaks(Array.from({ length: 40 }, (_, i) => [30 + i, r() < 0.3 ? 0.001 : r() * 100] as [number, number]));
      const b = weightPeaks(Array.from({ length: 40 }, (_, i) => [30 + i, r() < 0.3 ? 0.001 : r() * 100] as [number, number]));
      const ref = similarity.cosine(
        a.map((p) => p[1]),
        b.map((p) => p[1]),
      );
      expect(Math.abs(cosineScore(a, b) - ref)).toBeLessThan(1e-9);
    }
  });
  it('scores identical spectra 1, disjoint 0, and ignores intensity scale', () => {
    const a = weightPeaks([[41, 20], [43, 100], [57, 30]]);
    expect(cosineScore(a, a)).toBeCloseTo(1, 14);
    expect(cosineScore(a, weightPeaks([[50, 1], [51, 2]]))).toBe(0);
    const b = weightPeaks([[41, 2], [43, 10], [58, 3]]);
    const b1000 = weightPeaks([[41, 2000], [43, 10000], [58, 3000]]);
    expect(cosineScore(a, b1000)).toBeCloseTo(cosineScore(a, b), 14);
  });
});
