import { conventionalAtomicWeights } from './conventionalAtomicWeights';
import { elementIsotopes } from './elementIsotopes';
import { resolveFormula, type FormulaInput } from './resolveFormula';

/**
 * Average (molar) mass in g/mol from the IUPAC CIAAW abridged standard atomic
 * weights (conventional values for interval elements, see
 * `conventionalAtomicWeights`). Labelled atoms count with their isotope's mass;
 * an element missing from that table is weighted from mf-parser's isotope data.
 * @param formula - formula text or atom counts
 */
export function averageMass(formula: FormulaInput): number {
  const parsed = resolveFormula(formula);
  let mass = 0;
  for (const atom of parsed.atoms) {
    const isotopes = elementIsotopes(atom.symbol);
    let weight: number;
    if (atom.isotope) {
      const isotope = isotopes.find((i) => i.nominal === atom.isotope);
      if (!isotope) throw new RangeError(`no mass known for the isotope ${atom.isotope}${atom.symbol}`);
      weight = isotope.mass;
    } else {
      weight =
        conventionalAtomicWeights[atom.symbol] ?? isotopes.reduce((sum, i) => sum + i.mass * i.abundance, 0);
    }
    mass += atom.count * weight;
  }
  return mass;
}
