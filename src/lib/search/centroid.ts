import type { Peak } from './types';

export interface CentroidOptions {
  /**
   * Points closer than this (in m/z) to their neighbour belong to the same
   * profile peak. Centroided EI data (one point per unit mass) pass unchanged.
   * @default 0.2
   */
  maxGap?: number;
}

/**
 * Turn profile data into centroids: sort by m/z, group runs of points spaced
 * at most `maxGap` apart, and replace each run by one peak at its
 * intensity-weighted mean m/z with the run's apex height (heights, not areas,
 * so that peaks of different widths keep their relative intensities).
 * Input counts as profile data when most consecutive points are that close;
 * centroided input comes back sorted and otherwise unchanged (repeated m/z
 * values are left for binPeaks to sum).
 */
/** centroid()'s default maxGap: points this close to their neighbour make profile data. */
export const CENTROID_MAX_GAP = 0.2;

/** centroid()'s test: n points sorted by m/z, `close` of their neighbour gaps at most maxGap, are profile data. */
export function looksLikeProfile(close: number, n: number): boolean {
  return n >= 3 && close * 2 > n - 1;
}

export function centroid(peaks: readonly Peak[], options: CentroidOptions = {}): Peak[] {
  const { maxGap = CENTROID_MAX_GAP } = options;
  if (!(maxGap >= 0) || !Number.isFinite(maxGap)) throw new RangeError('maxGap must be a finite number >= 0');
  const sorted = [...peaks].sort((a, b) => a[0] - b[0]);
  let close = 0;
  for (let k = 1; k < sorted.length; k++) if (sorted[k][0] - sorted[k - 1][0] <= maxGap) close++;
  if (!looksLikeProfile(close, sorted.length)) return sorted.map((p) => [p[0], p[1]]);
  const out: Peak[] = [];
  let i = 0;
  while (i < sorted.length) {
    let j = i + 1;
    while (j < sorted.length && sorted[j][0] - sorted[j - 1][0] <= maxGap) j++;
    if (j === i + 1) {
      out.push([sorted[i][0], sorted[i][1]]);
    } else {
      let sumI = 0;
      let sumMzI = 0;
      let apex = -Infinity;
      for (let p = i; p < j; p++) {
        const [mz, intensity] = sorted[p];
        if (intensity > 0) {
          sumI += intensity;
          sumMzI += mz * intensity;
        }
        if (intensity > apex) apex = intensity;
      }
      const mz = sumI > 0 ? sumMzI / sumI : sorted[i][0];
      out.push([mz, apex]);
    }
    i = j;
  }
  return out;
}
