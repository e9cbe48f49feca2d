import { describe, expect, it } from 'vitest';

import { decodeText } from '@/lib/spectra/index';

import { fixtureBytes } from './helpers';

describe('decodeText', () => {
  it('reads UTF-8 and strips a byte-order mark', () => {
    const bytes = new Uint8Array([0xef, 0xbb, 0xbf, ...new TextEncoder().encode('##TITLE= Acétone\n')]);
    expect(decodeText(bytes)).toBe('##TITLE= Acétone\n');
  });

  it('falls back to Latin-1 when the bytes are not UTF-8', () => {
    // "é" in Latin-1 is the single byte 0xE9, which is not valid UTF-8 on its own
    expect(decodeText(new Uint8Array([0x41, 0x63, 0xe9, 0x74, 0x6f, 0x6e, 0x65]))).toBe('Acétone');
  });

  it('turns CRLF and lone CR into LF', () => {
    expect(decodeText(new TextEncoder().encode('a\r\nb\rc\n'))).toBe('a\nb\nc\n');
  });

  it('reads UTF-16 with a byte-order mark', () => {
    const text = '##TITLE= x\n';
    const bytes = new Uint8Array(2 + text.length * 2);
    bytes[0] = 0xff;
    bytes[1] = 0xfe;
    for (let i = 0; i < text.length; i++) bytes[2 + 2 * i] = text.charCodeAt(i);
    expect(decodeText(bytes)).toBe(text);
  });

  it('gives the same text for the Latin-1 and the UTF-8 fixture', () => {
    const latin1 = decodeText(fixtureBytes('latin1-crlf.jdx'));
    const utf8 = decodeText(fixtureBytes('utf8-bom-crlf.jdx'));
    expect(latin1).toBe(utf8);
    expect(latin1).toContain('Hélène Müller');
    expect(latin1).not.toContain('\r');
  });

  it('rejects what is not bytes', () => {
    expect(() => decodeText('text' as unknown as Uint8Array)).toThrow(RangeError);
  });
});
