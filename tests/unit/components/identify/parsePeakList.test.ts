import { describe, expect, it } from 'vitest';
import { formatPeakList, parsePeakList } from '../../../../src/components/identify/parsePeakList';

describe('parsePeakList', () => {
  it('reads one "m/z intensity" pair a line, with blanks, tabs, commas or semicolons', () => {
    const r = parsePeakList('43 100\n57\t62\n71, 20\n85;5\n');
    expect(r.errors).toEqual([]);
    expect(r.form).toBe('pairs');
    expect(r.peaks).toEqual([[43, 100], [57, 62], [71, 20], [85, 5]]);
  });

  it('reads m/z:intensity pairs separated by spaces or commas, over one or several lines', () => {
    const r = parsePeakList('91:100, 92:70 65:12\n39:8');
    expect(r.errors).toEqual([]);
    expect(r.form).toBe('colon');
    expect(r.peaks).toEqual([[39, 8], [65, 12], [91, 100], [92, 70]]);
  });

  it('reads CSV with a header, finding the columns by name in any order', () => {
    const r = parsePeakList('intensity,mz,note\n999,91.05,base\n12.5,65,\n');
    expect(r.errors).toEqual([]);
    expect(r.form).toBe('csv');
    expect(r.peaks).toEqual([[65, 12.5], [91.05, 999]]);
  });

  it('accepts semicolon and tab separated tables with a header', () => {
    expect(parsePeakList('m/z;abundance\n77;30\n78;5').peaks).toEqual([[77, 30], [78, 5]]);
    expect(parsePeakList('mass\tint\n50\t1e3').peaks).toEqual([[50, 1000]]);
  });

  it('keeps any intensity scale as given', () => {
    expect(parsePeakList('50 0.001\n51 0.002').peaks).toEqual([[50, 0.001], [51, 0.002]]);
    expect(parsePeakList('50 123456\n51 9').peaks).toEqual([[50, 123456], [51, 9]]);
  });

  it('points every error at its line', () => {
    const r = parsePeakList('43 100\n\n57 abc\n71 20 3\nfoo\n85 5');
    expect(r.errors.map((e) => e.line)).toEqual([3, 4, 5]);
    expect(r.errors[0].message).toContain('"abc"');
    expect(r.errors[1].message).toContain('3 values');
  });

  it('points at the line of a bad colon pair', () => {
    const r = parsePeakList('41:10 42:x\n43-5');
    expect(r.errors).toEqual([
      { line: 1, message: 'intensity "x" is not a number' },
      { line: 2, message: '"43-5" is not an m/z:intensity pair' },
    ]);
  });

  it('rejects m/z <= 0 and negative intensities, and drops zero intensities with a warning', () => {
    const r = parsePeakList('0 5\n44 -1\n45 0\n46 3');
    expect(r.errors.map((e) => [e.line, e.message])).toEqual([
      [1, 'm/z 0 must be greater than 0'],
      [2, 'intensity -1 must not be negative'],
    ]);
    expect(r.warnings.some((w) => w.message.includes('intensity 0'))).toBe(true);
  });

  it('adds the intensities of a repeated m/z and says so', () => {
    const r = parsePeakList('44 10\n44 5');
    expect(r.peaks).toEqual([[44, 15]]);
    expect(r.warnings[0]).toMatchObject({ line: 2 });
  });

  it('ignores comments and reports an empty text as empty, not as an error', () => {
    expect(parsePeakList('# from the GC-MS\n43 100 # base\n').peaks).toEqual([[43, 100]]);
    expect(parsePeakList('  \n\n')).toMatchObject({ form: 'empty', errors: [] });
  });

  it('says so when only zero intensities were given', () => {
    expect(parsePeakList('40 0').errors[0].message).toContain('no peak');
  });

  it('enforces the peak limit', () => {
    const text = Array.from({ length: 12 }, (_, i) => `${i + 1} 1`).join('\n');
    expect(parsePeakList(text, { maxPeaks: 10 }).errors[0].message).toContain('12 peaks');
  });

  it('formats peaks back into text that parses to the same peaks', () => {
    const peaks: [number, number][] = [[39, 8.25], [91.0547, 100], [92, 70]];
    expect(parsePeakList(formatPeakList(peaks)).peaks).toEqual(peaks);
    expect(formatPeakList([[50, 2], [51, 4]], true)).toBe('50 50\n51 100');
  });
});
