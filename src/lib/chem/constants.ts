/** Electron rest mass in u (CODATA 2018: 5.485 799 090 65e-4 u), as used for m/z of radical cations. */
export const ELECTRON_MASS = 0.00054858;

/** Elements counted as halogens (they take the place of a hydrogen in IHD). */
export const HALOGENS = ['F', 'Cl', 'Br', 'I'] as const;
