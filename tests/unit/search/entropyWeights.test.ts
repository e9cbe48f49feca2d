import { describe, expect, it } from 'vitest';
import { entropyWeights, spectralEntropy } from '../../../src/lib/search/entropyWeights';

describe('entropyWeights', () => {
  it('sum-normalizes and reweights a low-entropy spectrum by I^(0.25 + 0.25 S)', () => {
    // Li et al. 2021, Nat. Methods 18:1524: intensity weighting for S < 3.
    const out = entropyWeights([[10, 3], [20, 1]]);
    const s = -(0.75 * Math.log(0.75) + 0.25 * Math.log(0.25));
    const w = 0.25 + 0.25 * s;
    const a = 0.75 ** w;
    const b = 0.25 ** w;
    expect(out[0][1]).toBeCloseTo(a / (a + b), 12);
    expect(out[1][1]).toBeCloseTo(b / (a + b), 12);
    expect(out[0][1]).toBeCloseTo(0.605658771438921, 12);
  });
  it('leaves a high-entropy spectrum (S >= 3) sum-normalized only', () => {
    const flat = Array.from({ length: 30 }, (_, i) => [30 + i, 1] as [number, number]);
    expect(spectralEntropy(flat.map(() => 1 / 30))).toBeGreaterThan(3);
    for (const p of entropyWeights(flat)) expect(p[1]).toBeCloseTo(1 / 30, 14);
  });
});
