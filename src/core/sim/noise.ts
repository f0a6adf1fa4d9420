/**
 * Observation effects: per-pixel Gaussian noise with a known inverse variance,
 * extra noise and imperfect subtraction at night-sky lines, bad columns, and
 * optional uncorrected telluric absorption.
 */
import { median } from '../numeric/median';
import type { Rng } from './prng';
import { addGaussian, observedSigmaA } from './profiles';
import { SKY_LINES, TELLURIC_BANDS } from './sky';

/** Extra sigma at a sky line's peak per unit strength, in units of the continuum noise (by eye). */
export const SKY_NOISE_PER_STRENGTH = 6;

/**
 * Noise shape against wavelength (unit-free, ~1 in the middle): the blue end
 * loses sensitivity and the far red picks up sky and detector fringing (shape by eye).
 */
export function noiseShape(wlA: number): number {
  const blue = 1.2 * Math.exp(-(wlA - 3600) / 300);
  const red = wlA > 7000 ? 0.6 * ((wlA - 7000) / 2200) ** 2 : 0;
  return 1 + blue + red;
}

/**
 * Sigma per pixel (flux units) so that the median of continuum/sigma over the
 * pixels is `snr`; sky-line pixels get extra variance from the line photons.
 * Returns sigma and the sky-line profile (per pixel, unit peak ~ strength).
 */
export function noiseSigma(wl: Float64Array, edges: Float64Array, continuum: Float64Array, snr: number, resolutionR: number) {
  const n = wl.length;
  const shape = new Float64Array(n);
  for (let i = 0; i < n; i++) shape[i] = noiseShape(wl[i]);
  const ratio = new Float64Array(n);
  for (let i = 0; i < n; i++) ratio[i] = continuum[i] / shape[i];
  const med = median(ratio);
  const k = med / snr;
  // Sky-line photons: a line of strength s adds sigma (SKY_NOISE_PER_STRENGTH s) k at its peak (by eye).
  const sky = new Float64Array(n);
  for (const l of SKY_LINES) {
    const sig = observedSigmaA(l.vacA, 10, resolutionR);
    // unit peak: area = s * sigma * sqrt(2 pi)
    addGaussian(sky, edges, l.vacA, sig, l.strength * sig * Math.sqrt(2 * Math.PI));
  }
  const sigma = new Float64Array(n);
  for (let i = 0; i < n; i++) sigma[i] = k * Math.hypot(shape[i], SKY_NOISE_PER_STRENGTH * sky[i]);
  return { sigma, sky, sigmaScale: k };
}

/** The median of the finite values (the project's one median, src/core/numeric). */
export { median };

/** Multiplicative telluric transmission with soft band edges, depth scaled by `amount` (0..1+). */
export function telluricTransmission(wl: Float64Array, amount: number): Float64Array {
  const t = new Float64Array(wl.length).fill(1);
  for (const b of TELLURIC_BANDS) {
    for (let i = 0; i < wl.length; i++) {
      const inside = 1 / (1 + Math.exp(-(wl[i] - b.fromA) / 2)) / (1 + Math.exp((wl[i] - b.toA) / 4));
      t[i] *= 1 - Math.min(0.95, b.depth * amount) * inside;
    }
  }
  return t;
}

/**
 * Bad columns: 1-4 runs of 1-6 pixels anywhere in the spectrum. Returns a
 * mask (1 = bad).
 */
export function badColumns(n: number, rng: Rng): Uint8Array {
  const mask = new Uint8Array(n);
  const runs = rng.int(1, 4);
  for (let r = 0; r < runs; r++) {
    const len = rng.int(1, 6);
    const at = rng.int(0, Math.max(0, n - len));
    for (let i = at; i < at + len; i++) mask[i] = 1;
  }
  return mask;
}
