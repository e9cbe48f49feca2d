import { describe, expect, it } from 'vitest';
import { bruteForceSearch } from '../../../src/lib/search/bruteForceSearch';
import { cosineScore } from '../../../src/lib/search/cosineScore';
import { weightPeaks } from '../../../src/lib/search/weightPeaks';
import type { LibraryEntry } from '../../../src/lib/search/types';

const entry = (id: number, recordId: number, peaks: [number, number][]): LibraryEntry => ({
  spectrumId: id, recordId, version: 1, name: `s${id}`, formula: null, nominalMass: null, ihd: null, elements: [], tags: [], status: 'released', ri: [], peaks,
});

describe('bruteForceSearch', () => {
  it('ranks by score, breaks ties by record id, and leaves out spectra sharing no peak', () => {
    const lib = [entry(1, 30, [[41, 1], [43, 2]]), entry(2, 10, [[41, 1], [43, 2]]), entry(3, 20, [[41, 2], [43, 1]]), entry(4, 5, [[99, 1]])];
    const res = bruteForceSearch(lib, [[41, 1], [43, 2]], { rankBy: 'cosine' });
    expect(res.hits.map((h) => h.recordId)).toEqual([10, 30, 20]);
    expect(res.searched).toBe(4);
    const expected = cosineScore(weightPeaks([[41, 1], [43, 2]]), weightPeaks([[41, 1], [43, 0.5]]));
    expect(res.hits[2].scores.cosine).toBeCloseTo(expected, 6);
  });
});
