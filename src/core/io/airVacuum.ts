/**
 * Air <-> vacuum wavelength conversion, Angstrom.
 *
 * Refractive index of standard air (dry, 1 atm, 15 C, 450 ppm CO2) adopted by the
 * IAU: Morton 2000, ApJS 130, 403, eq. 8, from Birch & Downs 1994, Metrologia 31, 315:
 *   s = 1e4 / lambda_vac (1/um),
 *   n = 1 + 8.34254e-5 + 2.406147e-2 / (130 - s^2) + 1.5998e-4 / (38.9 - s^2).
 *
 * Wavelengths below 2000 A are vacuum by convention (all ultraviolet laboratory
 * and space data are) and are returned unchanged by both directions, as in the
 * IDL Astronomy User's Library airtovac/vactoair routines.
 */

/** Below this wavelength (Angstrom) nothing is converted. */
export const AIR_VACUUM_LIMIT_A = 2000;

/** Refractive index of standard air at vacuum wavelength `lambdaVacA` (Morton 2000, eq. 8). */
export function refractiveIndexAir(lambdaVacA: number): number {
  const s2 = (1e4 / lambdaVacA) ** 2;
  return 1 + 8.34254e-5 + 2.406147e-2 / (130 - s2) + 1.5998e-4 / (38.9 - s2);
}

/** Vacuum wavelength (Angstrom) to air (Angstrom): lambda_air = lambda_vac / n (Morton 2000). */
export function vacuumToAirA(lambdaVacA: number): number {
  if (!(lambdaVacA >= AIR_VACUUM_LIMIT_A)) return lambdaVacA; // also passes NaN through
  return lambdaVacA / refractiveIndexAir(lambdaVacA);
}

/**
 * Air wavelength (Angstrom) to vacuum (Angstrom): solves lambda_air = lambda_vac / n(lambda_vac)
 * by fixed-point iteration of Morton's formula, so both directions are exact inverses
 * (to 1e-9 A). Converges in 3-4 steps because n varies slowly with wavelength.
 */
export function airToVacuumA(lambdaAirA: number): number {
  if (!(lambdaAirA >= AIR_VACUUM_LIMIT_A) || !Number.isFinite(lambdaAirA)) return lambdaAirA;
  let vac = lambdaAirA * refractiveIndexAir(lambdaAirA);
  for (let i = 0; i < 10; i++) {
    const next = lambdaAirA * refractiveIndexAir(vac);
    if (Math.abs(next - vac) < 1e-9) return next;
    vac = next;
  }
  return vac;
}

/** Convert an array of air wavelengths (Angstrom) to vacuum in place; returns the same array. */
export function airToVacuumInPlace(lambdaA: Float64Array): Float64Array {
  for (let i = 0; i < lambdaA.length; i++) lambdaA[i] = airToVacuumA(lambdaA[i]);
  return lambdaA;
}
