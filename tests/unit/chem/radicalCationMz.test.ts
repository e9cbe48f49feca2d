import { describe, expect, it } from 'vitest';

import { ELECTRON_MASS, monoisotopicMass, radicalCationMz } from '@/lib/chem';

describe('radicalCationMz', () => {
  // CODATA 2018: electron mass 5.48579909065e-4 u
  it('subtracts one electron mass', () => {
    expect(ELECTRON_MASS).toBeCloseTo(0.00054857990907, 9);
    expect(monoisotopicMass('C7H8') - radicalCationMz('C7H8')).toBeCloseTo(0.00054858, 9);
  });
  // AME2020 / NIST isotope masses: toluene M+• 92.0626 - 0.000549
  it('gives toluene M+• at 92.062051', () => {
    expect(radicalCationMz('C7H8')).toBeCloseTo(92.0626 - 0.000549, 4);
  });
});
