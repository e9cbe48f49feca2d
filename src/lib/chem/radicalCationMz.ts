import { ELECTRON_MASS } from './constants';
import { monoisotopicMass } from './monoisotopicMass';
import type { FormulaInput } from './resolveFormula';

/**
 * m/z of the radical cation M+• of a neutral formula: its monoisotopic mass less
 * one electron mass (0.000548580 u).
 * @param formula - formula of the neutral molecule
 */
export function radicalCationMz(formula: FormulaInput): number {
  return monoisotopicMass(formula) - ELECTRON_MASS;
}
