import { hillAtoms } from './hillAtoms';
import type { ElementCounts } from './types';

/**
 * Writes atom counts as a Hill-order formula, e.g. `{ H: 5, C: 6, Br: 1 }` → `C6H5Br`,
 * `{ Cl: 1, H: 1 }` → `ClH`.
 * @param elements - counts per element (labelled atoms included in their element)
 * @param labelledIsotopes - labelled atoms such as `{ '2H': 8 }`, written as `[2H]8`
 */
export function toHill(elements: ElementCounts, labelledIsotopes: Record<string, number> = {}): string {
  for (const [symbol, count] of Object.entries(elements)) {
    if (!Number.isInteger(count) || count < 0) {
      throw new RangeError(`count of ${symbol} must be a non-negative integer, got ${count}`);
    }
  }
  return hillAtoms(elements, labelledIsotopes)
    .map((a) => (a.isotope ? `[${a.isotope}${a.symbol}]` : a.symbol) + (a.count === 1 ? '' : String(a.count)))
    .join('');
}
