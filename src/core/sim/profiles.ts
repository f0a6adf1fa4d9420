/**
 * Line profiles integrated over pixels, so that a narrow line keeps its flux
 * whatever the sampling (evaluating a profile at pixel centres would not).
 */

/** Speed of light, km/s (exact, SI definition). */
import { C_KMS } from '../constants';

export { C_KMS };

/** FWHM = 2 sqrt(2 ln 2) sigma for a Gaussian. */
export const FWHM_PER_SIGMA = 2 * Math.sqrt(2 * Math.LN2);

/**
 * Error function, |error| < 1.5e-7 (Abramowitz & Stegun 1964, eq. 7.1.26).
 * Plenty for simulated profiles.
 */
export function erf(x: number): number {
  const s = x < 0 ? -1 : 1;
  const a = Math.abs(x);
  const t = 1 / (1 + 0.3275911 * a);
  const y = 1 - ((((1.061405429 * t - 1.453152027) * t + 1.421413741) * t - 0.284496736) * t + 0.254829592) * t * Math.exp(-a * a);
  return s * y;
}

/** Pixel edges (n + 1 values, Angstrom) from pixel centres: midpoints, extrapolated at the ends. */
export function pixelEdges(wl: Float64Array): Float64Array {
  const n = wl.length;
  const e = new Float64Array(n + 1);
  for (let i = 1; i < n; i++) e[i] = 0.5 * (wl[i - 1] + wl[i]);
  e[0] = wl[0] - (e[1] - wl[0]);
  e[n] = wl[n - 1] + (wl[n - 1] - e[n - 1]);
  return e;
}

/** First index i with edges[i] >= x (binary search). */
function lowerBound(edges: Float64Array, x: number): number {
  let lo = 0;
  let hi = edges.length;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if (edges[mid] < x) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}

/**
 * Add `weight` times a unit-area Gaussian (centre and sigma in Angstrom),
 * averaged over each pixel, to out[] (result per Angstrom).
 * For an emission line, weight = integrated line flux (flux unit * A).
 */
export function addGaussian(out: Float64Array, edges: Float64Array, centreA: number, sigmaA: number, weight: number): void {
  if (!(sigmaA > 0) || weight === 0) return;
  const n = out.length;
  const i0 = Math.max(0, lowerBound(edges, centreA - 7 * sigmaA) - 1);
  const i1 = Math.min(n - 1, lowerBound(edges, centreA + 7 * sigmaA));
  const k = 1 / (Math.SQRT2 * sigmaA);
  let prev = erf((edges[i0] - centreA) * k);
  for (let i = i0; i <= i1; i++) {
    const cur = erf((edges[i + 1] - centreA) * k);
    out[i] += (weight * 0.5 * (cur - prev)) / (edges[i + 1] - edges[i]);
    prev = cur;
  }
}

/**
 * Add `weight` times a unit-area Lorentzian (half width at half maximum
 * gammaA), averaged over each pixel; cut at +-60 gamma (the tails beyond hold
 * about 1% of the area, which is simply dropped).
 */
export function addLorentzian(out: Float64Array, edges: Float64Array, centreA: number, gammaA: number, weight: number): void {
  if (!(gammaA > 0) || weight === 0) return;
  const n = out.length;
  const i0 = Math.max(0, lowerBound(edges, centreA - 60 * gammaA) - 1);
  const i1 = Math.min(n - 1, lowerBound(edges, centreA + 60 * gammaA));
  let prev = Math.atan((edges[i0] - centreA) / gammaA);
  for (let i = i0; i <= i1; i++) {
    const cur = Math.atan((edges[i + 1] - centreA) / gammaA);
    out[i] += (weight * (cur - prev)) / Math.PI / (edges[i + 1] - edges[i]);
    prev = cur;
  }
}

/**
 * Observed Gaussian sigma (Angstrom) of a line with intrinsic FWHM fwhmKms
 * seen through an instrument of resolving power R = lambda / FWHM: the two
 * widths add in quadrature (Gaussian convolved with Gaussian).
 */
export function observedSigmaA(observedA: number, fwhmKms: number, resolutionR: number): number {
  const instKms = C_KMS / resolutionR;
  const fwhm = Math.sqrt(fwhmKms * fwhmKms + instKms * instKms);
  return (observedA * fwhm) / C_KMS / FWHM_PER_SIGMA;
}

/** Smooth an array with a Gaussian of sigma `sigmaPix` pixels (truncated at 4 sigma, edges renormalised). */
export function smoothPixels(x: Float64Array, sigmaPix: number): Float64Array {
  const n = x.length;
  if (!(sigmaPix > 0.05)) return Float64Array.from(x);
  const h = Math.max(1, Math.ceil(4 * sigmaPix));
  const k = new Float64Array(2 * h + 1);
  for (let j = -h; j <= h; j++) k[j + h] = Math.exp((-0.5 * j * j) / (sigmaPix * sigmaPix));
  const out = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    let s = 0;
    let w = 0;
    const a = Math.max(0, i - h);
    const b = Math.min(n - 1, i + h);
    for (let m = a; m <= b; m++) {
      const kk = k[m - i + h];
      s += kk * x[m];
      w += kk;
    }
    out[i] = s / w;
  }
  return out;
}
