import { ihdFromFormula } from './ihdFromFormula';
import { ihdFromStructure } from './ihdFromStructure';
import { resolveFormula, type FormulaInput } from './resolveFormula';

export interface StructureFormulaComparison {
  /** true when the structure's formula equals the stated formula */
  matches: boolean;
  structureFormula: string;
  statedFormula: string;
  /** stated minus structure count, for each element that differs */
  differences: Record<string, number>;
  /** IHD from the structure (rings + pi bonds) */
  structureIhd: number;
  /** IHD from the stated formula (general valence form); null for unknown valences */
  formulaIhd: number | null;
  /** remarks, e.g. why the two IHD values differ */
  notes: string[];
}

/**
 * Compares a structure's molecular formula with a stated formula. A mismatch is
 * what curation warns about; differing IHD values alone are not, because they
 * legitimately differ for hypervalent S and P (sulfoxides, sulfones, phosphates).
 * @param structure - SMILES or molfile
 * @param formula - the stated formula
 */
export function structureMatchesFormula(structure: string, formula: FormulaInput): StructureFormulaComparison {
  const fromStructure = ihdFromStructure(structure);
  const stated = resolveFormula(formula);
  const differences: Record<string, number> = {};
  const symbols = new Set([...Object.keys(stated.elements), ...Object.keys(fromStructure.elements)]);
  for (const symbol of symbols) {
    const diff = (stated.elements[symbol] ?? 0) - (fromStructure.elements[symbol] ?? 0);
    if (diff !== 0) differences[symbol] = diff;
  }
  const matches = Object.keys(differences).length === 0;
  const formulaIhd = ihdFromFormula(stated.elements).ihd;
  const notes: string[] = [];
  if (!matches) {
    notes.push(`the structure is ${fromStructure.formula}, the stated formula is ${stated.hill}`);
  } else if (formulaIhd !== null && formulaIhd !== fromStructure.ihd) {
    notes.push(
      `IHD ${fromStructure.ihd} from the structure and ${formulaIhd} from the formula differ, as expected for hypervalent S or P`,
    );
  }
  return {
    matches,
    structureFormula: fromStructure.formula,
    statedFormula: stated.hill,
    differences,
    structureIhd: fromStructure.ihd,
    formulaIhd,
    notes,
  };
}
