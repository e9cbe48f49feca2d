import { elementIsotopes } from './elementIsotopes';
import { resolveFormula, type FormulaInput } from './resolveFormula';

/**
 * Monoisotopic mass in u: the sum of the masses of the most abundant isotope of
 * each element (the lightest one for all the elements of organic chemistry);
 * labelled atoms count with their label's mass. Isotope masses are the NIST /
 * AME values that mf-parser ships.
 * @param formula - formula text or atom counts
 */
export function monoisotopicMass(formula: FormulaInput): number {
  const parsed = resolveFormula(formula);
  let mass = 0;
  for (const atom of parsed.atoms) {
    const isotopes = elementIsotopes(atom.symbol);
    const isotope = atom.isotope
      ? isotopes.find((i) => i.nominal === atom.isotope)
      : isotopes.reduce((best, i) => (i.abundance > best.abundance ? i : best));
    if (!isotope) throw new RangeError(`no mass known for the isotope ${atom.isotope}${atom.symbol}`);
    mass += atom.count * isotope.mass;
  }
  return mass;
}
