import { tokenizeAsdfLine } from './tokenizeAsdfLine';

/** The X written at the start of a data line. */
export interface XyLineStart {
  line: number;
  /** The X as written times XFACTOR. */
  x: number;
  /** Index of the point that X belongs to (the Y-check point after a DIF line). */
  index: number;
  /** The rounding step of the X as written, in real units. */
  rounding: number;
}

export interface DecodeXyDataOptions {
  /**
   * XFACTOR: the X written at a line start times this is the real X.
   * @default 1
   */
  xFactor?: number;
  /**
   * Stop with an error past this many points (a guard against runaway DUP counts).
   * @default 10_000_000
   */
  maxPoints?: number;
}

export type DecodeXyDataResult =
  | {
      ok: true;
      /** Y values as written (before YFACTOR); NaN where the file has `?`. */
      y: number[];
      lineStarts: XyLineStart[];
      /** The last line ended in DIF form and had no Y-check line after it. */
      lastLineUnchecked: boolean;
    }
  | { ok: false; error: string };

/**
 * Decode `(X++(Y..Y))` lines and check them as the standard asks
 * (McDonald and Wilks, Appl. Spectrosc. 42 (1988) 151):
 * - the Y-check: after a line ending in DIF form, the next line's first Y
 *   repeats that line's last Y; it is compared, then dropped;
 * - every value is a finite number.
 * The X at each line start is returned for checkXyLineStarts.
 * @param lines - the data lines, `$$` comments removed.
 * @param lineNumbers - their 1-based line numbers, for messages.
 * @param options - XFACTOR and a size guard.
 * @returns the raw Y values, or the first error with its line.
 */
export function decodeXyData(
  lines: string[],
  lineNumbers: number[],
  options: DecodeXyDataOptions = {},
): DecodeXyDataResult {
  const { xFactor = 1, maxPoints = 10_000_000 } = options;
  if (!Number.isFinite(xFactor) || xFactor === 0) {
    throw new RangeError('xFactor must be a finite non-zero number');
  }
  const y: number[] = [];
  const lineStarts: XyLineStart[] = [];
  let previous: number | null = null; // last Y value (NaN after `?`)
  let lastDif: number | null = null; // difference of the last DIF token
  let lastKind: 'value' | 'dif' | 'missing' | null = null;
  let previousLineEndedInDif = false;

  for (let l = 0; l < lines.length; l++) {
    const where = `line ${lineNumbers[l] ?? l + 1}`;
    if (lines[l].trim() === '') continue;
    const tokenized = tokenizeAsdfLine(lines[l]);
    if (!tokenized.ok) return { ok: false, error: `${where}: ${tokenized.error}` };
    const { tokens } = tokenized;
    const xToken = tokens[0];
    if (xToken.kind !== 'value') {
      return { ok: false, error: `${where}: the line must start with an X value, not "${xToken.text}"` };
    }
    if (!Number.isFinite(xToken.value)) {
      return { ok: false, error: `${where}: the X value "${xToken.text}" is not a finite number` };
    }
    if (tokens.length < 2) {
      return { ok: false, error: `${where}: an X value without Y values` };
    }
    let t = 1;
    let xIndex = y.length;
    if (previousLineEndedInDif) {
      const check = tokens[1];
      if (check.kind !== 'value') {
        return {
          ok: false,
          error: `${where}: after a line ending in DIF form the line must start with the Y-check value, not "${check.text}"`,
        };
      }
      if (previous === null || !sameValue(check.value, previous)) {
        return {
          ok: false,
          error: `${where}: DIF Y-check failed: the first Y is ${check.value} but the previous line ended with ${previous}`,
        };
      }
      xIndex = y.length - 1;
      t = 2;
      lastKind = 'value';
    }
    const firstYToken = t;
    lineStarts.push({
      line: lineNumbers[l] ?? l + 1,
      x: xToken.value * xFactor,
      index: xIndex,
      rounding: Math.abs(xFactor) * 10 ** -xToken.decimals,
    });

    let endsInDif = false;
    for (; t < tokens.length; t++) {
      const token = tokens[t];
      if (token.kind === 'value') {
        if (!Number.isFinite(token.value)) {
          return { ok: false, error: `${where}: "${token.text}" is not a finite number` };
        }
        previous = token.value;
        lastKind = 'value';
        y.push(previous);
        endsInDif = false;
      } else if (token.kind === 'missing') {
        previous = Number.NaN;
        lastKind = 'missing';
        y.push(Number.NaN);
        endsInDif = false;
      } else if (token.kind === 'dif') {
        if (previous === null || Number.isNaN(previous)) {
          return {
            ok: false,
            error: `${where}: a difference "${token.text}" with no previous value to add it to`,
          };
        }
        previous = previous + token.value;
        if (!Number.isFinite(previous)) {
          return { ok: false, error: `${where}: the value after "${token.text}" is not finite` };
        }
        lastDif = token.value;
        lastKind = 'dif';
        y.push(previous);
        endsInDif = true;
      } else {
        const count = token.value;
        if (!Number.isInteger(count) || count < 1) {
          return { ok: false, error: `${where}: "${token.text}" is not a valid repeat count` };
        }
        if (lastKind === null || t === firstYToken) {
          return { ok: false, error: `${where}: a repeat count "${token.text}" with nothing to repeat` };
        }
        if (y.length + count - 1 > maxPoints) {
          return { ok: false, error: `${where}: more than ${maxPoints} data points` };
        }
        for (let r = 1; r < count; r++) {
          if (lastKind === 'dif') previous = (previous as number) + (lastDif as number);
          y.push(previous as number);
        }
        if (lastKind === 'dif' && !Number.isFinite(previous as number)) {
          return { ok: false, error: `${where}: a value after "${token.text}" is not finite` };
        }
      }
      if (y.length > maxPoints) {
        return { ok: false, error: `${where}: more than ${maxPoints} data points` };
      }
    }
    previousLineEndedInDif = endsInDif || (lastKind === 'dif' && tokens.at(-1)?.kind === 'dup');
  }
  return { ok: true, y, lineStarts, lastLineUnchecked: previousLineEndedInDif };
}

function sameValue(a: number, b: number): boolean {
  return Math.abs(a - b) <= 1e-9 * Math.max(1, Math.abs(a), Math.abs(b));
}
