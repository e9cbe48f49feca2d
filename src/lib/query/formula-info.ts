// GET /api/formula's answer: Hill formula, masses, IHD and isotope pattern.
import {
  parseFormula, nominalMass, monoisotopicMass, averageMass, radicalCationMz, ihdFromFormula, isotopePattern, FormulaError,
} from '../chem/index';
import { HttpError } from '../http';

export function formulaInfo(mf: string) {
  try {
    const parsed = parseFormula(mf);
    const ihd = ihdFromFormula(parsed.elements);
    const pattern = isotopePattern(parsed.hill, { resolution: 'unit' } as any) as { mz: number; relative: number }[];
    return {
      formula: parsed.hill,
      nominalMass: nominalMass(parsed.hill),
      monoisotopicMass: monoisotopicMass(parsed.hill),
      averageMass: averageMass(parsed.hill),
      radicalCationMz: radicalCationMz(parsed.hill),
      ihd: ihd.ihd,
      ihdValid: ihd.valid,
      ihdFlags: ihd.flags,
      valencesAssumed: ihd.valencesAssumed,
      elements: parsed.elements,
      isotopePattern: pattern.filter((p) => p.relative >= 0.01).map((p) => ({ mz: p.mz, relative: p.relative })),
      averageMassTable: 'IUPAC conventional (abridged) atomic weights',
    };
  } catch (e) {
    if (e instanceof FormulaError || e instanceof RangeError) throw new HttpError(400, 'invalid_formula', `mf: ${(e as Error).message}`);
    throw e;
  }
}
