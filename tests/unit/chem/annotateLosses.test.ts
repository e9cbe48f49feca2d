import { describe, expect, it } from 'vitest';

import { annotateLosses } from '@/lib/chem';

import { chlorobenzene, toluene } from './referenceSpectra';

describe('annotateLosses', () => {
  // common practice, no source: chlorobenzene 112 -> 77 is a loss of Cl
  it('marks the loss of Cl from chlorobenzene', () => {
    const losses = annotateLosses(chlorobenzene, 112);
    expect(losses).toContainEqual(expect.objectContaining({ fromMz: 112, toMz: 77, loss: 35, composition: 'Cl' }));
  });
  // common practice, no source: toluene 92 -> 91 (H), 92 -> 65 (C2H3 + ... read as 27)
  it('marks H loss and 27 from toluene', () => {
    const losses = annotateLosses(toluene, 92);
    expect(losses[0]).toMatchObject({ toMz: 91, loss: 1, composition: 'H' });
    expect(losses.map((l) => l.loss)).toContain(27);
  });
  it('rejects bad input', () => {
    expect(() => annotateLosses(toluene, 0)).toThrow(RangeError);
    expect(() => annotateLosses([], 92)).toThrow(RangeError);
  });
});
