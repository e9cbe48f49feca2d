import { describe, expect, it } from 'vitest';

import { annotateFragments } from '@/lib/chem';

import { toluene } from './referenceSpectra';

describe('annotateFragments', () => {
  // common practice, no source: 91 tropylium, 65 C5H5+, 39 C3H3+ in alkylbenzenes
  it('marks the tropylium series of toluene', () => {
    const fragments = annotateFragments(toluene);
    const mz = fragments.map((f) => f.mz);
    expect(mz).toEqual(expect.arrayContaining([39, 65, 91]));
    expect(fragments.find((f) => f.mz === 91)?.composition).toBe('C7H7');
  });
  it('skips peaks below the threshold', () => {
    expect(annotateFragments(toluene, { minRelative: 50 }).map((f) => f.mz)).toEqual([91, 92]);
  });
  it('rejects bad options', () => {
    expect(() => annotateFragments(toluene, { minRelative: -1 })).toThrow(RangeError);
  });
});
