import { createHash } from 'node:crypto';

import { describe, expect, it } from 'vitest';

import { normalizePeaksForHash, peakContentHash } from '@/lib/spectra/index';

const benzene: [number, number][] = [[39, 120], [50, 160], [51, 185], [52, 195], [77, 250], [78, 999]];

describe('normalizePeaksForHash', () => {
  it('bins to integer m/z, adds within a bin and scales the base peak to 1', () => {
    expect(normalizePeaksForHash([[77.96, 500], [78.04, 499], [51.2, 185], [39, 0]])).toEqual([[51, 0.185], [78, 1]]);
  });

  it('drops bins that round to zero and ignores non-positive intensities', () => {
    expect(normalizePeaksForHash([[78, 1000], [79, 0.4], [80, -5]])).toEqual([[78, 1]]);
  });

  it('rejects non-finite input and bad options', () => {
    expect(() => normalizePeaksForHash([[Number.NaN, 1]])).toThrow(RangeError);
    expect(() => normalizePeaksForHash(benzene, { decimals: -1 })).toThrow(RangeError);
  });
});

describe('peakContentHash', () => {
  it('is SHA-256 of the documented text', () => {
    const text = '39:0.120;50:0.160;51:0.185;52:0.195;77:0.250;78:1.000';
    expect(peakContentHash(benzene)).toBe(createHash('sha256').update(text).digest('hex'));
  });

  it('is the same for the same spectrum scaled, reordered or with fractional m/z', () => {
    const hash = peakContentHash(benzene);
    expect(peakContentHash(benzene.map(([mz, i]) => [mz, (i * 100) / 999] as [number, number]))).toBe(hash);
    expect(peakContentHash([...benzene].reverse())).toBe(hash);
    expect(peakContentHash(benzene.map(([mz, i]) => [mz + 0.03, i] as [number, number]))).toBe(hash);
  });

  it('differs when a peak changes', () => {
    expect(peakContentHash([...benzene.slice(0, 5), [78, 900]])).not.toBe(peakContentHash(benzene));
    expect(peakContentHash([...benzene, [63, 30]])).not.toBe(peakContentHash(benzene));
  });
});
