import { describe, expect, it } from 'vitest';

import { casCheckDigitValid } from '@/lib/spectra/index';

describe('casCheckDigitValid', () => {
  // registry numbers of water, benzene, toluene, acetone, chlorobenzene (from memory),
  // each checked by hand with CAS's rule: sum of digit x position from the right, mod 10
  it.each(['7732-18-5', '71-43-2', '108-88-3', '67-64-1', '108-90-7'])('accepts %s', (cas) => {
    expect(casCheckDigitValid(cas)).toBe(true);
  });

  it.each(['71-43-3', '7732-18-4', '108-88-0'])('rejects the wrong check digit in %s', (cas) => {
    expect(casCheckDigitValid(cas)).toBe(false);
  });

  it.each(['', '71432', '71-4-2', '12345678-12-1', 'abc-de-f', '71 - 43 - 2'])('rejects the malformed "%s"', (cas) => {
    expect(casCheckDigitValid(cas)).toBe(false);
  });

  it('ignores surrounding blanks', () => {
    expect(casCheckDigitValid(' 71-43-2 ')).toBe(true);
  });
});
