/**
 * Check values copied from docs/reference.md (sec. 4), where they
 * are tagged [C]: computed with astropy 5.2.1 / scipy 1.10.1 quadrature and
 * printed to the digits kept here. Tables in order of the columns:
 * z, lookback Gyr, D_C Mpc, D_L Mpc, D_A Mpc, distance modulus mag, kpc/arcsec.
 */
import type { CosmologyParams } from '../../../src/core/types';

export interface ReferenceCase {
  label: string;
  params: CosmologyParams;
  /** [z, age Gyr], 4 decimals printed. */
  ages: ReadonlyArray<readonly [number, number]>;
  /** [z, t_L, D_C, D_L, D_A, DM, kpc/"]; decimals 4, 2, 2, 2, 4, 4. */
  rows: ReadonlyArray<readonly [number, number, number, number, number, number, number]>;
}

/** Case A: astropy FlatLambdaCDM(H0=70, Om0=0.3, Tcmb0=0), no radiation [C]; also reproduced by direct scipy quadrature. */
export const CASE_A: ReferenceCase = {
  label: 'A: flat, H0 = 70, Om = 0.3, no radiation (astropy 5.2.1 FlatLambdaCDM, Tcmb0 = 0)',
  params: { h0: 70, omegaM: 0.3, omegaK: 0, omegaR: 0 },
  ages: [[0, 13.467], [0.5, 8.4263], [1, 5.7516], [2, 3.2266], [3, 2.1125], [5, 1.1548], [7, 0.7508]],
  rows: [
    [0.1, 1.3013, 418.45, 460.3, 380.41, 38.3152, 1.8443],
    [0.5, 5.0406, 1888.63, 2832.94, 1259.08, 42.2612, 6.1042],
    [1, 7.7153, 3303.83, 6607.66, 1651.91, 44.1002, 8.0087],
    [2, 10.2404, 5179.86, 15539.59, 1726.62, 45.9572, 8.3709],
    [3, 11.3545, 6355.69, 25422.74, 1588.92, 47.0261, 7.7033],
    [5, 12.3122, 7775.37, 46652.22, 1295.9, 48.3444, 6.2827],
  ],
};

/** Case C: astropy FlatLambdaCDM(H0=67.66, Om0=0.30966, Tcmb0=0), no radiation [C]. */
export const CASE_C: ReferenceCase = {
  label: 'C: flat, H0 = 67.66, Om = 0.30966, no radiation (astropy 5.2.1 FlatLambdaCDM, Tcmb0 = 0)',
  params: { h0: 67.66, omegaM: 0.30966, omegaK: 0, omegaR: 0 },
  ages: [[0, 13.8095], [0.5, 8.6107], [1, 5.8676], [2, 3.2877], [3, 2.1518], [5, 1.176], [7, 0.7646]],
  rows: [
    [0.1, 1.3453, 432.61, 475.88, 393.29, 38.3875, 1.9067],
    [0.5, 5.1988, 1947.44, 2921.17, 1298.3, 42.3278, 6.2943],
    [1, 7.9419, 3398.72, 6797.44, 1699.36, 44.1617, 8.2387],
    [2, 10.5218, 5315.27, 15945.8, 1771.76, 46.0132, 8.5897],
    [3, 11.6577, 6514.1, 26056.41, 1628.53, 47.0796, 7.8953],
    [5, 12.6335, 7960.47, 47762.83, 1326.75, 48.3955, 6.4322],
  ],
};

/**
 * Wright (2006, PASP 118, 1711) calculator default inputs, flat, H0 = 69.6,
 * Om = 0.286, constant radiation Or = 4.165e-5 / h^2, OL = 1 - Om - Or; values
 * at z = 3 computed with astropy 5.2.1 [C] (the web calculator prints the same
 * to its digits [M]). Pure constant radiation, so a constant Omega_r model
 * reproduces it exactly; the Planck18 table of docs/reference.md sec. 4 (case B) is not
 * used because its massive neutrinos make Omega_r vary with z.
 */
const H_WRIGHT = 0.696;
export const WRIGHT_RADIATION = {
  params: { h0: 69.6, omegaM: 0.286, omegaK: 0, omegaR: 4.165e-5 / (H_WRIGHT * H_WRIGHT) } as CosmologyParams,
  z: 3,
  comovingDistanceMpc: 6481.05,
  angularDiameterDistanceMpc: 1620.26,
  luminosityDistanceMpc: 25924.22,
  kpcPerArcsec: 7.8553,
  ageNowGyr: 13.7202,
  ageAtZGyr: 2.1714,
};

/** Hubble time and distance for H0 = 70 (docs/reference.md sec. 4, case A) [C]. */
export const HUBBLE_70 = { timeGyr: 13.96846, distanceMpc: 4282.7494 };

/**
 * |actual - expected| within the larger of a relative tolerance and half a unit
 * in the last printed digit of the reference value (the table's own rounding).
 */
export function tolerance(expected: number, rel: number, decimals: number): number {
  return Math.max(rel * Math.abs(expected), 0.5 * 10 ** -decimals) * (1 + 1e-9);
}
