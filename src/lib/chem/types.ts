/** One centroid of a mass spectrum: [m/z, intensity]; intensities on any scale. */
export type Peak = [number, number];

/** Atom counts keyed by element symbol, e.g. `{ C: 6, H: 5, Br: 1 }`. */
export type ElementCounts = Record<string, number>;

/** A halogen composition with its goodness of fit (residual sum of squares, 0 is perfect). */
export interface HalogenFit {
  Cl: number;
  Br: number;
  fit: number;
}
