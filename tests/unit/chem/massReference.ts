// Reference data for the mass tests, typed in by hand (not taken from mf-parser).

/**
 * Masses of the most abundant isotope of each element, u: AME2020 / NIST
 * "Atomic Weights and Isotopic Compositions" (values recalled from memory).
 */
export const ISOTOPE_MASS: Record<string, number> = {
  H: 1.00782503223,
  C: 12,
  N: 14.00307400443,
  O: 15.99491461957,
  F: 18.99840316273,
  Si: 27.97692653465,
  P: 30.97376199842,
  S: 31.9720711744,
  Cl: 34.968852682,
  Br: 78.9183376,
  I: 126.9044719,
};

/** Mass numbers of the most abundant isotope of each element (same table). */
export const MASS_NUMBER: Record<string, number> = {
  H: 1, C: 12, N: 14, O: 16, F: 19, Si: 28, P: 31, S: 32, Cl: 35, Br: 79, I: 127,
};

/**
 * IUPAC CIAAW standard atomic weights (2021): intervals for interval elements;
 * for the others the abridged value with its abridged uncertainty (from memory).
 */
export const ATOMIC_WEIGHT_INTERVAL: Record<string, [number, number]> = {
  H: [1.00784, 1.00811],
  C: [12.0096, 12.0116],
  N: [14.00643, 14.00728],
  O: [15.99903, 15.99977],
  Si: [28.084, 28.086],
  S: [32.059, 32.076],
  Cl: [35.446, 35.457],
  Br: [79.901, 79.907],
  F: [18.997, 18.999],
  P: [30.973, 30.975],
  I: [126.89, 126.91],
};

/** Formulas with their atom counts, written out by hand. */
export const FORMULAS: Array<[string, Record<string, number>]> = [
  ['CH4', { C: 1, H: 4 }],
  ['H2O', { H: 2, O: 1 }],
  ['C7H8', { C: 7, H: 8 }],
  ['CH3Br', { C: 1, H: 3, Br: 1 }],
  ['CHCl3', { C: 1, H: 1, Cl: 3 }],
  ['C3H6O', { C: 3, H: 6, O: 1 }],
  ['C5H5N', { C: 5, H: 5, N: 1 }],
  ['CCl4', { C: 1, Cl: 4 }],
  ['C6H5Br', { C: 6, H: 5, Br: 1 }],
  ['C8H10N4O2', { C: 8, H: 10, N: 4, O: 2 }],
  ['C40H82', { C: 40, H: 82 }],
  ['CI4', { C: 1, I: 4 }],
  ['C6H6', { C: 6, H: 6 }],
  ['C2H6O', { C: 2, H: 6, O: 1 }],
  ['CO2', { C: 1, O: 2 }],
  ['N2', { N: 2 }],
  ['C6H5Cl', { C: 6, H: 5, Cl: 1 }],
  ['C6H12O6', { C: 6, H: 12, O: 6 }],
  ['C2H3N', { C: 2, H: 3, N: 1 }],
  ['C10H8', { C: 10, H: 8 }],
  ['C3H4', { C: 3, H: 4 }],
  ['C6H10', { C: 6, H: 10 }],
  ['CH3I', { C: 1, H: 3, I: 1 }],
  ['C6H5F', { C: 6, H: 5, F: 1 }],
  ['C2H6OS', { C: 2, H: 6, O: 1, S: 1 }],
  ['C8H24O4Si4', { C: 8, H: 24, O: 4, Si: 4 }],
  ['H3PO4', { H: 3, P: 1, O: 4 }],
  ['C6H15O4P', { C: 6, H: 15, O: 4, P: 1 }],
  ['C2HCl3O', { C: 2, H: 1, Cl: 3, O: 1 }],
  ['C12H8Cl2', { C: 12, H: 8, Cl: 2 }],
  ['C6H4Br2', { C: 6, H: 4, Br: 2 }],
  ['CBrF3', { C: 1, Br: 1, F: 3 }],
  ['C4H4S', { C: 4, H: 4, S: 1 }],
  ['C12Cl10', { C: 12, Cl: 10 }],
];

export function sum(counts: Record<string, number>, table: Record<string, number>): number {
  return Object.entries(counts).reduce((total, [symbol, n]) => total + n * table[symbol], 0);
}
