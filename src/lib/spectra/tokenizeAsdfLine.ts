/** One value of an XYDATA line in ASDF (AFFN, PAC, SQZ, DIF or DUP form). */
export interface AsdfToken {
  kind: 'value' | 'dif' | 'dup' | 'missing';
  /** The number (a DUP's repeat count); NaN for `?`. */
  value: number;
  /** Digits after the decimal point, as written (for X rounding tolerance). */
  decimals: number;
  /** The characters of the token, as written. */
  text: string;
}

export type TokenizeAsdfLineResult =
  | { ok: true; tokens: AsdfToken[] }
  | { ok: false; error: string };

const AFFN_NUMBER = /^[+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?$/;

/**
 * Split one line of `(X++(Y..Y))` data into values, following the ASDF
 * grammar (McDonald and Wilks, Appl. Spectrosc. 42 (1988) 151, table I):
 * AFFN numbers separated by blanks or commas, PAC numbers separated by their
 * sign, SQZ pseudo-digits `@ A-I a-i` (value 0, +1..+9, -1..-9), DIF `% J-R
 * j-r` (difference 0, +1..+9, -1..-9), DUP `S-Z s` (count 1..9), and `?` for
 * a missing value. An E exponent is read only on a line that is plain AFFN,
 * because `E` is also the SQZ digit +5.
 * @param line - the line, `$$` comment already removed.
 * @returns the tokens, or an error naming the character.
 */
export function tokenizeAsdfLine(line: string): TokenizeAsdfLineResult {
  const tokens: AsdfToken[] = [];
  const fields = line.trim().split(/[\s,]+/).filter(Boolean);
  if (fields.length > 0 && fields.every((field) => AFFN_NUMBER.test(field) || field === '?')) {
    for (const field of fields) {
      if (field === '?') {
        tokens.push({ kind: 'missing', value: Number.NaN, decimals: 0, text: field });
        continue;
      }
      tokens.push({ kind: 'value', value: Number(field), decimals: decimalsOf(field), text: field });
    }
    return { ok: true, tokens };
  }

  let kind: AsdfToken['kind'] | null = null;
  let digits = '';
  let text = '';
  const flush = (): string | null => {
    if (kind === null) return null;
    if (kind !== 'missing' && !/\d/.test(digits)) {
      return `"${text}" has no digits`;
    }
    if (/\..*\./.test(digits)) return `"${text}" has two decimal points`;
    const value = kind === 'missing' ? Number.NaN : Number(digits);
    tokens.push({ kind, value, decimals: decimalsOf(digits), text });
    kind = null;
    digits = '';
    text = '';
    return null;
  };
  for (let i = 0; i < line.length; i++) {
    const ch = line[i];
    const code = line.charCodeAt(i);
    let startKind: AsdfToken['kind'] | null = null;
    let startDigits = '';
    if (ch === ' ' || ch === '\t' || ch === ',') {
      const error = flush();
      if (error) return { ok: false, error };
      continue;
    } else if ((ch >= '0' && ch <= '9') || ch === '.') {
      if (kind === null || kind === 'missing') {
        const error = flush();
        if (error) return { ok: false, error };
        kind = 'value';
      }
      digits += ch;
      text += ch;
      continue;
    } else if (ch === '+' || ch === '-') {
      startKind = 'value';
      startDigits = ch === '-' ? '-' : '';
    } else if (ch === '?') {
      startKind = 'missing';
    } else if (ch === '@') {
      startKind = 'value';
      startDigits = '0';
    } else if (code >= 65 && code <= 73) {
      startKind = 'value';
      startDigits = String(code - 64);
    } else if (code >= 97 && code <= 105) {
      startKind = 'value';
      startDigits = `-${code - 96}`;
    } else if (ch === '%') {
      startKind = 'dif';
      startDigits = '0';
    } else if (code >= 74 && code <= 82) {
      startKind = 'dif';
      startDigits = String(code - 73);
    } else if (code >= 106 && code <= 114) {
      startKind = 'dif';
      startDigits = `-${code - 105}`;
    } else if (code >= 83 && code <= 90) {
      startKind = 'dup';
      startDigits = String(code - 82);
    } else if (ch === 's') {
      startKind = 'dup';
      startDigits = '9';
    } else {
      return {
        ok: false,
        error: `unexpected character "${printable(ch)}" at column ${i + 1}`,
      };
    }
    const error = flush();
    if (error) return { ok: false, error };
    kind = startKind;
    digits = startDigits;
    text = ch;
  }
  const error = flush();
  if (error) return { ok: false, error };
  return { ok: true, tokens };
}

function decimalsOf(number: string): number {
  const mantissa = number.split(/[eE]/)[0];
  const dot = mantissa.indexOf('.');
  const decimals = dot === -1 ? 0 : mantissa.length - dot - 1;
  const exponent = /[eE]([+-]?\d+)$/.exec(number);
  return exponent ? decimals - Number(exponent[1]) : decimals;
}

function printable(ch: string): string {
  const code = ch.charCodeAt(0);
  return code < 32 || code === 127 ? `\\u${code.toString(16).padStart(4, '0')}` : ch;
}
