/**
 * Single-epoch virial black-hole masses, bolometric corrections and the
 * Eddington luminosity, each with its paper beside its constants. All masses
 * follow one form,
 *
 *   log10(M / M_sun) = a + b log10(lambda L_lambda / 1e44 erg/s) + 2 log10(FWHM / 1000 km/s),
 *
 * so a calibration is (a, b) and the continuum wavelength it uses.
 * Constants are from memory of the papers' equations; docs/reference.md lists them.
 */
import type { BroadLineId, ContinuumRefA } from './regions';

export interface MassCalibration {
  id: string;
  line: BroadLineId;
  luminosityA: ContinuumRefA;
  /** Zero point with FWHM in units of 1000 km/s and luminosity in 1e44 erg/s. */
  a: number;
  /** Luminosity slope. */
  b: number;
  /** The scatter the paper quotes about its calibration, dex. */
  scatterDex: number;
  source: string;
}

export const MASS_CALIBRATIONS: readonly MassCalibration[] = [
  // Vestergaard & Peterson 2006, ApJ 641, 689, eq. 5: log M = log[(FWHM/1000)^2 (lambda L5100/1e44)^0.50] + 6.91; scatter 0.43 dex.
  { id: 'hbeta_vp06', line: 'Hbeta', luminosityA: 5100, a: 6.91, b: 0.5, scatterDex: 0.43, source: 'Vestergaard & Peterson 2006, ApJ 641, 689, eq. 5' },
  // Vestergaard & Osmer 2009, ApJ 699, 800, eq. 1: log M = log[(FWHM/1000)^2 (lambda L3000/1e44)^0.50] + 6.86; scatter 0.55 dex.
  { id: 'mgii_vo09', line: 'MgII', luminosityA: 3000, a: 6.86, b: 0.5, scatterDex: 0.55, source: 'Vestergaard & Osmer 2009, ApJ 699, 800, eq. 1' },
  // Shen et al. 2011, ApJS 194, 45, eq. 8: log M = 0.740 + 0.62 log(lambda L3000/1e44) + 2 log(FWHM / km/s), i.e. a = 0.740 + 6.
  { id: 'mgii_s11', line: 'MgII', luminosityA: 3000, a: 6.74, b: 0.62, scatterDex: 0.4, source: 'Shen et al. 2011, ApJS 194, 45, eq. 8 (calibrated against the H-beta masses of VP06)' },
  // Vestergaard & Peterson 2006, ApJ 641, 689, eq. 7: log M = log[(FWHM/1000)^2 (lambda L1350/1e44)^0.53] + 6.66; scatter 0.36 dex.
  { id: 'civ_vp06', line: 'CIV', luminosityA: 1350, a: 6.66, b: 0.53, scatterDex: 0.36, source: 'Vestergaard & Peterson 2006, ApJ 641, 689, eq. 7' },
];

/**
 * The systematic uncertainty written beside every single-epoch mass, dex:
 * about 0.4 dex (common practice; the calibrations' own scatter is 0.36-0.55 dex,
 * Vestergaard & Peterson 2006; Shen 2013, BASI 41, 61, reviews it as ~0.4-0.5 dex).
 */
export const MASS_SYSTEMATIC_DEX = 0.4;

/**
 * Bolometric corrections L_bol = BC x lambda L_lambda from the mean quasar SED of
 * Richards et al. (2006, ApJS 166, 470), as Shen et al. (2011, ApJS 194, 45,
 * sec. 3.4) use them: 3.81 at 1350 A, 5.15 at 3000 A, 9.26 at 5100 A.
 */
export const BOLOMETRIC_CORRECTION: Readonly<Record<ContinuumRefA, number>> = { 1350: 3.81, 3000: 5.15, 5100: 9.26 };

/** Eddington luminosity per solar mass, erg/s: 1.26e38 (ionised hydrogen, Thomson scattering; common practice). */
export const EDDINGTON_ERG_S_PER_MSUN = 1.26e38;

/** log10 of the virial mass, M_sun, from a calibration, FWHM (km/s) and lambda L_lambda (erg/s). */
export function logVirialMass(c: Pick<MassCalibration, 'a' | 'b'>, fwhmKms: number, lambdaLErgS: number): number {
  return c.a + c.b * Math.log10(lambdaLErgS / 1e44) + 2 * Math.log10(fwhmKms / 1000);
}

/** Statistical error of log M, dex, from the FWHM and luminosity errors (first order; they are taken as independent). */
export function logVirialMassErr(c: Pick<MassCalibration, 'b'>, fwhmKms: number, fwhmErrKms: number, lambdaLErgS: number, lambdaLErrErgS: number): number {
  const dF = (2 * fwhmErrKms) / (fwhmKms * Math.LN10);
  const dL = (c.b * lambdaLErrErgS) / (lambdaLErgS * Math.LN10);
  return Math.sqrt(dF * dF + dL * dL);
}

/**
 * The preferred estimate by redshift, as Shen et al. (2011, sec. 3.4) chose
 * their fiducial masses: H-beta (VP06) below z = 0.7, Mg II (S11) for
 * 0.7 <= z < 1.9, C IV (VP06) from 1.9. When that estimate is missing, the
 * first available of H-beta, Mg II (S11), Mg II (VO09), C IV.
 */
export function preferredOrder(z: number): string[] {
  const first = z < 0.7 ? 'hbeta_vp06' : z < 1.9 ? 'mgii_s11' : 'civ_vp06';
  return [first, ...['hbeta_vp06', 'mgii_s11', 'mgii_vo09', 'civ_vp06'].filter((id) => id !== first)];
}
