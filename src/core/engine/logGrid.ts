/**
 * The one logarithmic wavelength grid every part of the engine shares.
 *
 * Pixel k (an integer, absolute: the same k means the same wavelength for every
 * spectrum and every template) has its centre at log10(lambda / 1 A) = k * DLOG10
 * and its edges half a pixel either side. On this grid a redshift is a whole
 * shift of n pixels: 1 + z = 10^(n * DLOG10) (docs/reference.md sec. 3).
 */

/** Pixel size in log10(lambda), dimensionless. */
export const DLOG10 = 1e-4;

import { C_KMS } from '../constants';

export { C_KMS };

/** Velocity width of one pixel, km/s: c ln(10) DLOG10 = 69.0298 km/s (docs/reference.md sec. 3). */
export const KMS_PER_PIXEL = C_KMS * Math.LN10 * DLOG10;

/** Centre wavelength of absolute pixel k (fractional k allowed), Angstrom. Math.exp, not Math.pow(10, .): the same to a few ulp and several times faster in V8. */
export function wavelengthOfPixel(k: number, dlog10 = DLOG10): number {
  return Math.exp(k * dlog10 * Math.LN10);
}

/** Fractional absolute pixel coordinate of a wavelength in Angstrom. */
export function pixelOfWavelength(lambdaA: number, dlog10 = DLOG10): number {
  return Math.log10(lambdaA) / dlog10;
}

/** Redshift of a shift of n pixels (fractional allowed): 1 + z = 10^(n dlog10), as expm1 (exact near z = 0, and much faster than Math.pow). */
export function zOfShift(n: number, dlog10 = DLOG10): number {
  return Math.expm1(n * dlog10 * Math.LN10);
}

/** Shift in pixels (fractional) that corresponds to redshift z. */
export function shiftOfZ(z: number, dlog10 = DLOG10): number {
  return Math.log10(1 + z) / dlog10;
}

/** dz per pixel of shift at redshift z: d(10^(n d))/dn = ln(10) d (1 + z). */
export function dzPerPixel(z: number, dlog10 = DLOG10): number {
  return Math.LN10 * dlog10 * (1 + z);
}

/** Number of pixels that a velocity in km/s spans (ln(1 + v/c) in pixel units). */
export function pixelsOfVelocity(vKms: number, dlog10 = DLOG10): number {
  return Math.log1p(vKms / C_KMS) / (Math.LN10 * dlog10);
}

/** Velocity separation of two redshifts, km/s: c ln((1 + z2)/(1 + z1)). */
export function velocitySeparationKms(z1: number, z2: number): number {
  return C_KMS * Math.log((1 + z2) / (1 + z1));
}
