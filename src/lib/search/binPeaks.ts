import type { Peak } from './types';

export interface BinOptions {
  /**
   * Bin width in m/z. A peak falls into bin round(mz / tolerance), whose m/z is
   * bin * tolerance; 1 is unit mass, rounding to the nearest integer.
   * @default 1
   */
  tolerance?: number;
}

export function checkTolerance(tolerance: number): void {
  if (!Number.isFinite(tolerance) || tolerance <= 0 || tolerance > 10) {
    throw new RangeError('tolerance must be a finite number in (0, 10]');
  }
}

/** Bin number of an m/z value. */
export function binOf(mz: number, tolerance = 1): number {
  return Math.round(mz / tolerance);
}

/**
 * Merge peaks into bins, summing the intensities that fall into one bin.
 * Returns `[binMz, intensity]` sorted by m/z, where binMz = bin * tolerance
 * (an integer at unit mass).
 */
export function binPeaks(peaks: readonly Peak[], options: BinOptions = {}): Peak[] {
  const { tolerance = 1 } = options;
  checkTolerance(tolerance);
  const sums = new Map<number, number>();
  for (const [mz, intensity] of peaks) {
    const bin = binOf(mz, tolerance);
    sums.set(bin, (sums.get(bin) ?? 0) + intensity);
  }
  return [...sums.keys()]
    .sort((a, b) => a - b)
    .map((bin) => [tolerance === 1 ? bin : bin * tolerance, sums.get(bin) as number]);
}

/**
 * binPeaks on peaks already sorted by m/z, into flat arrays: m/z i at
 * mz[mzAt + i], its intensity at intensity[inAt + i]. Sorted m/z gives
 * non-decreasing bins, so each bin is one run, summed in input order as
 * binPeaks's Map does (the same bits). Writes bin numbers and sums; returns
 * the bin count.
 */
export function binSortedRuns(mz: ArrayLike<number>, mzAt: number, intensity: ArrayLike<number>, inAt: number, n: number, tolerance: number, binNo: Float64Array | Int32Array, binSum: Float64Array): number {
  let k = -1;
  for (let i = 0; i < n; i++) {
    const b = binOf(mz[mzAt + i], tolerance);
    if (k >= 0 && b === binNo[k]) {
      binSum[k] += intensity[inAt + i];
    } else {
      k++;
      binNo[k] = b;
      binSum[k] = 0 + intensity[inAt + i];
    }
  }
  return k + 1;
}
