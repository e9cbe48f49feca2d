// The identity fields a version row carries, computed for the demo compounds
// with mf-parser (masses) and the usual IHD formula, so the seed does not
// depend on the application's own chemistry module.
import { MF } from 'mf-parser';
import { atomsOf, hillFormula, nominalMassOf } from './synthetic-spectrum';

export interface CompoundChemistry {
  /** Hill order. */
  formula: string;
  nominalMass: number;
  monoisotopicMass: number;
  averageMass: number;
  /** Rings plus double bonds: (2(C + Si) + 2 + N + P − H − X) / 2. */
  ihd: number;
  /** Element symbols in Hill order, comma separated, e.g. "C,H,Cl". */
  elements: string;
}

export function compoundChemistry(formula: string): CompoundChemistry {
  const atoms = atomsOf(formula);
  const hill = hillFormula(atoms);
  const info = new MF(hill).getInfo();
  const n = (el: string) => atoms[el] ?? 0;
  const ihd = (2 * (n('C') + n('Si')) + 2 + n('N') + n('P') - n('H') - n('F') - n('Cl') - n('Br') - n('I')) / 2;
  return {
    formula: hill,
    nominalMass: nominalMassOf(atoms),
    monoisotopicMass: info.monoisotopicMass,
    averageMass: info.mass,
    ihd,
    elements: hill.match(/[A-Z][a-z]?/g)!.join(','),
  };
}
