import { describe, expect, it } from 'vitest';
import { applyLowMassCutoff } from '../../../src/lib/search/applyLowMassCutoff';

describe('applyLowMassCutoff', () => {
  it('drops peaks below the cutoff and keeps the cutoff itself', () => {
    expect(applyLowMassCutoff([[28, 1], [40, 1], [41, 1]], 40)).toEqual([[40, 1], [41, 1]]);
    expect(applyLowMassCutoff([[28, 1]])).toEqual([[28, 1]]);
  });
  it('rejects a negative cutoff', () => {
    expect(() => applyLowMassCutoff([], -1)).toThrow(/lowMassCutoff/);
  });
});
