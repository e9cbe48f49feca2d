// The peak-list text of the Identify page, read in the browser so errors can
// point at their line before anything is sent. Three forms are accepted:
//   1. one "m/z intensity" pair a line (blanks, tabs, a comma or ";" between),
//   2. "m/z:intensity" pairs separated by spaces or commas (one line or many),
//   3. CSV (or tab/semicolon separated) with a header line naming the columns.
// Intensities may be on any scale; `#` starts a comment.

export type PeakPair = [number, number];

export interface PeakListProblem {
  /** 1-based line number in the text */
  line: number;
  message: string;
}

export interface ParsePeakListResult {
  peaks: PeakPair[];
  errors: PeakListProblem[];
  warnings: PeakListProblem[];
  form: 'pairs' | 'colon' | 'csv' | 'empty';
}

export interface ParsePeakListOptions {
  /**
   * Most peaks accepted.
   * @default 5000
   */
  maxPeaks?: number;
}

const NUMBER = /^[+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?$/;
const MZ_HEADER = /^(m\/?z|mass|mz|m_z|x)$/i;
const INTENSITY_HEADER = /^(int(ensity)?|abund(ance)?|rel(ative)?(\s*int(ensity)?)?|height|area|counts?|y|i)$/i;

function toNumber(text: string): number | null {
  return NUMBER.test(text) ? Number(text) : null;
}

function stripComment(line: string): string {
  const hash = line.indexOf('#');
  return (hash >= 0 ? line.slice(0, hash) : line).trim();
}

/**
 * Read a pasted peak list.
 * @param text - the text area's content
 * @param options - see {@link ParsePeakListOptions}
 * @returns the peaks (sorted by m/z, duplicates summed) and the problems, each with its line
 */
export function parsePeakList(text: string, options: ParsePeakListOptions = {}): ParsePeakListResult {
  const { maxPeaks = 5000 } = options;
  const lines = String(text ?? '').split(/\r\n|\r|\n/);
  const errors: PeakListProblem[] = [];
  const warnings: PeakListProblem[] = [];
  const raw: { mz: number; intensity: number; line: number }[] = [];

  const content = lines.map((l, i) => ({ text: stripComment(l), line: i + 1 })).filter((l) => l.text !== '');
  if (content.length === 0) return { peaks: [], errors: [], warnings: [], form: 'empty' };

  let form: ParsePeakListResult['form'] = 'pairs';
  let start = 0;
  let mzColumn = 0;
  let intensityColumn = 1;
  let splitter: RegExp = /[\s,;]+/;

  const first = content[0];
  // A header names its columns: every field is text, or one is a known column name.
  const headerFields = first.text.split(/\s*[\t,;]\s*|\s+/).map((h) => h.replace(/^"|"$/g, '')).filter(Boolean);
  const looksLikeHeader =
    !first.text.includes(':') &&
    headerFields.length >= 1 &&
    (headerFields.every((h) => toNumber(h) === null) || headerFields.some((h) => MZ_HEADER.test(h) || INTENSITY_HEADER.test(h)));
  if (looksLikeHeader) {
    form = 'csv';
    start = 1;
    const delimiter = first.text.includes('\t') ? '\t' : first.text.includes(';') ? ';' : first.text.includes(',') ? ',' : null;
    splitter = delimiter ? new RegExp(`\\s*${delimiter === '\t' ? '\\t' : delimiter}\\s*`) : /\s+/;
    const names = first.text.split(splitter).map((h) => h.trim().replace(/^"|"$/g, ''));
    const mzAt = names.findIndex((n) => MZ_HEADER.test(n));
    const intensityAt = names.findIndex((n, i) => i !== mzAt && INTENSITY_HEADER.test(n));
    if (mzAt < 0 || intensityAt < 0) {
      if (names.length < 2) {
        errors.push({ line: first.line, message: `the header "${first.text}" names fewer than two columns; write e.g. "mz,intensity"` });
        return { peaks: [], errors, warnings, form };
      }
      mzColumn = mzAt >= 0 ? mzAt : 0;
      intensityColumn = intensityAt >= 0 ? intensityAt : mzColumn === 0 ? 1 : 0;
      warnings.push({ line: first.line, message: `columns not recognised by name; reading column ${mzColumn + 1} as m/z and column ${intensityColumn + 1} as intensity` });
    } else {
      mzColumn = mzAt;
      intensityColumn = intensityAt;
    }
  } else if (content.some((l) => l.text.includes(':'))) {
    form = 'colon';
  }

  for (const { text: lineText, line } of content.slice(start)) {
    if (form === 'colon') {
      const tokens = lineText.split(/[\s,;]+/).filter(Boolean);
      for (const token of tokens) {
        const m = /^([^:]+):([^:]+)$/.exec(token);
        if (!m) {
          errors.push({ line, message: `"${token}" is not an m/z:intensity pair` });
          continue;
        }
        const mz = toNumber(m[1]);
        const intensity = toNumber(m[2]);
        if (mz === null) errors.push({ line, message: `m/z "${m[1]}" is not a number` });
        else if (intensity === null) errors.push({ line, message: `intensity "${m[2]}" is not a number` });
        else raw.push({ mz, intensity, line });
      }
      continue;
    }
    const fields = lineText.split(splitter).map((f) => f.trim().replace(/^"|"$/g, '')).filter((f, i, all) => f !== '' || form === 'csv' || all.length === 1);
    if (form === 'pairs' && fields.length !== 2) {
      errors.push({
        line,
        message:
          fields.length < 2
            ? `expected m/z and intensity, found only "${lineText}"`
            : `expected two numbers (m/z and intensity), found ${fields.length} values`,
      });
      continue;
    }
    if (form === 'csv' && fields.length <= Math.max(mzColumn, intensityColumn)) {
      errors.push({ line, message: `expected at least ${Math.max(mzColumn, intensityColumn) + 1} columns, found ${fields.length}` });
      continue;
    }
    const mz = toNumber(fields[mzColumn]);
    const intensity = toNumber(fields[intensityColumn]);
    if (mz === null) errors.push({ line, message: `m/z "${fields[mzColumn]}" is not a number` });
    else if (intensity === null) errors.push({ line, message: `intensity "${fields[intensityColumn]}" is not a number` });
    else raw.push({ mz, intensity, line });
  }

  const merged = new Map<number, number>();
  let zeros = 0;
  for (const p of raw) {
    if (!(p.mz > 0) || !Number.isFinite(p.mz)) {
      errors.push({ line: p.line, message: `m/z ${p.mz} must be greater than 0` });
      continue;
    }
    if (p.intensity < 0 || !Number.isFinite(p.intensity)) {
      errors.push({ line: p.line, message: `intensity ${p.intensity} must not be negative` });
      continue;
    }
    if (p.intensity === 0) {
      zeros += 1;
      continue;
    }
    if (merged.has(p.mz)) warnings.push({ line: p.line, message: `m/z ${p.mz} appears again; the intensities are added` });
    merged.set(p.mz, (merged.get(p.mz) ?? 0) + p.intensity);
  }
  if (zeros > 0) warnings.push({ line: content[start]?.line ?? 1, message: `${zeros} peak${zeros === 1 ? '' : 's'} with intensity 0 left out` });
  const peaks = [...merged.entries()].sort((a, b) => a[0] - b[0]) as PeakPair[];
  if (peaks.length > maxPeaks) {
    errors.push({ line: content[content.length - 1].line, message: `${peaks.length} peaks are more than the ${maxPeaks} accepted` });
  }
  if (errors.length === 0 && peaks.length === 0) {
    errors.push({ line: content[0].line, message: 'no peak with an intensity above 0' });
  }
  errors.sort((a, b) => a.line - b.line);
  return { peaks, errors, warnings, form };
}

/** Peaks as text in form 1 (one "m/z intensity" a line), intensities relative to the base peak = 100 when `relative`. */
export function formatPeakList(peaks: readonly PeakPair[], relative = false): string {
  const max = Math.max(1e-12, ...peaks.map((p) => p[1]));
  return peaks
    .map(([mz, i]) => {
      const y = relative ? (i / max) * 100 : i;
      const yText = Number.isInteger(y) ? String(y) : y.toFixed(relative ? 2 : 4).replace(/\.?0+$/, '');
      return `${Number.isInteger(mz) ? mz : mz.toFixed(4).replace(/0+$/, '')} ${yText}`;
    })
    .join('\n');
}
