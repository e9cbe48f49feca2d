import { describe, expect, it } from 'vitest';

import { readJcamp, validateFileName } from '@/lib/spectra/index';

import { fixture } from './helpers';

describe('validateFileName', () => {
  it.each(['benzene.jdx', 'Run 2291 (bench 2).dx', 'acétone.jcamp'])('accepts %s', (name) => {
    expect(validateFileName(name)).toEqual({ ok: true });
  });

  it.each([
    ['../etc/passwd', 'path separator'],
    ['spectra/benzene.jdx', 'path separator'],
    ['C:\\spectra\\benzene.jdx', 'path separator'],
    ['bad\u0000name.jdx', 'control character'],
    ['line\nbreak.jdx', 'control character'],
    ['del\u007f.jdx', 'control character'],
    ['', 'empty'],
    ['..', 'not a file'],
    ['   ', 'blank'],
    ['x'.repeat(256), 'longer than 255'],
  ])('rejects %j (%s)', (name, reason) => {
    const result = validateFileName(name);
    expect(result.ok).toBe(false);
    if (!result.ok) expect(result.error).toContain(reason);
  });

  it('makes readJcamp reject the file before reading it', () => {
    const result = readJcamp(fixture('peak-table-xy.jdx'), { fileName: 'a/b.jdx' });
    expect(result).toEqual({ ok: false, error: expect.stringContaining('path separator') });
  });

  it('checks its option', () => {
    expect(() => validateFileName('a', { maxLength: 0 })).toThrow(RangeError);
  });
});
