import { elementIsotopes } from './elementIsotopes';
import { resolveFormula, type FormulaInput } from './resolveFormula';

/**
 * Nominal mass: the sum of the integer masses (mass numbers) of the most abundant
 * isotope of each element. Not the rounded monoisotopic mass: for C40H82 that
 * would be 563, the nominal mass is 562.
 * @param formula - formula text or atom counts
 */
export function nominalMass(formula: FormulaInput): number {
  const parsed = resolveFormula(formula);
  let mass = 0;
  for (const atom of parsed.atoms) {
    const nominal = atom.isotope
      ? atom.isotope
      : elementIsotopes(atom.symbol).reduce((best, i) => (i.abundance > best.abundance ? i : best)).nominal;
    mass += atom.count * nominal;
  }
  return mass;
}
