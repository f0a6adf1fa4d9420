import type { CosmologyParams } from '../types';
import { hubbleDistanceMpc, hubbleTimeGyr, KPC_PER_MPC, RAD_PER_ARCSEC } from './constants';
import { checkCosmology } from './params';
import { checkRedshift } from './redshift';
import { ageIntegral, comovingIntegral } from './integrals';
import { distanceModulusFromLuminosity, transverseFromComoving } from './distances';

/** Every derived quantity at one redshift; units in the names. */
export interface DerivedQuantities {
  z: number;
  comovingDistanceMpc: number;
  transverseComovingDistanceMpc: number;
  luminosityDistanceMpc: number;
  angularDiameterDistanceMpc: number;
  /** -Infinity at z = 0. */
  distanceModulusMag: number;
  lookbackTimeGyr: number;
  ageGyr: number;
  kpcPerArcsec: number;
}

/**
 * All quantities at z in one pass: one comoving integral and two time
 * integrals, instead of the repeated work of calling each function. Same
 * formulas as distances.ts and times.ts (Hogg 1999, astro-ph/9905116).
 */
export function derivedQuantities(z: number, p: CosmologyParams): DerivedQuantities {
  checkCosmology(p);
  checkRedshift(z);
  const dc = hubbleDistanceMpc(p.h0) * comovingIntegral(z, p);
  const dm = transverseFromComoving(dc, p);
  const dl = (1 + z) * dm;
  const da = dm / (1 + z);
  const tH = hubbleTimeGyr(p.h0);
  const a = 1 / (1 + z);
  return {
    z,
    comovingDistanceMpc: dc,
    transverseComovingDistanceMpc: dm,
    luminosityDistanceMpc: dl,
    angularDiameterDistanceMpc: da,
    distanceModulusMag: distanceModulusFromLuminosity(dl),
    lookbackTimeGyr: z === 0 ? 0 : tH * ageIntegral(a, 1, p),
    ageGyr: tH * ageIntegral(0, a, p),
    kpcPerArcsec: da * KPC_PER_MPC * RAD_PER_ARCSEC,
  };
}
