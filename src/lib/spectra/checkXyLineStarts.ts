import type { XyLineStart } from './decodeXyData';

/**
 * Check that the X at each line start of `(X++(Y..Y))` data is
 * FIRSTX + i * DELTAX for the index i of the line's first Y (McDonald and
 * Wilks, Appl. Spectrosc. 42 (1988) 151). Accepted within half a point
 * spacing or half the rounding step of the X as written, whichever is larger.
 * @param lineStarts - from decodeXyData.
 * @param firstX - FIRSTX, real units.
 * @param deltaX - the point spacing, real units.
 * @returns null, or a message for the first line that strays.
 */
export function checkXyLineStarts(
  lineStarts: XyLineStart[],
  firstX: number,
  deltaX: number,
): string | null {
  for (const start of lineStarts) {
    const expected = firstX + start.index * deltaX;
    const tolerance =
      Math.max(Math.abs(deltaX) / 2, start.rounding / 2) * (1 + 1e-9) + 1e-9 * Math.abs(expected);
    if (!(Math.abs(start.x - expected) <= tolerance)) {
      return `line ${start.line}: the X at the line start is ${start.x} but FIRSTX + ${start.index} * DELTAX is ${round(expected)}`;
    }
  }
  return null;
}

function round(value: number): number {
  return Number(value.toPrecision(10));
}
