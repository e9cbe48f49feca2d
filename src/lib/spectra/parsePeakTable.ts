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
 * Read the lines of a `(XY..XY)` or `(XYW..XYW)` peak table (McDonald and
 * Wilks, Appl. Spectrosc. 42 (1988) 151; for mass spectra Lampen et al.,
 * Appl. Spectrosc. 48 (1994) 1545): the values of a group are joined by
 * commas, groups are separated by blanks or `;`. A line without commas is
 * read as values in order (the blank-separated style many exporters write).
 * A group must not be split across lines. W (peak width) is read and dropped.
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
    const line = lines[l].trim();
    if (line === '') continue;
    let groups: string[][];
    if (line.includes(',')) {
      // "39, 120 50,160; 51 , 185": commas bind, blanks and semicolons separate
      groups = line
        .replace(/\s*,\s*/g, ',')
        .split(/[\s;]+/)
        .filter(Boolean)
        .map((group) => group.split(','));
      const bad = groups.find((group) => group.length !== width);
      if (bad) {
        return {
          ok: false,
          error: `${where}: the group "${bad.join(', ')}" does not have the ${width} values of (${form}..${form})`,
        };
      }
    } else {
      const fields = line.split(/[\s;]+/).filter(Boolean);
      if (fields.length % width !== 0) {
        return {
          ok: false,
          error: `${where}: ${fields.length} values do not make whole (${form}..${form}) groups of ${width}`,
        };
      }
      groups = [];
      for (let f = 0; f < fields.length; f += width) groups.push(fields.slice(f, f + width));
    }
    for (const group of groups) {
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
