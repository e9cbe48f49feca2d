import { Matrix, solve } from 'ml-matrix';

import { toHill } from './toHill';
import type { ElementCounts } from './types';
import { unitIsotopePattern } from './unitIsotopePattern';

export type ElementLimits = Record<string, [number, number]>;

export interface CandidateFormulasOptions {
  /**
   * Smallest and largest count of each element.
   * @default { C: [0, 40], H: [0, 80], N: [0, 4], O: [0, 6], S: [0, 2], Cl: [0, 4], Br: [0, 2], F: [0, 6], P: [0, 1], Si: [0, 2] }
   */
  limits?: ElementLimits;
  /**
   * Exact Cl and Br counts to keep (from `estimateHalogens`).
   * @default undefined (any count within the limits)
   */
  halogenEstimate?: { Cl: number; Br: number };
  /**
   * Observed intensities at M, M+1, M+2, ... (any scale) to rank candidates by.
   * @default undefined (ranked by the number of heteroatoms)
   */
  observedCluster?: number[];
  /**
   * Most candidates returned.
   * @default 50
   */
  limit?: number;
  /**
   * Stop generating after this many formulas pass the filters, so that a query
   * stays well inside 200 ms.
   * @default 5000
   */
  maxGenerated?: number;
  /**
   * Stop generating after this many milliseconds (the formulas found so far are ranked).
   * @default 120
   */
  timeBudgetMs?: number;
}

export interface CandidateFormula {
  formula: string;
  elements: ElementCounts;
  ihd: number;
  /** residual sum of squares against the observed cluster (relative to its maximum = 1); null without one */
  isotopeFit: number | null;
}

export const DEFAULT_ELEMENT_LIMITS: Readonly<ElementLimits> = Object.freeze({
  C: [0, 40],
  H: [0, 80],
  N: [0, 4],
  O: [0, 6],
  S: [0, 2],
  Cl: [0, 4],
  Br: [0, 2],
  F: [0, 6],
  P: [0, 1],
  Si: [0, 2],
});

// Integer masses of the most abundant isotopes and the valences used for IHD.
const ELEMENT_DATA: Record<string, { nominal: number; valence: number }> = {
  C: { nominal: 12, valence: 4 },
  H: { nominal: 1, valence: 1 },
  N: { nominal: 14, valence: 3 },
  O: { nominal: 16, valence: 2 },
  S: { nominal: 32, valence: 2 },
  Cl: { nominal: 35, valence: 1 },
  Br: { nominal: 79, valence: 1 },
  F: { nominal: 19, valence: 1 },
  I: { nominal: 127, valence: 1 },
  P: { nominal: 31, valence: 3 },
  Si: { nominal: 28, valence: 4 },
  B: { nominal: 11, valence: 3 },
  Se: { nominal: 80, valence: 2 },
};

function isotopeFit(elements: ElementCounts, observed: number[]): number {
  const pattern = unitIsotopePattern(elements, { length: observed.length });
  const p = Array.from(pattern);
  const s = solve(Matrix.columnVector(p), Matrix.columnVector(observed)).get(0, 0);
  let rss = 0;
  for (let i = 0; i < observed.length; i++) rss += (observed[i] - s * p[i]) ** 2;
  return rss;
}

/**
 * Molecular formulas of a nominal mass within element limits, kept when their IHD
 * (general valence form) is a whole number >= 0, they obey the nitrogen rule and
 * match the halogen estimate; ranked by the fit of their unit isotope pattern to
 * the observed cluster (best first).
 * @param nominalMass - nominal mass of the molecular ion
 * @param options - see {@link CandidateFormulasOptions}
 */
export function candidateFormulas(nominalMass: number, options: CandidateFormulasOptions = {}): CandidateFormula[] {
  const { limits = DEFAULT_ELEMENT_LIMITS, halogenEstimate, observedCluster, limit = 50, maxGenerated = 5000, timeBudgetMs = 120 } =
    options;
  if (!Number.isInteger(nominalMass) || nominalMass < 1 || nominalMass > 2000) {
    throw new RangeError(`nominalMass must be an integer from 1 to 2000, got ${nominalMass}`);
  }
  if (!Number.isInteger(limit) || limit < 1) throw new RangeError('limit must be an integer >= 1');
  if (!Number.isInteger(maxGenerated) || maxGenerated < 1) throw new RangeError('maxGenerated must be an integer >= 1');
  if (!(timeBudgetMs > 0)) throw new RangeError('timeBudgetMs must be > 0');
  const deadline = performance.now() + timeBudgetMs;
  for (const [symbol, range] of Object.entries(limits)) {
    if (!ELEMENT_DATA[symbol]) {
      throw new RangeError(`limits.${symbol}: element not supported (use ${Object.keys(ELEMENT_DATA).join(', ')})`);
    }
    if (!Array.isArray(range) || !range.every((v) => Number.isInteger(v) && v >= 0) || range[0] > range[1]) {
      throw new RangeError(`limits.${symbol} must be [min, max] with integers 0 <= min <= max`);
    }
  }
  let observed: number[] | undefined;
  if (observedCluster !== undefined) {
    if (!Array.isArray(observedCluster) || observedCluster.length === 0 || observedCluster.some((v) => !(v >= 0))) {
      throw new RangeError('observedCluster must be a non-empty array of intensities >= 0');
    }
    const max = Math.max(...observedCluster);
    if (!(max > 0) || !(observedCluster[0] > 0)) throw new RangeError('observedCluster must start with the M peak > 0');
    observed = observedCluster.map((v) => v / max);
  }

  const effective: ElementLimits = { ...limits };
  if (halogenEstimate) {
    effective.Cl = [halogenEstimate.Cl, halogenEstimate.Cl];
    effective.Br = [halogenEstimate.Br, halogenEstimate.Br];
  }
  const hRange = effective.H ?? [0, 0];
  // heavy elements first so that the remaining mass prunes early; H takes what is left
  const heavy = Object.keys(effective)
    .filter((s) => s !== 'H')
    .sort((a, b) => ELEMENT_DATA[b].nominal - ELEMENT_DATA[a].nominal);

  // most mass the elements from index on (and H) can still take, for pruning
  const reachable = new Array<number>(heavy.length + 1).fill(hRange[1]);
  for (let i = heavy.length - 1; i >= 0; i--) {
    reachable[i] = reachable[i + 1] + effective[heavy[i]][1] * ELEMENT_DATA[heavy[i]].nominal;
  }

  const found: CandidateFormula[] = [];
  const counts: ElementCounts = {};
  let stop = false;
  const visit = (index: number, remaining: number) => {
    if (stop || remaining > reachable[index]) return;
    if (index === heavy.length) {
      const h = remaining;
      if (h < hRange[0] || h > hRange[1]) return;
      const elements: ElementCounts = { ...counts, H: h };
      let twice = 2;
      let nitrogen = 0;
      for (const [symbol, n] of Object.entries(elements)) {
        twice += n * (ELEMENT_DATA[symbol].valence - 2);
        if (symbol === 'N') nitrogen = n;
      }
      if (twice < 0 || twice % 2 !== 0) return; // IHD must be a whole number >= 0
      if (nitrogen % 2 !== nominalMass % 2) return; // nitrogen rule for M+•
      for (const symbol of Object.keys(elements)) if (elements[symbol] === 0) delete elements[symbol];
      found.push({ formula: toHill(elements), elements, ihd: twice / 2, isotopeFit: null });
      if (found.length >= maxGenerated || (found.length % 256 === 0 && performance.now() > deadline)) stop = true;
      return;
    }
    const symbol = heavy[index];
    const [min, max] = effective[symbol];
    const unit = ELEMENT_DATA[symbol].nominal;
    for (let n = min; n <= max && n * unit <= remaining; n++) {
      counts[symbol] = n;
      visit(index + 1, remaining - n * unit);
    }
    delete counts[symbol];
  };
  visit(0, nominalMass);

  if (observed) {
    for (const candidate of found) candidate.isotopeFit = isotopeFit(candidate.elements, observed);
  }
  const heteroatoms = (c: CandidateFormula) =>
    Object.entries(c.elements).reduce((sum, [s, n]) => (s === 'C' || s === 'H' ? sum : sum + n), 0);
  found.sort(
    (a, b) =>
      (a.isotopeFit ?? 0) - (b.isotopeFit ?? 0) || heteroatoms(a) - heteroatoms(b) || a.formula.localeCompare(b.formula),
  );
  return found.slice(0, limit);
}
