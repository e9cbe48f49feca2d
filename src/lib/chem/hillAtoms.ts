import type { ElementCounts } from './types';

export interface FormulaAtom {
  symbol: string;
  /** mass number of an isotopic label such as [2H]; absent for natural abundance */
  isotope?: number;
  count: number;
}

function hillCompare(hasCarbon: boolean) {
  const rank = (s: string) => (hasCarbon ? (s === 'C' ? 0 : s === 'H' ? 1 : 2) : 2);
  return (a: string, b: string) => rank(a) - rank(b) || (a < b ? -1 : a > b ? 1 : 0);
}

/**
 * Element counts as a list in Hill order (C, H, then alphabetical; all alphabetical
 * when there is no carbon), each labelled isotope right after its element.
 * @param elements - counts per element, labels included
 * @param labelledIsotopes - labelled atoms such as `{ '2H': 8 }`
 */
export function hillAtoms(elements: ElementCounts, labelledIsotopes: Record<string, number> = {}): FormulaAtom[] {
  const symbols = Object.keys(elements).filter((s) => elements[s] > 0);
  symbols.sort(hillCompare((elements.C ?? 0) > 0));
  const atoms: FormulaAtom[] = [];
  for (const symbol of symbols) {
    const labels: FormulaAtom[] = [];
    for (const [key, count] of Object.entries(labelledIsotopes)) {
      const match = /^(\d+)([A-Z][a-z]?)$/.exec(key);
      if (match && match[2] === symbol && count > 0) labels.push({ symbol, isotope: Number(match[1]), count });
    }
    labels.sort((a, b) => (a.isotope ?? 0) - (b.isotope ?? 0));
    const natural = elements[symbol] - labels.reduce((sum, l) => sum + l.count, 0);
    if (natural > 0) atoms.push({ symbol, count: natural });
    atoms.push(...labels);
  }
  return atoms;
}
