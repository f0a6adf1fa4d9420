/**
 * Physical constants and unit conversions for the cosmology module.
 * Values as in docs/reference.md sec. 4: c exact (SI definition of the metre);
 * parsec from IAU 2015 Resolution B2 (1 pc = 648000/pi au, au = 149597870.7 km);
 * Gyr = 1e9 Julian years of 365.25 d.
 */

import { C_KMS } from '../constants';

/** Speed of light, km/s (exact; src/core/constants.ts). */
export const SPEED_OF_LIGHT_KMS = C_KMS;

/** One megaparsec, km (IAU 2015). */
export const MPC_KM = 3.085677581491367e19;

/** One gigayear (Julian), s. */
export const GYR_S = 3.15576e16;

/** Kiloparsecs per megaparsec. */
export const KPC_PER_MPC = 1000;

/** Radians per arcsecond: pi / (180 * 3600). */
export const RAD_PER_ARCSEC = Math.PI / 648000;

/** Hubble time 1/H0 in Gyr for H0 in km/s/Mpc. */
export function hubbleTimeGyr(h0KmsMpc: number): number {
  return MPC_KM / h0KmsMpc / GYR_S;
}

/** Hubble distance c/H0 in Mpc for H0 in km/s/Mpc. */
export function hubbleDistanceMpc(h0KmsMpc: number): number {
  return SPEED_OF_LIGHT_KMS / h0KmsMpc;
}
