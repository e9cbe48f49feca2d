import { elementIsotopes } from './elementIsotopes';
import type { ElementCounts } from './types';

export interface UnitIsotopePatternOptions {
  /**
   * Longest pattern kept, in nominal mass steps after the monoisotopic peak.
   * @default 16
   */
  length?: number;
}

const elementPatternCache = new Map<string, Float64Array>();
// patterns of n atoms of one element; bounded so long runs cannot grow it without limit
const powerCache = new Map<string, Float64Array>();
const POWER_CACHE_LIMIT = 20000;

function elementPower(symbol: string, n: number, length: number): Float64Array {
  const key = `${symbol}:${n}:${length}`;
  let cached = powerCache.get(key);
  if (!cached) {
    cached = power(singleAtom(symbol, length), n, length);
    if (powerCache.size >= POWER_CACHE_LIMIT) powerCache.clear();
    powerCache.set(key, cached);
  }
  return cached;
}

function convolve(a: Float64Array, b: Float64Array, length: number): Float64Array {
  const out = new Float64Array(length);
  for (let i = 0; i < a.length && i < length; i++) {
    if (a[i] === 0) continue;
    for (let j = 0; j < b.length && i + j < length; j++) out[i + j] += a[i] * b[j];
  }
  return out;
}

function singleAtom(symbol: string, length: number): Float64Array {
  const key = `${symbol}:${length}`;
  const cached = elementPatternCache.get(key);
  if (cached) return cached;
  const isotopes = elementIsotopes(symbol);
  const lightest = isotopes[0].nominal;
  const pattern = new Float64Array(length);
  for (const i of isotopes) if (i.nominal - lightest < length) pattern[i.nominal - lightest] += i.abundance;
  elementPatternCache.set(key, pattern);
  return pattern;
}

function power(base: Float64Array, n: number, length: number): Float64Array {
  let result: Float64Array = new Float64Array(length);
  result[0] = 1;
  let square: Float64Array = base;
  while (n > 0) {
    if (n & 1) result = convolve(result, square, length);
    n >>= 1;
    if (n > 0) square = convolve(square, square, length);
  }
  return result;
}

/**
 * Unit-resolution isotope pattern as abundances (fractions of all molecules) at
 * offsets 0, 1, 2, ... from the all-lightest-isotope mass, by convolving the
 * natural isotopic compositions (mf-parser's data) of each element. Fast enough
 * for ranking thousands of candidate formulas.
 * @param elements - atom counts
 * @param options - see {@link UnitIsotopePatternOptions}
 */
export function unitIsotopePattern(elements: ElementCounts, options: UnitIsotopePatternOptions = {}): Float64Array {
  const { length = 16 } = options;
  if (!Number.isInteger(length) || length < 1 || length > 200) {
    throw new RangeError('length must be an integer from 1 to 200');
  }
  let pattern: Float64Array = new Float64Array(length);
  pattern[0] = 1;
  for (const [symbol, count] of Object.entries(elements)) {
    if (!Number.isInteger(count) || count < 0) {
      throw new RangeError(`count of ${symbol} must be a non-negative integer, got ${count}`);
    }
    if (count === 0) continue;
    pattern = convolve(pattern, elementPower(symbol, count, length), length);
  }
  return pattern;
}
