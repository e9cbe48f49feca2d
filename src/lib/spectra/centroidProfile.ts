import { xyMassCenter, xyMaximaY } from 'ml-spectra-processing';

import type { Peak } from './types';

export interface CentroidProfileOptions {
  /**
   * Local maxima lower than this fraction of the highest point are noise and dropped.
   * @default 0.001
   */
  minRelativeHeight?: number;
}

/**
 * Centroid profile (continuum) mass spectral data into a peak list. Each local
 * maximum (ml-spectra-processing `xyMaximaY`) is widened down hill on both
 * sides to the nearest minimum or zero; the peak's m/z is the intensity-weighted
 * centre of that region (`xyMassCenter`) and its intensity the region's sum,
 * proportional to the area for equally spaced data.
 * @param data - x ascending, equally spaced; y >= 0.
 * @param options - noise threshold.
 * @returns peaks, m/z ascending.
 */
export function centroidProfile(
  data: { x: number[]; y: number[] },
  options: CentroidProfileOptions = {},
): Peak[] {
  const { minRelativeHeight = 0.001 } = options;
  if (!(minRelativeHeight >= 0 && minRelativeHeight < 1)) {
    throw new RangeError('minRelativeHeight must be in [0, 1)');
  }
  const { x, y } = data;
  if (x.length !== y.length) throw new RangeError('x and y must have the same length');
  if (x.length === 0) return [];
  // pad with zeros so that a maximum on the first or last point is found too
  const step = x.length > 1 ? x[1] - x[0] : 1;
  const px = [x[0] - step, ...x, x.at(-1)! + step];
  const py = [0, ...y, 0];
  let highest = 0;
  for (const value of y) if (value > highest) highest = value;
  if (highest <= 0) return [];
  const threshold = highest * minRelativeHeight;
  const peaks: Peak[] = [];
  const maxima = xyMaximaY({ x: px, y: py });
  let lastTo = -1;
  for (const maximum of maxima) {
    if (maximum.y <= 0 || maximum.y < threshold) continue;
    let from = maximum.index;
    while (from > 0 && py[from - 1] > 0 && py[from - 1] <= py[from]) from--;
    let to = maximum.index;
    while (to < py.length - 1 && py[to + 1] > 0 && py[to + 1] <= py[to]) to++;
    // neighbouring maxima share their minimum: give it to the left one
    if (from <= lastTo) from = lastTo + 1;
    lastTo = to;
    let sum = 0;
    for (let i = from; i <= to; i++) sum += py[i];
    if (sum <= 0) continue;
    const mz = xyMassCenter({ x: px, y: py }, { fromIndex: from, toIndex: to });
    peaks.push([mz, sum]);
  }
  return peaks;
}
