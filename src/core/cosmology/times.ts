/**
 * Lookback time and age in Gyr (Hogg 1999, astro-ph/9905116, eq. 30), both
 * integrated over the scale factor a = 1/(1+z) so that the age integral to
 * infinite redshift becomes a finite interval a in (0, 1/(1+z)].
 */
import type { CosmologyParams } from '../types';
import { hubbleTimeGyr } from './constants';
import { checkCosmology } from './params';
import { checkRedshift } from './redshift';
import { ageIntegral } from './integrals';

/** Time between emission at z and today, Gyr: t_H Int_0^z dz' / ((1+z') E(z')). */
export function lookbackTimeGyr(z: number, p: CosmologyParams): number {
  checkCosmology(p);
  checkRedshift(z);
  if (z === 0) return 0;
  return hubbleTimeGyr(p.h0) * ageIntegral(1 / (1 + z), 1, p);
}

/** Age of the universe at redshift z, Gyr: t_H Int_z^inf dz' / ((1+z') E(z')). */
export function ageGyr(z: number, p: CosmologyParams): number {
  checkCosmology(p);
  checkRedshift(z);
  return hubbleTimeGyr(p.h0) * ageIntegral(0, 1 / (1 + z), p);
}
