import { describe, expect, it } from 'vitest';
import { resolveIndexOptions, resolveSearchOptions } from '../../../src/lib/search/options';

describe('resolveSearchOptions', () => {
  it('applies the defaults: composite, m/z^3 I^0.6, limit 50, stored weights usable', () => {
    const o = resolveSearchOptions();
    expect(o).toMatchObject({ rankBy: 'composite', weights: { mz: 3, intensity: 0.6 }, limit: 50, lowMassCutoff: 0, excludeBins: [], stored: true });
  });
  it('marks searches that need the library re-preprocessed', () => {
    expect(resolveSearchOptions({ weights: { mz: 1, intensity: 0.5 } }).stored).toBe(false);
    expect(resolveSearchOptions({ excludeIons: [44.2, 18] }).excludeBins).toEqual([18, 44]);
  });
  it('rejects bad values naming the option', () => {
    expect(() => resolveSearchOptions({ rankBy: 'x' as never })).toThrow(/rankBy/);
    expect(() => resolveSearchOptions({ limit: 1.5 })).toThrow(/limit/);
    expect(() => resolveSearchOptions({ noiseFloor: 2 })).toThrow(/noiseFloor/);
    expect(() => resolveIndexOptions({ tolerance: -1 })).toThrow(/tolerance/);
  });
});
