/**
 * Mean Lyman-alpha forest absorption at an observed wavelength.
 * tau_eff(z) = 0.0018 (1 + z)^3.92 (Faucher-Giguere et al. 2008, ApJ 688, 85;
 * fitted for 2 <= z <= 4.2, extrapolated outside), with the absorber redshift
 * 1 + z = lambda_obs / 1215.67 A; mean transmission F = exp(-tau_eff).
 */
import { LYA_REST_A } from './templates';

/** Mean transmission F at observed wavelength lambda (Angstrom). */
export function forestTransmission(lambdaObsA: number): number {
  const onePlusZ = lambdaObsA / LYA_REST_A;
  return Math.exp(-0.0018 * Math.pow(onePlusZ, 3.92));
}

/** Absorbed fraction 1 - F at observed wavelength lambda (Angstrom). */
export function forestDepth(lambdaObsA: number): number {
  return 1 - forestTransmission(lambdaObsA);
}
