import { averageMass } from './averageMass';
import { monoisotopicMass } from './monoisotopicMass';
import { nominalMass } from './nominalMass';
import { resolveFormula, type FormulaInput } from './resolveFormula';
import { toHill } from './toHill';
import type { ElementCounts } from './types';

export interface MolecularFromEmpiricalOptions {
  /**
   * Which mass the molecular-ion mass is: `nominal` (unit-resolution EI), `monoisotopic`
   * (accurate mass of the neutral) or `average` (molar mass).
   * @default 'nominal'
   */
  massType?: 'nominal' | 'monoisotopic' | 'average';
  /**
   * Largest allowed difference in u between the molecular-ion mass and n times the
   * empirical formula's mass.
   * @default 0.5 for nominal, 0.005 for monoisotopic, 0.05 for average
   */
  tolerance?: number;
}

export interface MolecularFromEmpiricalResult {
  formula: string;
  elements: ElementCounts;
  /** n, the molecular formula being (empirical)n */
  multiplier: number;
  /** mass of the molecular formula of the chosen mass type */
  mass: number;
  /** molecular-ion mass minus mass, in u */
  error: number;
}

/**
 * Molecular formula from an empirical formula and the molecular-ion mass:
 * n = M / empirical mass must be a whole number within the tolerance.
 * @param empirical - empirical formula, e.g. CH2O
 * @param molecularIonMass - mass of the molecular ion, e.g. 180
 * @param options - see {@link MolecularFromEmpiricalOptions}
 * @throws {RangeError} when the mass is not a whole multiple of the empirical mass
 */
export function molecularFromEmpirical(
  empirical: FormulaInput,
  molecularIonMass: number,
  options: MolecularFromEmpiricalOptions = {},
): MolecularFromEmpiricalResult {
  const { massType = 'nominal' } = options;
  const massOf = { nominal: nominalMass, monoisotopic: monoisotopicMass, average: averageMass }[massType];
  if (!massOf) throw new RangeError(`massType must be 'nominal', 'monoisotopic' or 'average', got ${massType}`);
  const tolerance = options.tolerance ?? { nominal: 0.5, monoisotopic: 0.005, average: 0.05 }[massType];
  if (!Number.isFinite(tolerance) || tolerance < 0) throw new RangeError('tolerance must be a number >= 0');
  if (!Number.isFinite(molecularIonMass) || molecularIonMass <= 0) {
    throw new RangeError(`molecularIonMass must be a positive number, got ${molecularIonMass}`);
  }
  const parsed = resolveFormula(empirical);
  const unitMass = massOf(parsed.elements);
  const multiplier = Math.round(molecularIonMass / unitMass);
  const error = molecularIonMass - multiplier * unitMass;
  if (multiplier < 1 || Math.abs(error) > tolerance) {
    throw new RangeError(
      `${molecularIonMass} is not a whole multiple of ${parsed.hill} (${unitMass.toFixed(4)}): n = ${(molecularIonMass / unitMass).toFixed(3)}`,
    );
  }
  const elements: ElementCounts = {};
  for (const [symbol, count] of Object.entries(parsed.elements)) elements[symbol] = count * multiplier;
  return { formula: toHill(elements), elements, multiplier, mass: multiplier * unitMass, error };
}
