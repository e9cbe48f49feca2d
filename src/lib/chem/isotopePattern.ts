import { IsotopicDistribution } from 'isotopic-distribution';

import { ELECTRON_MASS } from './constants';
import { resolveFormula, type FormulaInput } from './resolveFormula';
import { toHill } from './toHill';

export interface IsotopePatternOptions {
  /**
   * `unit`: one group per nominal mass (what a unit-resolution EI spectrum shows);
   * `accurate`: isotopologues closer than `fwhm` are merged.
   * @default 'unit'
   */
  resolution?: 'unit' | 'accurate';
  /**
   * Width in u under which isotopologues merge, for `accurate` resolution.
   * @default 0.001
   */
  fwhm?: number;
  /**
   * Smallest relative intensity kept (most abundant = 100).
   * @default 0.01
   */
  threshold?: number;
  /**
   * Give m/z of the radical cation (one electron mass subtracted) instead of the
   * neutral's masses.
   * @default false
   */
  radicalCation?: boolean;
}

export interface IsotopePatternPeak {
  /** exact mass (or m/z) of the isotopologue group, abundance-weighted */
  mz: number;
  /** relative abundance, most abundant = 100 */
  relative: number;
}

/**
 * Isotope pattern of a formula computed with isotopic-distribution (natural
 * isotopic compositions), most abundant group = 100.
 * @param formula - formula text or atom counts
 * @param options - see {@link IsotopePatternOptions}
 */
export function isotopePattern(formula: FormulaInput, options: IsotopePatternOptions = {}): IsotopePatternPeak[] {
  const { resolution = 'unit', fwhm = 0.001, threshold = 0.01, radicalCation = false } = options;
  if (resolution !== 'unit' && resolution !== 'accurate') {
    throw new RangeError(`resolution must be 'unit' or 'accurate', got ${String(resolution)}`);
  }
  if (!(fwhm > 0 && fwhm < 0.5)) throw new RangeError('fwhm must be > 0 and < 0.5');
  if (!(threshold >= 0 && threshold < 100)) throw new RangeError('threshold must be >= 0 and < 100');
  const parsed = resolveFormula(formula);
  const mf = toHill(parsed.elements, parsed.labelledIsotopes);
  // Isotopologues of one nominal mass lie within a few 0.01 u; neighbours are 1 u apart.
  const distribution = new IsotopicDistribution(mf, {
    fwhm: resolution === 'unit' ? 0.3 : fwhm,
    maxLines: 5000,
    minY: 1e-10,
  });
  const peaks = distribution.getPeaks({ maxValue: 100 }) as Array<{ x: number; y: number }>;
  const shift = radicalCation ? ELECTRON_MASS : 0;
  const max = Math.max(...peaks.map((p) => p.y));
  return peaks
    .map((p) => ({ mz: p.x - shift, relative: (p.y / max) * 100 }))
    .filter((p) => p.relative >= threshold)
    .sort((a, b) => a.mz - b.mz);
}
