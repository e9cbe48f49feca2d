import { describe, expect, it } from 'vitest';
import { csvField, toCsv } from '../../../src/lib/records/toCsv';

describe('csvField / toCsv (RFC 4180)', () => {
  it('quotes fields with commas, quotes or line breaks and doubles inner quotes', () => {
    expect(csvField('a,b')).toBe('"a,b"');
    expect(csvField('say "hi"')).toBe('"say ""hi"""');
    expect(csvField('two\nlines')).toBe('"two\nlines"');
  });
  it('writes numbers plainly and empty cells for null', () => {
    expect(csvField(91.05)).toBe('91.05');
    expect(csvField(-3)).toBe('-3');
    expect(csvField(null)).toBe('');
    expect(csvField(Number.NaN)).toBe('');
  });
  it('defuses text a spreadsheet would run as a formula', () => {
    expect(csvField('=HYPERLINK("x")')).toBe('"\'=HYPERLINK(""x"")"');
    expect(csvField('+1')).toBe('+1');
    expect(csvField('@SUM(A1)')).toBe("'@SUM(A1)");
  });
  it('joins rows with CRLF, header first', () => {
    expect(toCsv(['mz', 'intensity'], [[41, 10], [43, 100]])).toBe('mz,intensity\r\n41,10\r\n43,100\r\n');
  });
});
