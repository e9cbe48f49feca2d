import { describe, expect, it } from 'vitest';

import { toUnitSpectrum } from '@/lib/chem';

describe('toUnitSpectrum', () => {
  it('merges to unit mass and scales to base peak 100', () => {
    const unit = toUnitSpectrum([
      [91.05, 500],
      [90.95, 500],
      [92.06, 600],
    ]);
    expect(unit.masses).toEqual([91, 92]);
    expect(unit.intensities.get(91)).toBe(100);
    expect(unit.intensities.get(92)).toBeCloseTo(60, 10);
    expect(unit.exactMz.get(91)).toBeCloseTo(91, 10);
  });
  it('rejects bad peaks', () => {
    expect(() => toUnitSpectrum([])).toThrow(/non-empty/);
    expect(() => toUnitSpectrum([[0, 1]])).toThrow(RangeError);
    expect(() => toUnitSpectrum([[Number.NaN, 1]])).toThrow(RangeError);
    expect(() => toUnitSpectrum([[10, Number.POSITIVE_INFINITY]])).toThrow(RangeError);
    expect(() => toUnitSpectrum([[10, 0]])).toThrow(/above zero/);
    // @ts-expect-error malformed on purpose
    expect(() => toUnitSpectrum([[10]])).toThrow(RangeError);
  });
});
