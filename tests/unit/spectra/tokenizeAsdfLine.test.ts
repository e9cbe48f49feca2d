import { describe, expect, it } from 'vitest';

import { tokenizeAsdfLine } from '@/lib/spectra/index';

// ASDF pseudo-digits: McDonald and Wilks, Appl. Spectrosc. 42 (1988) 151, table I
function values(line: string) {
  const result = tokenizeAsdfLine(line);
  if (!result.ok) throw new Error(result.error);
  return result.tokens.map((token) => [token.kind, token.value]);
}

describe('tokenizeAsdfLine', () => {
  it('reads AFFN separated by blanks and commas, with E exponents', () => {
    expect(values('37 40,55  1.5E2 -2e-1')).toEqual([
      ['value', 37], ['value', 40], ['value', 55], ['value', 150], ['value', -0.2],
    ]);
  });

  it('reads PAC, where the sign separates', () => {
    expect(values('37+40-55+120')).toEqual([['value', 37], ['value', 40], ['value', -55], ['value', 120]]);
  });

  it('reads SQZ digits @, A-I, a-i', () => {
    expect(values('37@A1i9E5')).toEqual([['value', 37], ['value', 0], ['value', 11], ['value', -99], ['value', 55]]);
  });

  it('reads DIF digits %, J-R, j-r and DUP counts S-Z, s', () => {
    expect(values('10A%J0j5R2S1sZ')).toEqual([
      ['value', 10], ['value', 1], ['dif', 0], ['dif', 10], ['dif', -15], ['dif', 92], ['dup', 11], ['dup', 9], ['dup', 8],
    ]);
  });

  it('reads ? as a missing value', () => {
    expect(values('29 80 ? 999')).toEqual([['value', 29], ['value', 80], ['missing', Number.NaN], ['value', 999]]);
  });

  it('rejects characters outside the grammar, naming them', () => {
    const result = tokenizeAsdfLine('10 20 #30');
    expect(result).toEqual({ ok: false, error: expect.stringContaining('unexpected character "#"') });
    expect(tokenizeAsdfLine('10 2..0')).toEqual({ ok: false, error: expect.stringContaining('two decimal points') });
    expect(tokenizeAsdfLine('10 - 3')).toEqual({ ok: false, error: expect.stringContaining('no digits') });
  });
});
