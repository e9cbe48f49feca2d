import { resolveFormula, type FormulaInput } from './resolveFormula';

/**
 * Valences assumed for IHD: halogens and alkali metals like hydrogen (1), O, S,
 * Se, Te divalent, N, P, As, Sb, B trivalent, Si, Ge, Sn like carbon (4).
 */
const DEFAULT_VALENCES: Readonly<Record<string, number>> = Object.freeze({
  H: 1,
  F: 1,
  Cl: 1,
  Br: 1,
  I: 1,
  Li: 1,
  Na: 1,
  K: 1,
  O: 2,
  S: 2,
  Se: 2,
  Te: 2,
  N: 3,
  P: 3,
  As: 3,
  Sb: 3,
  B: 3,
  C: 4,
  Si: 4,
  Ge: 4,
  Sn: 4,
});

export interface IhdFromFormulaOptions {
  /**
   * What the formula describes. A neutral molecule and a radical cation (M+•)
   * must give an integer IHD; an even-electron ion (a fragment such as C7H7+)
   * gives a half-integer.
   * @default 'neutral'
   */
  species?: 'neutral' | 'radicalCation' | 'evenElectronIon';
  /**
   * Valences that replace or extend the assumed ones, e.g. `{ S: 6 }` for a sulfone
   * counted as hexavalent sulfur.
   * @default {}
   */
  valences?: Record<string, number>;
}

export interface IhdResult {
  /** index of hydrogen deficiency (rings plus pi bonds); null when an element has no known valence */
  ihd: number | null;
  /** true when the value is what the species allows (integer >= 0, or half-integer >= 0 for even-electron ions) */
  valid: boolean;
  /** why the value is not valid, in words */
  flags: string[];
  /** the valence used for each element present */
  valencesAssumed: Record<string, number>;
}

/**
 * Index of hydrogen deficiency from a formula by the general valence form,
 * IHD = 1 + sum of n_i (v_i - 2) / 2: halogens count as hydrogen, each N (and P)
 * adds one, O and S change nothing, Si counts as C.
 * @param formula - formula text or atom counts
 * @param options - see {@link IhdFromFormulaOptions}
 */
export function ihdFromFormula(formula: FormulaInput, options: IhdFromFormulaOptions = {}): IhdResult {
  const { species = 'neutral', valences = {} } = options;
  if (!['neutral', 'radicalCation', 'evenElectronIon'].includes(species)) {
    throw new RangeError(`species must be 'neutral', 'radicalCation' or 'evenElectronIon', got ${String(species)}`);
  }
  for (const [symbol, v] of Object.entries(valences)) {
    if (!Number.isInteger(v) || v < 1 || v > 8) throw new RangeError(`valences.${symbol} must be an integer 1..8`);
  }
  const { elements } = resolveFormula(formula);
  const valencesAssumed: Record<string, number> = {};
  const flags: string[] = [];
  let twice = 2; // 2 * IHD, kept integral
  for (const [symbol, count] of Object.entries(elements)) {
    const valence = valences[symbol] ?? DEFAULT_VALENCES[symbol];
    if (valence === undefined) {
      flags.push(`no valence is assumed for ${symbol}; give options.valences.${symbol}`);
      continue;
    }
    valencesAssumed[symbol] = valence;
    twice += count * (valence - 2);
  }
  if (flags.length > 0) return { ihd: null, valid: false, flags, valencesAssumed };

  const ihd = twice / 2;
  const half = twice % 2 !== 0;
  if (ihd < 0) flags.push(`IHD ${ihd} is negative: the formula has more hydrogens than the valences allow`);
  if (species === 'evenElectronIon') {
    if (!half) flags.push(`IHD ${ihd} is an integer: an even-electron ion formula gives a half-integer`);
  } else if (half) {
    flags.push(
      `IHD ${ihd} is not an integer: wrong for a neutral molecule or its molecular ion (half-integers belong to even-electron ions)`,
    );
  }
  return { ihd, valid: flags.length === 0, flags, valencesAssumed };
}
