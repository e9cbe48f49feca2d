import { describe, expect, it } from 'vitest';

import { checkXyLineStarts, decodeXyData } from '@/lib/spectra/index';

// DIF Y-check and X checks: McDonald and Wilks, Appl. Spectrosc. 42 (1988) 151
function decode(lines: string[], xFactor = 1) {
  return decodeXyData(lines, lines.map((_, i) => i + 1), { xFactor });
}

describe('decodeXyData', () => {
  it('applies DIF, then compares and drops the Y-check value', () => {
    const result = decode(['37D0J5O5j10j0%%%', '44@Nn%QK2J30K5J0', '52A95']);
    expect(result.ok).toBe(true);
    if (!result.ok) return;
    expect(result.y).toEqual([40, 55, 120, 10, 0, 0, 0, 0, 5, 0, 0, 8, 30, 160, 185, 195]);
    expect(result.lastLineUnchecked).toBe(false);
    expect(result.lineStarts.map((start) => [start.x, start.index])).toEqual([[37, 0], [44, 7], [52, 15]]);
  });

  it('repeats a difference with DUP', () => {
    const result = decode(['10@J0T', '13B0']);
    expect(result).toMatchObject({ ok: true, y: [0, 10, 20] });
  });

  it('rejects a failed Y-check, saying which line', () => {
    const result = decode(['37D0J5O5j10j0%%%', '44A@Nn%QK2J30K5J0', '52A95']);
    expect(result).toEqual({ ok: false, error: expect.stringMatching(/^line 2: DIF Y-check failed/) });
  });

  it('rejects a line after DIF that does not start with an absolute Y', () => {
    const result = decode(['10@J0', '11J0']);
    expect(result).toEqual({ ok: false, error: expect.stringContaining('Y-check value') });
  });

  it('rejects a difference with nothing before it and DUP with nothing to repeat', () => {
    expect(decode(['10 ?J2'])).toEqual({ ok: false, error: expect.stringContaining('no previous value') });
    expect(decode(['10T'])).toEqual({ ok: false, error: expect.stringContaining('nothing to repeat') });
  });

  it('rejects a line with an X value only', () => {
    expect(decode(['10'])).toEqual({ ok: false, error: expect.stringContaining('without Y values') });
  });

  it('reports a last line that ends in DIF without its Y-check', () => {
    expect(decode(['10@J0J0'])).toMatchObject({ ok: true, y: [0, 10, 20], lastLineUnchecked: true });
  });

  it('rejects a number too large to be finite', () => {
    expect(decode([`10 ${'9'.repeat(400)}`])).toEqual({ ok: false, error: expect.stringContaining('not a finite number') });
  });

  it('stops a runaway repeat count', () => {
    const result = decodeXyData(['10 1 S99999999'], [1], { maxPoints: 1000 });
    expect(result).toEqual({ ok: false, error: expect.stringContaining('more than 1000 data points') });
  });
});

describe('checkXyLineStarts', () => {
  it('accepts X values on FIRSTX + i * DELTAX, within rounding', () => {
    expect(checkXyLineStarts([{ line: 1, x: 37, index: 0, rounding: 1 }, { line: 2, x: 45, index: 8, rounding: 1 }], 37, 1)).toBeNull();
    // 0.1-spaced data written with X rounded to integers
    expect(checkXyLineStarts([{ line: 3, x: 50, index: 5, rounding: 1 }], 49.6, 0.1)).toBeNull();
  });

  it('names the line whose X strays', () => {
    expect(checkXyLineStarts([{ line: 9, x: 46, index: 8, rounding: 1 }], 37, 1)).toMatch(
      /^line 9: the X at the line start is 46 but FIRSTX \+ 8 \* DELTAX is 45/,
    );
  });
});
