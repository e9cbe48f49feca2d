import { describe, expect, it } from 'vitest';

import { retentionIndex } from '@/lib/chem';

const ladder = [
  { carbons: 8, rt: 4.0 },
  { carbons: 9, rt: 6.0 },
  { carbons: 10, rt: 8.5 },
  { carbons: 12, rt: 13.5 },
];

describe('retentionIndex', () => {
  // van den Dool & Kratz 1963, J. Chromatogr. 11:463; worked by hand:
  // t = 7.25 between C9 (6.0) and C10 (8.5): 100 (9 + 1.25 / 2.5) = 950
  it('interpolates between neighbouring n-alkanes', () => {
    expect(retentionIndex(7.25, ladder)).toBeCloseTo(950, 10);
  });
  // worked by hand: t = 11.0 between C10 (8.5) and C12 (13.5), gap form:
  // 100 (10 + (12 - 10)(11.0 - 8.5) / (13.5 - 8.5)) = 1100
  it('uses the gap form where the ladder skips carbon numbers', () => {
    expect(retentionIndex(11.0, ladder)).toBeCloseTo(1100, 10);
    expect(retentionIndex(9.75, ladder)).toBeCloseTo(1050, 10);
  });
  it('gives 100 n at an alkane', () => {
    expect(retentionIndex(6.0, ladder)).toBe(900);
    expect(retentionIndex(4.0, ladder)).toBe(800);
    expect(retentionIndex(13.5, ladder)).toBe(1200);
  });
  it('accepts the ladder in any order', () => {
    expect(retentionIndex(7.25, [...ladder].reverse())).toBeCloseTo(950, 10);
  });
  it('refuses times outside the ladder, saying so', () => {
    expect(() => retentionIndex(3.9, ladder)).toThrow(/outside the ladder \(C8 at 4 to C12 at 13.5\)/);
    expect(() => retentionIndex(14, ladder)).toThrow(RangeError);
  });
  it('refuses malformed ladders', () => {
    expect(() => retentionIndex(5, [{ carbons: 8, rt: 4 }])).toThrow(RangeError);
    expect(() => retentionIndex(5, [{ carbons: 8, rt: 4 }, { carbons: 9, rt: 3 }])).toThrow(/increase/);
    expect(() => retentionIndex(5, [{ carbons: 8, rt: 4 }, { carbons: 8, rt: 6 }])).toThrow(/twice/);
  });
});
