/**
 * A simulated quasar (z = 1 by default) for the physics tests (invented, seeded): a
 * power law f ~ lambda^-1.5 (10 file units at 5100 A rest, by default),
 * absorbed and with broad lines as asked, on a grid from 3600 A at 1e-4 in
 * log10, with Gaussian noise a fixed fraction 1/snr of the continuum.
 */
import { createRng } from '../../../src/core/sim/prng';
import { C_KMS } from '../../../src/core/constants';
import type { Spectrum } from '../../../src/core/types';

export const FWHM_PER_SIGMA = 2 * Math.sqrt(2 * Math.LN2);

/** Gaussian of FWHM `fwhm` km/s about `centre` (rest Angstrom), peak 1. */
export function gaussianKms(rest: number, centre: number, fwhm: number): number {
  return Math.exp(-0.5 * ((C_KMS * Math.log(rest / centre)) / (fwhm / FWHM_PER_SIGMA)) ** 2);
}

export interface SimQuasarOptions {
  /** Broad-line flux above the continuum at a rest wavelength, file units (default none). */
  lines?: (rest: number) => number;
  /** Fraction of the continuum transmitted at a rest wavelength (default 1: no absorption). */
  transmission?: (rest: number) => number;
  z?: number;
  n?: number;
  /** Rest wavelength where the continuum is 10 file units (default 5100 A). */
  refA?: number;
}

export function simQuasar(seed: number, snr: number, o: SimQuasarOptions = {}): Spectrum {
  const z = o.z ?? 1;
  const n = o.n ?? 4600;
  const refA = o.refA ?? 5100;
  const rng = createRng(seed);
  const wl = new Float64Array(n);
  const flux = new Float64Array(n);
  const ivar = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    wl[i] = 3600 * 10 ** (i * 1e-4);
    const rest = wl[i] / (1 + z);
    const cont = 10 * (rest / refA) ** -1.5;
    const sigma = cont / snr;
    flux[i] = cont * (o.transmission ? o.transmission(rest) : 1) + (o.lines ? o.lines(rest) : 0) + sigma * rng.gaussian();
    ivar[i] = 1 / (sigma * sigma);
  }
  return { file: 'sim', format: 'test', wavelengthA: wl, flux, ivar, mask: new Uint8Array(n), meta: { fluxUnit: '1e-17 erg/s/cm2/A' } };
}
