/**
 * Closed-form age of a flat matter + Lambda universe without radiation, Gyr:
 * t(z) = 2 / (3 H0 sqrt(OL)) asinh( sqrt(OL/Om) (1+z)^-1.5 )
 * (formula as in reference.md sec. 4; at z = 0 it is the flat-model age of
 * Carroll, Press & Turner 1992, ARA&A 30, 499, cited from memory). Kept as an
 * independent check of the integral; throws for any model it does not describe.
 */
import type { CosmologyParams } from '../types';
import { hubbleTimeGyr } from './constants';
import { checkCosmology, omegaLambda } from './params';
import { checkRedshift } from './redshift';

export function flatMatterLambdaAgeGyr(z: number, p: CosmologyParams): number {
  checkCosmology(p);
  checkRedshift(z);
  const oL = omegaLambda(p);
  if (p.omegaK !== 0 || p.omegaR !== 0 || !(oL > 0) || !(p.omegaM > 0)) {
    throw new RangeError('the closed-form age needs a flat model with Omega_r = 0, Omega_m > 0 and Omega_Lambda > 0');
  }
  return ((2 * hubbleTimeGyr(p.h0)) / (3 * Math.sqrt(oL))) * Math.asinh(Math.sqrt(oL / p.omegaM) * Math.pow(1 + z, -1.5));
}
