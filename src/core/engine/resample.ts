/**
 * Flux-conserving resampling onto the shared logarithmic grid (logGrid.ts).
 *
 * Each output pixel's flux density is the overlap-weighted mean of the input
 * flux densities that cover it (pixel-overlap rebinning), so the integral
 * sum(f dlambda) is kept wherever the input is good. The variance of that mean
 * is propagated exactly: var_k = sum_i a_ik^2 var_i with a_ik = o_ik / sum_i o_ik
 * (o_ik the overlap in Angstrom). Masked, non-finite and ivar = 0 input pixels
 * take no part; an output pixel less than half covered by good input gets ivar 0.
 */
import type { Spectrum } from '../types';
import { DLOG10 } from './logGrid';
import { estimateIvar } from './noiseEstimate';

/** A spectrum on the log grid: pixel j sits at absolute index k0 + j. */
export interface LogSpectrum {
  /** Absolute index of the first pixel (log10 lambda of its centre = k0 * dlog10). */
  k0: number;
  /** Pixel size in log10(lambda). */
  dlog10: number;
  /** Flux density (input units, or normalised when stated by the producer). */
  flux: Float64Array;
  /** Inverse variance of flux; 0 = no information. */
  ivar: Float64Array;
  /** True when the input carried no uncertainty and it was estimated from the data. */
  noiseEstimated: boolean;
}

/** Minimum fraction of an output pixel that good input must cover. */
const MIN_COVERAGE = 0.5;

/** Input pixel edges in Angstrom: midpoints between centres, mirrored at the ends. */
export function pixelEdgesA(wl: Float64Array): Float64Array {
  const n = wl.length;
  const e = new Float64Array(n + 1);
  for (let i = 1; i < n; i++) e[i] = 0.5 * (wl[i - 1] + wl[i]);
  e[0] = wl[0] - 0.5 * (wl[1] - wl[0]);
  e[n] = wl[n - 1] + 0.5 * (wl[n - 1] - wl[n - 2]);
  if (e[0] <= 0) e[0] = wl[0] * 0.5; // keep log10 defined for absurd first pixels
  return e;
}

/** Which input pixels carry information (mask clear, finite flux, positive ivar). */
export function goodPixels(s: Spectrum): Uint8Array {
  const n = s.flux.length;
  const good = new Uint8Array(n);
  for (let i = 0; i < n; i++) {
    const ok = s.mask[i] === 0 && Number.isFinite(s.flux[i]) && (s.ivar === null || s.ivar[i] > 0);
    good[i] = ok ? 1 : 0;
  }
  return good;
}

/**
 * Resample a spectrum onto the log grid (pixel size dlog10, default DLOG10).
 * When spectrum.ivar is null the noise is estimated (noiseEstimate.ts) and
 * the result says so.
 */
export function resampleToLogGrid(s: Spectrum, dlog10 = DLOG10): LogSpectrum {
  const wl = s.wavelengthA;
  const n = wl.length;
  const good = goodPixels(s);
  const noiseEstimated = s.ivar === null;
  const ivarIn = s.ivar ?? estimateIvar(s.flux, good);
  const edges = pixelEdgesA(wl);
  const k0 = Math.round(Math.log10(wl[0]) / dlog10);
  const k1 = Math.round(Math.log10(wl[n - 1]) / dlog10);
  const m = k1 - k0 + 1;
  const flux = new Float64Array(m);
  const ivar = new Float64Array(m);
  let i = 0;
  let hi = Math.pow(10, (k0 - 0.5) * dlog10);
  for (let j = 0; j < m; j++) {
    // Each output edge once: this pixel's lower edge is the last one's upper edge (same expression).
    const lo = hi;
    hi = Math.pow(10, (k0 + j + 0.5) * dlog10);
    while (i < n && edges[i + 1] <= lo) i++;
    let sumO = 0;
    let sumOF = 0;
    let sumO2V = 0;
    for (let p = i; p < n && edges[p] < hi; p++) {
      if (!good[p]) continue;
      const o = Math.min(hi, edges[p + 1]) - Math.max(lo, edges[p]);
      if (o <= 0) continue;
      sumO += o;
      sumOF += o * s.flux[p];
      sumO2V += (o * o) / ivarIn[p];
    }
    if (sumO >= MIN_COVERAGE * (hi - lo) && sumO2V > 0) {
      flux[j] = sumOF / sumO;
      ivar[j] = (sumO * sumO) / sumO2V;
    }
  }
  return { k0, dlog10, flux, ivar, noiseEstimated };
}

/**
 * Combine groups of `factor` neighbouring pixels into one (inverse-variance
 * weighted mean), aligned on absolute indices so that binned pixel K holds
 * fine pixels factor*K .. factor*K + factor - 1. Used for the coarse scan.
 */
export function binLogSpectrum(ls: LogSpectrum, factor: number): LogSpectrum {
  if (factor === 1) return ls;
  const K0 = Math.floor(ls.k0 / factor);
  const K1 = Math.floor((ls.k0 + ls.flux.length - 1) / factor);
  const m = K1 - K0 + 1;
  const flux = new Float64Array(m);
  const ivar = new Float64Array(m);
  for (let j = 0; j < ls.flux.length; j++) {
    const w = ls.ivar[j];
    if (!(w > 0)) continue;
    const J = Math.floor((ls.k0 + j) / factor) - K0;
    flux[J] += w * ls.flux[j];
    ivar[J] += w;
  }
  for (let J = 0; J < m; J++) if (ivar[J] > 0) flux[J] /= ivar[J];
  return { k0: K0, dlog10: ls.dlog10 * factor, flux, ivar, noiseEstimated: ls.noiseEstimated };
}
