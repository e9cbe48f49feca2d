import { Matrix, solve } from 'ml-matrix';

import { toUnitSpectrum, type UnitSpectrum } from './toUnitSpectrum';
import type { ElementCounts, HalogenFit, Peak } from './types';
import { unitIsotopePattern } from './unitIsotopePattern';

export interface EstimateHalogensOptions {
  /**
   * Largest number of Cl + Br atoms tried.
   * @default 6
   */
  maxHalogens?: number;
  /**
   * The rest of the formula (C, H, N, O, S, Si, ... without Cl and Br) when known;
   * its isotopes are folded into every Cl/Br pattern.
   * @default undefined (carbon count estimated from M+1, or from the mass)
   */
  rest?: ElementCounts;
  /**
   * Number of carbons when known (ignored when `rest` is given).
   * @default undefined
   */
  carbons?: number;
  /**
   * Compositions whose fit is within this of the best one are listed as alternatives.
   * @default 0.005
   */
  alternativeWithin?: number;
  /**
   * Peaks at or above this m/z belong to another cluster and are not read.
   * @default Infinity
   */
  upperLimit?: number;
}

export interface HalogenEstimate extends HalogenFit {
  /** close runners-up, best first */
  alternatives: HalogenFit[];
  /** carbons folded into the best pattern */
  carbonsAssumed: number;
  /** observed M, M+2, M+4, ... relative to the cluster maximum = 1 */
  observed: number[];
  /** the best composition's M, M+2, ... on the same scale after the least-squares scaling */
  predicted: number[];
}

// Fraction of 13C (IUPAC CIAAW representative composition), for the carbon estimate.
const C13_PER_CARBON = 0.0107 / 0.9893;

function restFor(totalNominal: number, cl: number, br: number, m1Ratio: number | undefined, carbons?: number) {
  const restMass = totalNominal - 35 * cl - 79 * br;
  if (restMass < 0) return undefined;
  const maxCarbons = Math.floor(restMass / 12);
  let c: number;
  if (carbons !== undefined) c = carbons;
  else if (m1Ratio !== undefined && m1Ratio > 0) c = Math.round(m1Ratio / C13_PER_CARBON);
  else c = Math.floor(restMass / 14); // CH2 units when M+1 is not seen
  c = Math.max(0, Math.min(c, maxCarbons));
  const h = Math.max(0, Math.min(restMass - 12 * c, 2 * c + 3));
  return { C: c, H: h };
}

/**
 * Estimates the numbers of Cl and Br atoms from the isotope cluster that starts
 * at `mMz` (M, M+2, M+4, ...). Each Cl_nBr_m (n + m up to `maxHalogens`) is folded
 * with the isotopes of the rest of the formula, scaled to the observed cluster by
 * least squares, and scored by the residual sum of squares of intensities
 * relative to the cluster maximum (0 is perfect).
 * @param peaks - the spectrum (`[mz, intensity]`) or a unit spectrum
 * @param mMz - m/z of the lightest member of the cluster (M)
 * @param options - see {@link EstimateHalogensOptions}
 */
export function estimateHalogens(
  peaks: readonly Peak[] | UnitSpectrum,
  mMz: number,
  options: EstimateHalogensOptions = {},
): HalogenEstimate {
  const { maxHalogens = 6, rest, carbons, alternativeWithin = 0.005, upperLimit = Infinity } = options;
  if (!Number.isInteger(maxHalogens) || maxHalogens < 0 || maxHalogens > 10) {
    throw new RangeError('maxHalogens must be an integer from 0 to 10');
  }
  if (carbons !== undefined && (!Number.isInteger(carbons) || carbons < 0)) {
    throw new RangeError('carbons must be a non-negative integer');
  }
  if (!(alternativeWithin >= 0)) throw new RangeError('alternativeWithin must be >= 0');
  if (!Number.isFinite(mMz) || mMz <= 0) throw new RangeError(`mMz must be a positive number, got ${mMz}`);
  const unit = Array.isArray(peaks) ? toUnitSpectrum(peaks as Peak[]) : (peaks as UnitSpectrum);
  const m = Math.round(mMz);
  const read = (offset: number) => (m + offset < upperLimit ? (unit.intensities.get(m + offset) ?? 0) : 0);
  if (read(0) <= 0) throw new RangeError(`there is no peak at m/z ${m}`);

  const evenCount = maxHalogens + 1;
  const observed = Array.from({ length: evenCount }, (_, k) => read(2 * k));
  const scale = Math.max(...observed);
  const o = observed.map((v) => v / scale);
  const m1 = read(1);
  const m1Ratio = m1 > 0 ? m1 / read(0) : undefined;

  const fits: Array<HalogenFit & { predicted: number[]; carbons: number }> = [];
  for (let br = 0; br <= maxHalogens; br++) {
    for (let cl = 0; cl + br <= maxHalogens; cl++) {
      const restCounts = rest ? { ...rest } : restFor(m, cl, br, m1Ratio, carbons);
      if (!restCounts) continue;
      const pattern = unitIsotopePattern({ ...restCounts, Cl: cl, Br: br }, { length: 2 * evenCount });
      const p = Array.from({ length: evenCount }, (_, k) => pattern[2 * k]);
      const s = solve(Matrix.columnVector(p), Matrix.columnVector(o)).get(0, 0);
      const predicted = p.map((v) => v * s);
      let rss = 0;
      for (let k = 0; k < evenCount; k++) rss += (o[k] - predicted[k]) ** 2;
      fits.push({ Cl: cl, Br: br, fit: rss, predicted, carbons: restCounts.C ?? 0 });
    }
  }
  if (fits.length === 0) throw new RangeError(`m/z ${m} is too light for any composition`);
  fits.sort((a, b) => a.fit - b.fit || a.Cl + a.Br - (b.Cl + b.Br));
  const [best, ...others] = fits;
  const alternatives = others
    .filter((f) => f.fit - best.fit <= alternativeWithin)
    .slice(0, 3)
    .map(({ Cl, Br, fit }) => ({ Cl, Br, fit }));
  return {
    Cl: best.Cl,
    Br: best.Br,
    fit: best.fit,
    alternatives,
    carbonsAssumed: best.carbons,
    observed: o,
    predicted: best.predicted,
  };
}
