import { hillAtoms } from './hillAtoms';
import { parseFormula, type ParsedFormula } from './parseFormula';
import { toHill } from './toHill';
import type { ElementCounts } from './types';

/** A formula as text (`C6H5Br`), as atom counts (`{ C: 6, H: 5, Br: 1 }`) or already parsed. */
export type FormulaInput = string | ElementCounts | ParsedFormula;

/**
 * Turns any formula input into a parsed formula.
 * @throws {FormulaError} for unreadable text
 * @throws {RangeError} for atom counts that are not non-negative integers
 */
export function resolveFormula(formula: FormulaInput): ParsedFormula {
  if (typeof formula === 'string') return parseFormula(formula);
  if (formula === null || typeof formula !== 'object') {
    throw new RangeError('formula must be a string or an object of atom counts');
  }
  if ('hill' in formula && 'elements' in formula && typeof formula.hill === 'string') {
    return formula as ParsedFormula;
  }
  const elements: ElementCounts = {};
  for (const [symbol, count] of Object.entries(formula as ElementCounts)) {
    if (!/^[A-Z][a-z]?$/.test(symbol)) throw new RangeError(`not an element symbol: ${symbol}`);
    if (!Number.isInteger(count) || count < 0) {
      throw new RangeError(`count of ${symbol} must be a non-negative integer, got ${count}`);
    }
    if (count > 0) elements[symbol] = count;
  }
  const hill = toHill(elements);
  if (hill === '') throw new RangeError('formula has no atoms');
  // Re-parse so that unknown symbols are rejected the same way as in text.
  const parsed = parseFormula(hill);
  return { ...parsed, atoms: hillAtoms(parsed.elements) };
}
