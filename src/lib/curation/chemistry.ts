// What the chemistry layer says about a spectrum's stated identity: the Hill
// formula with its masses and IHD, and the import warnings of API.md
// (formula_unparsable, mw_mismatch, registry_check_digit, ihd_invalid,
// molecular_ion_mismatch, structure_formula_mismatch, no_ionization_energy).
import { parseFormula } from '../chem/parseFormula';
import { nominalMass } from '../chem/nominalMass';
import { monoisotopicMass } from '../chem/monoisotopicMass';
import { averageMass } from '../chem/averageMass';
import { ihdFromFormula } from '../chem/ihdFromFormula';
import { findIsotopeClusters } from '../chem/findIsotopeClusters';
import { structureMatchesFormula } from '../chem/structureMatchesFormula';
import { casCheckDigitValid } from '../spectra/casCheckDigitValid';
import type { ImportWarning } from './types';

export interface StatedIdentity {
  formula: string | null;
  mw?: number | null;
  casRegistryNo?: string | null;
  smiles?: string | null;
  molfile?: string | null;
  ionizationEnergy?: number | null;
  peaks?: [number, number][];
}

export interface DerivedChemistry {
  /** Hill formula, or null when absent or unparsable */
  formula: string | null;
  nominalMass: number | null;
  monoisotopicMass: number | null;
  averageMass: number | null;
  ihd: number | null;
  /** element symbols, comma separated, in Hill order (the search filters read it) */
  elements: string | null;
  warnings: ImportWarning[];
  /** why the formula did not parse, when it did not */
  formulaError?: string;
  /** why the structure did not parse, when it did not */
  structureError?: string;
}

const MW_TOLERANCE = 0.5;

export function deriveChemistry(input: StatedIdentity): DerivedChemistry {
  const warnings: ImportWarning[] = [];
  const out: DerivedChemistry = {
    formula: null, nominalMass: null, monoisotopicMass: null, averageMass: null, ihd: null, elements: null, warnings,
  };
  const stated = input.formula?.trim() || null;
  if (stated) {
    try {
      const parsed = parseFormula(stated);
      out.formula = parsed.hill;
      out.nominalMass = nominalMass(parsed);
      out.monoisotopicMass = monoisotopicMass(parsed);
      out.averageMass = averageMass(parsed);
      out.elements = [...new Set(parsed.atoms.map((a) => a.symbol))].join(',') || null;
      const ihd = ihdFromFormula(parsed);
      out.ihd = ihd.ihd;
      if (!ihd.valid) {
        warnings.push({ code: 'ihd_invalid', message: `the formula ${parsed.hill} gives an impossible IHD: ${ihd.flags.join('; ')}` });
      }
    } catch (e) {
      out.formulaError = (e as Error).message;
      warnings.push({ code: 'formula_unparsable', message: `the formula "${stated}" cannot be read: ${(e as Error).message}` });
    }
  } else {
    warnings.push({ code: 'formula_missing', message: 'no molecular formula was given' });
  }

  if (input.mw !== null && input.mw !== undefined && Number.isFinite(input.mw) && out.nominalMass !== null && out.averageMass !== null) {
    const offNominal = Math.abs(input.mw - out.nominalMass);
    const offAverage = Math.abs(input.mw - out.averageMass);
    if (offNominal > MW_TOLERANCE && offAverage > MW_TOLERANCE) {
      warnings.push({
        code: 'mw_mismatch',
        message: `the stated MW ${input.mw} disagrees with ${out.formula} (nominal ${out.nominalMass}, average ${out.averageMass.toFixed(3)})`,
      });
    }
  }

  const cas = input.casRegistryNo?.trim();
  if (cas && !casCheckDigitValid(cas)) {
    warnings.push({ code: 'registry_check_digit', message: `the registry number "${cas}" fails its check digit (or is not of the form NNNNNNN-NN-N)` });
  }

  if (out.nominalMass !== null && input.peaks && input.peaks.length > 0) {
    try {
      // The molecular ion is the lightest member of the highest-mass significant cluster.
      const [top] = findIsotopeClusters(input.peaks, { minRelative: 0.5, minMembers: 1 });
      if (top && top.mz !== out.nominalMass) {
        warnings.push({
          code: 'molecular_ion_mismatch',
          message: `the highest significant cluster starts at m/z ${top.mz}, but ${out.formula} has nominal mass ${out.nominalMass}`,
        });
      }
    } catch {
      /* peaks the chemistry layer cannot read were already rejected by the reader */
    }
  }

  const structure = input.molfile?.trim() ? input.molfile : input.smiles?.trim() ? input.smiles.trim() : null;
  if (structure) {
    if (out.formula) {
      try {
        const cmp = structureMatchesFormula(structure, out.formula);
        if (!cmp.matches) {
          warnings.push({ code: 'structure_formula_mismatch', message: `the structure is ${cmp.structureFormula} but the formula says ${cmp.statedFormula}` });
        }
      } catch (e) {
        out.structureError = (e as Error).message;
        warnings.push({ code: 'structure_unreadable', message: `the structure cannot be read: ${(e as Error).message}` });
      }
    } else {
      try {
        structureMatchesFormula(structure, 'C');
      } catch (e) {
        out.structureError = (e as Error).message;
        warnings.push({ code: 'structure_unreadable', message: `the structure cannot be read: ${(e as Error).message}` });
      }
    }
  }

  if (input.ionizationEnergy === null || input.ionizationEnergy === undefined) {
    warnings.push({ code: 'no_ionization_energy', message: 'no ionization energy is given (EI spectra are usually taken at 70 eV)' });
  }
  return out;
}
