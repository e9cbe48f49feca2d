export type PeakTableForm = 'XY' | 'XYW';

export type ParsePeakTableResult =
  | {
      ok: true;
      /** Values as written (before XFACTOR / YFACTOR); NaN where the file has `?`. */
      x: number[];
      y: number[];
    }
  | { ok: false; error: string };

const NUMBER = /^[+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?$/;

/**
 * Read the lines of a `(XY..XY)` or `(XYW..XYW)` peak table: groups
 * separated by blanks or `;`, values inside a group by commas or blanks
 * (McDonald and Wilks, Appl. Spectrosc. 42 (1988) 151; for mass spectra
 * Lampen et al., Appl. Spectrosc. 48 (1994) 1545). A group must not be
 * split across lines. W (peak width) is read and dropped.
 * @param lines - the table's lines, `$$` comments removed.
 * @param lineNumbers - their 1-based line numbers, for messages.
 * @param form - the variable list of the table.
 * @returns the raw x and y values, or the first error with its line.
 */
export function parsePeakTable(
  lines: string[],
  lineNumbers: number[],
  form: PeakTableForm,
): ParsePeakTableResult {
  const width = form === 'XY' ? 2 : 3;
  const x: number[] = [];
  const y: number[] = [];
  for (let l = 0; l < lines.length; l++) {
    const where = `line ${lineNumbers[l] ?? l + 1}`;
    const fields = lines[l].trim().split(/[\s,;]+/).filter(Boolean);
    if (fields.length === 0) continue;
    if (fields.length % width !== 0) {
      return {
        ok: false,
        error: `${where}: ${fields.length} values do not make whole (${form}) groups of ${width}`,
      };
    }
    for (let f = 0; f < fields.length; f += width) {
      const group = fields.slice(f, f + width);
      const values: number[] = [];
      for (const field of group) {
        if (field === '?') {
          values.push(Number.NaN);
          continue;
        }
        if (!NUMBER.test(field)) {
          return { ok: false, error: `${where}: "${field}" is not a number` };
        }
        const value = Number(field);
        if (!Number.isFinite(value)) {
          return { ok: false, error: `${where}: "${field}" is not a finite number` };
        }
        values.push(value);
      }
      x.push(values[0]);
      y.push(values[1]);
    }
  }
  return { ok: true, x, y };
}
