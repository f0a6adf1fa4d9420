/**
 * A stretch of a spectrum prepared for local line work: wavelengths, flux and
 * per-pixel weights (inverse variance), with bad pixels at weight 0.
 */
import type { Spectrum } from '../../types';

export interface PixelWindow {
  /** Index of the first pixel in the spectrum. */
  start: number;
  /** Observed vacuum wavelength, Angstrom. */
  xA: Float64Array;
  /** Flux, spectrum flux unit. */
  y: Float64Array;
  /** Inverse variance, 1 / flux unit^2; 0 for masked, NaN-flux or no-information pixels. */
  w: Float64Array;
  /** True when the spectrum had no uncertainty and the noise was estimated from the scatter. */
  noiseEstimated: boolean;
  /** Number of pixels with weight > 0. */
  nGood: number;
}

/** First index i with wavelengthA[i] >= valueA (wavelengths strictly increasing). */
export function lowerIndex(wavelengthA: Float64Array, valueA: number): number {
  let lo = 0;
  let hi = wavelengthA.length;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if (wavelengthA[mid] < valueA) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}

/** Local pixel width at index i, Angstrom (half the distance between the neighbours). */
export function pixelWidthA(wavelengthA: Float64Array, i: number): number {
  const n = wavelengthA.length;
  const a = Math.max(0, Math.min(n - 2, i - 1));
  const b = Math.min(n - 1, Math.max(1, i + 1));
  return (wavelengthA[b] - wavelengthA[a]) / (b - a);
}

/** Pixel width at a wavelength, Angstrom. */
export function pixelWidthAt(spectrum: Spectrum, lambdaA: number): number {
  const i = Math.min(spectrum.wavelengthA.length - 1, lowerIndex(spectrum.wavelengthA, lambdaA));
  return pixelWidthA(spectrum.wavelengthA, i);
}

function pixelUsable(s: Spectrum, i: number): boolean {
  return s.mask[i] === 0 && Number.isFinite(s.flux[i]) && (s.ivar === null || s.ivar[i] > 0);
}

/**
 * Noise sigma per pixel from the data alone (no uncertainty given), by the
 * DER_SNR estimator (Stoehr et al. 2008, ASP Conf. Ser. 394, 505):
 * sigma = 1.482602 / sqrt(6) * median |2 f_i - f_(i-2) - f_(i+2)|.
 * The second difference cancels a smooth continuum and, with the median,
 * resists a few line pixels. Uses good pixels in [from, to); NaN if too few.
 */
export function estimateNoiseSigma(s: Spectrum, from: number, to: number): number {
  const d: number[] = [];
  const lo = Math.max(2, from);
  const hi = Math.min(s.flux.length - 2, to);
  for (let i = lo; i < hi; i++) {
    if (pixelUsable(s, i) && pixelUsable(s, i - 2) && pixelUsable(s, i + 2)) {
      d.push(Math.abs(2 * s.flux[i] - s.flux[i - 2] - s.flux[i + 2]));
    }
  }
  if (d.length < 5) return NaN;
  d.sort((a, b) => a - b);
  const m = d.length;
  const median = m % 2 ? d[(m - 1) / 2] : 0.5 * (d[m / 2 - 1] + d[m / 2]);
  return (1.482602 / Math.sqrt(6)) * median;
}

/**
 * Pixels with fromA <= lambda <= toA. Without an uncertainty array the noise is
 * estimated over the window widened to at least noiseSpanPx pixels each side of
 * its middle, so short windows still get a stable estimate.
 */
export function pixelWindow(s: Spectrum, fromA: number, toA: number, noiseSpanPx = 60): PixelWindow {
  const start = lowerIndex(s.wavelengthA, fromA);
  let end = lowerIndex(s.wavelengthA, toA);
  if (end < s.wavelengthA.length && s.wavelengthA[end] === toA) end++;
  const n = Math.max(0, end - start);
  const xA = s.wavelengthA.slice(start, start + n);
  const y = s.flux.slice(start, start + n);
  const w = new Float64Array(n);
  let noiseW = NaN;
  if (s.ivar === null) {
    const mid = (start + end) >> 1;
    const half = Math.max(noiseSpanPx, (end - start) >> 1);
    const sigma = estimateNoiseSigma(s, mid - half, mid + half);
    noiseW = sigma > 0 ? 1 / (sigma * sigma) : NaN;
  }
  let nGood = 0;
  for (let k = 0; k < n; k++) {
    const i = start + k;
    if (!pixelUsable(s, i)) continue;
    const wk = s.ivar === null ? noiseW : s.ivar[i];
    if (Number.isFinite(wk) && wk > 0) {
      w[k] = wk;
      nGood++;
    }
  }
  return { start, xA, y, w, noiseEstimated: s.ivar === null, nGood };
}
