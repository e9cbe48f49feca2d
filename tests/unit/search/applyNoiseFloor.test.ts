import { describe, expect, it } from 'vitest';
import { applyNoiseFloor } from '../../../src/lib/search/applyNoiseFloor';

describe('applyNoiseFloor', () => {
  it('is off by default and drops peaks below the floor when set', () => {
    const peaks: [number, number][] = [[41, 0.004], [43, 1], [57, 0.01]];
    expect(applyNoiseFloor(peaks)).toEqual(peaks);
    expect(applyNoiseFloor(peaks, 0.005)).toEqual([[43, 1], [57, 0.01]]);
  });
  it('rejects a floor outside [0, 1)', () => {
    expect(() => applyNoiseFloor([], 1)).toThrow(/noiseFloor/);
  });
});
