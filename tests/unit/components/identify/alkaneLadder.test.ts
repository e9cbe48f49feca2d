import { describe, expect, it } from 'vitest';
import { parseAlkaneLadder, riFromLadderText } from '../../../../src/components/identify/alkaneLadder';

describe('parseAlkaneLadder', () => {
  it('reads "C10 6.42", "11 7.5" and "C12: 8.6" lines', () => {
    expect(parseAlkaneLadder('C10 6.42\n11 7.5\nC12: 8.6\n').ladder).toEqual([
      { carbons: 10, rt: 6.42 },
      { carbons: 11, rt: 7.5 },
      { carbons: 12, rt: 8.6 },
    ]);
  });
  it('points at bad lines', () => {
    expect(parseAlkaneLadder('C10 6.4\nten 7').errors).toEqual([{ line: 2, message: '"ten 7" is not "C<carbons> <retention time>"' }]);
  });
});

describe('riFromLadderText', () => {
  it('interpolates linearly between the bracketing n-alkanes (van den Dool and Kratz)', () => {
    // Worked by hand from the formula RI = 100 [n + (t - t_n)/(t_(n+1) - t_n)]: 100 (10 + 0.5) = 1050.
    const r = riFromLadderText(7, 'C10 6\nC11 8');
    expect('ri' in r && r.ri).toBeCloseTo(1050, 9);
  });
  it('explains a retention time outside the ladder', () => {
    const r = riFromLadderText(20, 'C10 6\nC11 8');
    expect('error' in r && r.error).toMatch(/outside the ladder/);
  });
});
