import { Molecule } from 'openchemlib';

import { parseFormula } from './parseFormula';
import { StructureError } from './StructureError';
import type { ElementCounts } from './types';

export interface StructureIhd {
  /** rings plus pi bonds */
  ihd: number;
  /** bonds - atoms + connected components */
  rings: number;
  /** pi bonds of a Kekule form (a double bond counts one, a triple bond two) */
  piBonds: number;
  /** connected components (molecules or ions) in the structure */
  components: number;
  /** the structure's molecular formula in Hill order */
  formula: string;
  elements: ElementCounts;
}

function looksLikeMolfile(text: string): boolean {
  return /\n/.test(text) && /M {2}END|V2000|V3000/.test(text);
}

/**
 * IHD of a structure (SMILES or molfile) read with openchemlib: rings from the
 * graph (bonds - atoms + connected components) plus the pi bonds of the Kekule
 * form openchemlib assigns. Hypervalent S and P keep their drawn double bonds,
 * so a sulfone's IHD here differs from the formula's; both are meaningful.
 * @param structure - SMILES or a molfile (V2000/V3000)
 * @throws {StructureError} when openchemlib cannot read the structure
 */
export function ihdFromStructure(structure: string): StructureIhd {
  if (typeof structure !== 'string' || structure.trim() === '') {
    throw new RangeError('structure must be a non-empty SMILES or molfile');
  }
  let molecule: Molecule;
  try {
    molecule = looksLikeMolfile(structure)
      ? Molecule.fromMolfile(structure)
      : Molecule.fromSmiles(structure.trim());
  } catch (error) {
    const message = error instanceof Error ? error.message : String(error);
    throw new StructureError(`cannot read the structure: ${message}`);
  }
  const atoms = molecule.getAllAtoms();
  if (atoms === 0) throw new StructureError('the structure has no atoms');
  molecule.ensureHelperArrays(Molecule.cHelperRings);

  let bonds = 0;
  let piBonds = 0;
  for (let bond = 0; bond < molecule.getAllBonds(); bond++) {
    const order = molecule.getBondOrder(bond);
    if (order < 1) continue; // zero-order and metal-ligand bonds do not close rings
    bonds++;
    piBonds += order - 1;
  }
  const components = molecule.getFragmentNumbers(new Array<number>(atoms).fill(0), false, false);
  const rings = bonds - atoms + components;

  const parsed = parseFormula(molecule.getMolecularFormula().formula);
  return { ihd: rings + piBonds, rings, piBonds, components, formula: parsed.hill, elements: parsed.elements };
}
