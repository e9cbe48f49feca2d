import { describe, expect, it } from 'vitest';

import { hillAtoms, toHill } from '@/lib/chem';

describe('toHill / hillAtoms', () => {
  // Hill system (Hill 1900, J. Am. Chem. Soc. 22:478)
  it('orders C, H, then alphabetically', () => {
    expect(toHill({ Br: 1, H: 5, C: 6 })).toBe('C6H5Br');
    expect(toHill({ O: 2, S: 1, H: 6, C: 2 })).toBe('C2H6O2S');
  });
  it('orders all alphabetically without carbon', () => {
    expect(toHill({ H: 1, Cl: 1 })).toBe('ClH');
    expect(toHill({ O: 4, H: 3, P: 1 })).toBe('H3O4P');
  });
  it('puts labels after their element', () => {
    expect(hillAtoms({ C: 2, H: 6 }, { '2H': 3 })).toEqual([
      { symbol: 'C', count: 2 },
      { symbol: 'H', count: 3 },
      { symbol: 'H', isotope: 2, count: 3 },
    ]);
  });
  it('rejects non-integer counts', () => {
    expect(() => toHill({ C: 1.5 })).toThrow(RangeError);
  });
});
