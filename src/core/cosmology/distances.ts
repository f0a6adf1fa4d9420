/**
 * Cosmological distances in Mpc (Hogg 1999, astro-ph/9905116, sec. 5-8).
 * Every function checks the model and z >= 0 and throws a RangeError otherwise.
 */
import type { CosmologyParams } from '../types';
import { hubbleDistanceMpc, KPC_PER_MPC, RAD_PER_ARCSEC } from './constants';
import { checkCosmology } from './params';
import { checkRedshift } from './redshift';
import { comovingIntegral } from './integrals';

/** Line-of-sight comoving distance D_C, Mpc (Hogg 1999 eq. 15). */
export function comovingDistanceMpc(z: number, p: CosmologyParams): number {
  checkCosmology(p);
  checkRedshift(z);
  return hubbleDistanceMpc(p.h0) * comovingIntegral(z, p);
}

/**
 * Transverse comoving distance D_M from D_C (Hogg 1999 eq. 16): sinh for an open
 * model (Omega_k > 0), sin for a closed one, D_C when flat. Inputs already checked.
 */
export function transverseFromComoving(dcMpc: number, p: CosmologyParams): number {
  const ok = p.omegaK;
  if (ok === 0) return dcMpc;
  const dh = hubbleDistanceMpc(p.h0);
  const r = Math.sqrt(Math.abs(ok));
  return ok > 0 ? (dh / r) * Math.sinh((r * dcMpc) / dh) : (dh / r) * Math.sin((r * dcMpc) / dh);
}

/** Transverse comoving distance D_M, Mpc (Hogg 1999 eq. 16). */
export function transverseComovingDistanceMpc(z: number, p: CosmologyParams): number {
  return transverseFromComoving(comovingDistanceMpc(z, p), p);
}

/** Luminosity distance D_L = (1+z) D_M, Mpc (Hogg 1999 eq. 21). */
export function luminosityDistanceMpc(z: number, p: CosmologyParams): number {
  return (1 + z) * transverseComovingDistanceMpc(z, p);
}

/** Angular diameter distance D_A = D_M / (1+z), Mpc (Hogg 1999 eq. 18). */
export function angularDiameterDistanceMpc(z: number, p: CosmologyParams): number {
  return transverseComovingDistanceMpc(z, p) / (1 + z);
}

/**
 * Distance modulus DM = 5 log10(D_L / 10 pc), mag (Hogg 1999 eq. 25).
 * -Infinity at z = 0, where D_L = 0.
 */
export function distanceModulusMag(z: number, p: CosmologyParams): number {
  return distanceModulusFromLuminosity(luminosityDistanceMpc(z, p));
}

/** 5 log10(D_L / 10 pc) with D_L in Mpc (10 pc = 1e-5 Mpc). */
export function distanceModulusFromLuminosity(dlMpc: number): number {
  return 5 * Math.log10(dlMpc) + 25;
}

/** Proper transverse size subtended by one arcsecond at z, kpc: D_A * pi/648000 (Hogg 1999 sec. 6). */
export function kpcPerArcsec(z: number, p: CosmologyParams): number {
  return angularDiameterDistanceMpc(z, p) * KPC_PER_MPC * RAD_PER_ARCSEC;
}
