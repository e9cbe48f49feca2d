import { describe, expect, it } from 'vitest';

import { nitrogenRule } from '@/lib/chem';

describe('nitrogenRule', () => {
  // common practice, no source: odd nominal mass of M+• means an odd number of N
  it('pyridine M+• at 79 has an odd number of nitrogens', () => {
    expect(nitrogenRule(79)).toMatchObject({ nominalMass: 79, parity: 'odd', nitrogen: 'odd' });
  });
  it('toluene M+• at 92 has an even number (or none)', () => {
    expect(nitrogenRule(92.0626)).toMatchObject({ nominalMass: 92, parity: 'even', nitrogen: 'even or zero' });
  });
  // common practice, no source: even-electron fragments reverse the rule (C7H7+ at 91 has no N)
  it('is reversed for even-electron fragment ions', () => {
    expect(nitrogenRule(91, { ion: 'evenElectronFragment' }).nitrogen).toBe('even or zero');
    expect(nitrogenRule(30, { ion: 'evenElectronFragment' }).nitrogen).toBe('odd');
  });
  it('says when it applies', () => {
    expect(nitrogenRule(79).note).toMatch(/odd-electron molecular ion/);
  });
  it('rejects bad input', () => {
    expect(() => nitrogenRule(-1)).toThrow(RangeError);
    // @ts-expect-error wrong ion kind on purpose
    expect(() => nitrogenRule(79, { ion: 'fragment' })).toThrow(RangeError);
  });
});
