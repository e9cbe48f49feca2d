import { IsotopicDistribution } from 'isotopic-distribution';
import { describe, expect, it } from 'vitest';

import { parseFormula, unitIsotopePattern } from '@/lib/chem';

// isotopic-distribution (npm) as an independent reference: its peaks summed per nominal offset
function reference(mf: string, length: number): number[] {
  const peaks = new IsotopicDistribution(mf, { fwhm: 0.3 }).getPeaks({ sumValue: 1 }) as Array<{ x: number; y: number }>;
  const first = Math.min(...peaks.map((p) => p.x));
  const out = new Array<number>(length).fill(0);
  for (const p of peaks) {
    const offset = Math.round(p.x - first);
    if (offset < length) out[offset] += p.y;
  }
  return out;
}

describe('unitIsotopePattern', () => {
  it.each(['C6H5Cl', 'CHCl3', 'C6H4Br2', 'C8H10N4O2', 'C4H4S', 'C8H24O4Si4', 'C12H4Cl4O2', 'C2H2Br2Cl2', 'C20H42', 'C6Br6'])(
    '%s agrees with isotopic-distribution to 1e-4',
    (mf) => {
      const mine = Array.from(unitIsotopePattern(parseFormula(mf).elements, { length: 14 }));
      const ref = reference(mf, 14);
      const sumMine = mine.reduce((a, b) => a + b, 0);
      const sumRef = ref.reduce((a, b) => a + b, 0);
      for (let i = 0; i < 14; i++) expect(Math.abs(mine[i] / sumMine - ref[i] / sumRef)).toBeLessThan(1e-4);
    },
  );

  it('rejects bad arguments', () => {
    expect(() => unitIsotopePattern({ C: 1.5 })).toThrow(RangeError);
    expect(() => unitIsotopePattern({ C: 1 }, { length: 0 })).toThrow(RangeError);
  });
});
