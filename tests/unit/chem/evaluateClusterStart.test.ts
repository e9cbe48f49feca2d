import { describe, expect, it } from 'vitest';

import { evaluateClusterStart, toUnitSpectrum } from '@/lib/chem';

import { chlorobenzene, toluene } from './referenceSpectra';

describe('evaluateClusterStart', () => {
  // common practice, no source: M+1 of a C7 compound is about 8 %, so 92 at 60 % of 91 is no isotope peak
  it('refuses 91 as the start of the toluene M cluster', () => {
    const result = evaluateClusterStart(toUnitSpectrum(toluene), 91);
    expect(result.acceptable).toBe(false);
    expect(result.reasons[0]).toMatch(/more than an M\+1/);
  });
  it('accepts 92 in toluene and 112 in chlorobenzene', () => {
    expect(evaluateClusterStart(toUnitSpectrum(toluene), 92).acceptable).toBe(true);
    const cl = evaluateClusterStart(toUnitSpectrum(chlorobenzene), 112);
    expect(cl.acceptable).toBe(true);
    expect(cl.halogens?.Cl).toBe(1);
  });
  it('refuses a start without a peak', () => {
    expect(evaluateClusterStart(toUnitSpectrum(toluene), 94).acceptable).toBe(false);
    const none = evaluateClusterStart(toUnitSpectrum(toluene), 120);
    expect(none.acceptable).toBe(false);
    expect(none.halogens).toBeNull();
  });
});
