import { MF } from 'mf-parser';

export interface IsotopeEntry {
  /** mass number */
  nominal: number;
  /** isotope mass in u */
  mass: number;
  /** natural abundance as a fraction (sums to 1 over the element) */
  abundance: number;
}

const cache = new Map<string, IsotopeEntry[]>();

/**
 * The stable isotopes of an element with their masses and natural abundances,
 * taken from the data that mf-parser ships (NIST atomic weights and isotopic
 * compositions). Ordered by mass number.
 * @param symbol - element symbol, e.g. `Cl`
 */
export function elementIsotopes(symbol: string): IsotopeEntry[] {
  const cached = cache.get(symbol);
  if (cached) return cached;
  if (!/^[A-Z][a-z]?$/.test(symbol)) {
    throw new RangeError(`symbol must be an element symbol, got ${JSON.stringify(symbol)}`);
  }
  let info;
  try {
    info = new MF(symbol).getIsotopesInfo();
  } catch {
    throw new RangeError(`unknown element: ${symbol}`);
  }
  const entry = 'isotopes' in info ? info.isotopes.find((i) => i.atom === symbol) : undefined;
  if (!entry || entry.distribution.length === 0) {
    throw new RangeError(`no isotope data for element ${symbol}`);
  }
  const isotopes = entry.distribution
    .map((d) => ({ nominal: Math.round(d.x), mass: d.x, abundance: d.y }))
    .sort((a, b) => a.nominal - b.nominal);
  cache.set(symbol, isotopes);
  return isotopes;
}
