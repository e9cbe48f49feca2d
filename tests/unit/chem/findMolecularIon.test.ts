import { describe, expect, it } from 'vitest';

import { findMolecularIon, type Peak } from '@/lib/chem';

import { bromobenzene, chlorobenzene, chloroform, referenceCluster, toluene } from './referenceSpectra';

describe('findMolecularIon', () => {
  // common practice, no source: M is the lightest member of the highest-mass significant cluster
  it.each([
    ['toluene', toluene, 92],
    ['chlorobenzene', chlorobenzene, 112],
    ['bromobenzene', bromobenzene, 156],
    ['chloroform', chloroform, 118],
  ] as Array<[string, Peak[], number]>)('finds M of %s at %i', (_name, peaks, mz) => {
    const ion = findMolecularIon(peaks);
    expect(ion?.mz).toBe(mz);
    expect(ion!.confidence).toBeGreaterThan(0.8);
    expect(ion!.reasons.length).toBeGreaterThan(0);
  });

  // common practice, no source: losses of 3-14 u are unusual, so the top peak is doubted
  it('doubts a candidate when a loss of 3-14 u is implied', () => {
    const peaks: Peak[] = [...referenceCluster('C10H14O', 30), [140, 80], [91, 100]];
    const ion = findMolecularIon(peaks);
    expect(ion?.mz).toBe(150);
    expect(ion!.confidence).toBeLessThan(0.7);
    expect(ion!.reasons.join(' ')).toMatch(/unusual loss of 10 u/);
  });

  // common practice, no source: 19 (F) and 20 (HF) are real losses
  it('does not doubt losses of 19 and 20', () => {
    const peaks: Peak[] = [...referenceCluster('C7H7F', 80), [91, 100], [90, 30]];
    const ion = findMolecularIon(peaks);
    expect(ion?.mz).toBe(110);
    expect(ion!.confidence).toBeGreaterThan(0.8);
  });

  it('answers null when nothing looks like a molecular ion', () => {
    const peaks: Peak[] = [[200, 0.8], [195, 40], [192, 50], [188, 60], [100, 100]];
    expect(findMolecularIon(peaks)).toBeNull();
    expect(findMolecularIon(peaks, { minConfidence: 0 })?.mz).toBe(200);
  });

  it('rejects bad input', () => {
    expect(() => findMolecularIon([])).toThrow(RangeError);
    expect(() => findMolecularIon([[-5, 10]])).toThrow(/m\/z/);
  });
});
