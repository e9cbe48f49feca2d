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

describe('annotateLosses with the compound formula', () => {
  it('keeps only losses the formula can afford (an alkane loses no O or F)', () => {
    // common practice, no source: nonane M 128 loses CH3 (113) and C2H5 (99), not OH (111) or HF
    const peaks: [number, number][] = [[43, 100], [57, 70], [71, 40], [85, 25], [99, 12], [109, 3], [111, 2], [113, 6], [128, 8]];
    const all = annotateLosses(peaks, 128);
    const restricted = annotateLosses(peaks, 128, { formula: 'C9H20' });
    expect(all.some((l) => l.toMz === 111)).toBe(true);
    expect(restricted.some((l) => l.toMz === 111)).toBe(false);
    expect(restricted.find((l) => l.toMz === 113)?.composition).toBe('CH3');
    expect(restricted.find((l) => l.toMz === 99)?.composition).not.toMatch(/O/);
    for (const l of restricted) expect(l.composition).not.toMatch(/[OFNS]|Cl|Br/);
  });
});
