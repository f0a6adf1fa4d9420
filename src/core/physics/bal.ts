/**
 * Broad absorption blueward of C IV, on a power-law continuum.
 *
 * Balnicity index (Weymann et al. 1991, ApJ 373, 23):
 *   BI = integral from 3,000 to 25,000 km/s of (1 - f(v)/0.9) C dv,
 * C = 1 once 1 - f/0.9 has stayed positive for 2,000 km/s without a break
 * (counted from the start of the run, inside the integration range), else 0.
 * Absorption index (Trump et al. 2006, ApJS 165, 1; from memory):
 *   AI = integral from 0 to 29,000 km/s of (1 - f(v)) C' dv,
 * C' = 1 inside contiguous runs of f < 0.9 at least 1,000 km/s wide.
 * f is the flux over the continuum. Velocities are outflow speeds from C IV
 * 1549.06 A by the relativistic Doppler formula. Each pixel stands for the
 * velocity interval between the midpoints to its good neighbours (masked
 * pixels are skipped), so a trough with a flat bottom gives BI = depth x
 * (width - 2,000 km/s) exactly.
 *
 * The continuum is a power law fitted in windows free of strong emission,
 * 1280-1350, 1700-1800, 1950-2200 and 2650-2710 A (after the windows of Gibson
 * et al. 2009, ApJ 692, 758; from memory), with pixels far below it dropped.
 * Caution: C IV emission is not modelled, so a trough sitting on the line's
 * blue wing is measured against the continuum alone and comes out shallower.
 */
import { C_KMS } from '../constants';
import { restWavelengthA } from '../lines/catalogue';
import { fitContinuum, powerLawAt, type ContinuumFit } from './continuum';
import { indexRange, type RestData } from './restData';

export const BAL_CONTINUUM_WINDOWS_A: readonly (readonly [number, number])[] = [
  [1280, 1350],
  [1700, 1800],
  [1950, 2200],
  [2650, 2710],
];

export interface Trough {
  /** Outflow speeds spanned, km/s (vFrom < vTo). */
  vFromKms: number;
  vToKms: number;
  /** Rest wavelengths spanned, Angstrom (fromA < toA). */
  restFromA: number;
  restToA: number;
  /** Largest 1 - f inside. */
  depth: number;
  /** True when part of it counts for the balnicity index (>= 2,000 km/s inside 3,000-25,000 km/s). */
  inBi: boolean;
}

export interface BalIndices {
  biKms: number;
  aiKms: number;
  troughs: Trough[];
}

/** Outflow speed of rest wavelength lambda from the line at lambda0, km/s (relativistic Doppler; positive blueward). */
export function outflowKms(lambdaA: number, lambda0A: number): number {
  const r = (lambda0A / lambdaA) ** 2;
  return (C_KMS * (r - 1)) / (r + 1);
}

/** Rest wavelength of an outflow speed (inverse of outflowKms). */
export function restOfOutflow(vKms: number, lambda0A: number): number {
  const b = vKms / C_KMS;
  return lambda0A * Math.sqrt((1 - b) / (1 + b));
}

/** BI and AI from normalised flux on pixels of increasing outflow speed (v, f) with their interval edges. */
export function balIndices(v: ArrayLike<number>, f: ArrayLike<number>, lambda0A = restWavelengthA('CIV')): BalIndices {
  const { biKms, aiKms, troughs } = balIndicesWithWeights(v, f, lambda0A);
  return { biKms, aiKms, troughs };
}

/**
 * BI and AI with the velocity each pixel counts for in each (BI = sum of
 * (1 - f_i / 0.9) biDv_i, AI = sum of (1 - f_i) aiDv_i), which the error
 * propagation needs.
 */
function balIndicesWithWeights(v: ArrayLike<number>, f: ArrayLike<number>, lambda0A: number): BalIndices & { biDv: Float64Array; aiDv: Float64Array } {
  const n = v.length;
  const biDv = new Float64Array(n);
  const aiDv = new Float64Array(n);
  const lo = new Float64Array(n);
  const hi = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    lo[i] = i === 0 ? v[0] - (v[1] - v[0]) / 2 : (v[i - 1] + v[i]) / 2;
    hi[i] = i === n - 1 ? v[n - 1] + (v[n - 1] - v[n - 2]) / 2 : (v[i] + v[i + 1]) / 2;
  }
  const clip = (a: number, b: number, from: number, to: number) => Math.max(0, Math.min(b, to) - Math.max(a, from));
  // BI: runs of f < 0.9 inside 3,000-25,000 km/s.
  let bi = 0;
  let runStart = NaN;
  for (let i = 0; i < n; i++) {
    const a = Math.max(lo[i], 3000);
    const b = Math.min(hi[i], 25000);
    if (b <= a) {
      runStart = NaN;
      continue;
    }
    const x = 1 - f[i] / 0.9;
    if (x > 0) {
      if (Number.isNaN(runStart)) runStart = a;
      biDv[i] = clip(a, b, runStart + 2000, Infinity);
      bi += x * biDv[i];
    } else runStart = NaN;
  }
  // AI and the trough list: runs of f < 0.9 inside 0-29,000 km/s, kept when >= 1,000 km/s wide.
  let ai = 0;
  const troughs: Trough[] = [];
  let i = 0;
  while (i < n) {
    if (!(f[i] < 0.9) || hi[i] <= 0 || lo[i] >= 29000) {
      i++;
      continue;
    }
    let j = i;
    while (j + 1 < n && f[j + 1] < 0.9 && lo[j + 1] < 29000) j++;
    const vFrom = Math.max(0, lo[i]);
    const vTo = Math.min(29000, hi[j]);
    if (vTo - vFrom >= 1000) {
      let depth = 0;
      for (let k = i; k <= j; k++) {
        aiDv[k] = clip(lo[k], hi[k], 0, 29000);
        ai += (1 - f[k]) * aiDv[k];
        depth = Math.max(depth, 1 - f[k]);
      }
      const biFrom = Math.max(vFrom, 3000);
      const biTo = Math.min(vTo, 25000);
      troughs.push({ vFromKms: vFrom, vToKms: vTo, restFromA: restOfOutflow(vTo, lambda0A), restToA: restOfOutflow(vFrom, lambda0A), depth, inBi: biTo - biFrom >= 2000 });
    }
    i = j + 1;
  }
  return { biKms: bi, aiKms: ai, troughs, biDv, aiDv };
}

export type BalOutcome = ({ ok: true; continuum: ContinuumFit; biErrKms: number; aiErrKms: number } & BalIndices) | { ok: false; reason: string };

/** Smooth normalised flux with a boxcar of `px` good pixels (odd; 1 = none). */
function boxcar(f: Float64Array, px: number): Float64Array {
  if (px <= 1) return f;
  const h = (px - 1) >> 1;
  const out = new Float64Array(f.length);
  for (let i = 0; i < f.length; i++) {
    let s = 0;
    let k = 0;
    for (let j = Math.max(0, i - h); j <= Math.min(f.length - 1, i + h); j++) {
      s += f[j];
      k++;
    }
    out[i] = s / k;
  }
  return out;
}

export interface BalOptions {
  /** Flux to use instead of d.flux (resampling draws). */
  flux?: Float64Array;
  /** Boxcar smoothing of the normalised flux, pixels (default 3, an odd number). */
  smoothPx?: number;
  alphaNear?: number;
}

/** BI and AI of C IV for a rest-frame spectrum; refuses when 1400-1549 A is poorly covered or the continuum fails. */
export function measureBal(d: RestData, o: BalOptions = {}): BalOutcome {
  const l0 = restWavelengthA('CIV');
  const from = restOfOutflow(29000, l0);
  const [i0, i1] = indexRange(d.restA, from, l0);
  const flux = o.flux ?? d.flux;
  const good: number[] = [];
  for (let i = i0; i < i1; i++) if (d.weight[i] > 0 && Number.isFinite(flux[i])) good.push(i);
  const span = i1 - i0;
  if (span < 20 || good.length < 0.8 * span) return { ok: false, reason: `C IV absorption range ${from.toFixed(0)}-${l0.toFixed(0)} A rest is not covered` };
  const continuum = fitContinuum(d, { windowsA: BAL_CONTINUUM_WINDOWS_A, refA: 1700, withFe: false, flux, clipBelowSigma: 2, alphaNear: o.alphaNear });
  if (!continuum.ok) return { ok: false, reason: `no continuum for the absorption indices: ${continuum.reason}` };
  // Increasing outflow speed = decreasing wavelength.
  const idx = good.reverse();
  const v = Float64Array.from(idx, (i) => outflowKms(d.restA[i], l0));
  const px = o.smoothPx ?? 3;
  const raw = Float64Array.from(idx, (i) => flux[i] / powerLawAt(continuum, d.restA[i]));
  const f = boxcar(raw, px);
  const { biKms, aiKms, troughs, biDv, aiDv } = balIndicesWithWeights(v, f, l0);
  const sigma = Float64Array.from(idx, (i) => 1 / (Math.sqrt(d.weight[i]) * powerLawAt(continuum, d.restA[i])));
  const lnx = Float64Array.from(idx, (i) => Math.log(d.restA[i] / continuum.refA));
  const biErrKms = indexError(biDv, 1 / 0.9, f, sigma, lnx, px, continuum);
  const aiErrKms = indexError(aiDv, 1, f, sigma, lnx, px, continuum);
  return { ok: true, continuum, biKms, aiKms, troughs, biErrKms, aiErrKms };
}

/**
 * 1-sigma error of an index X = sum of (1 - k f_i) dv_i by first-order
 * propagation, the troughs' extent held fixed: the pixel noise through the
 * boxcar (f_i is the mean of the normalised flux over its window), plus the
 * continuum's scale and slope errors (f scales as 1 / power law), added in
 * quadrature as if independent.
 */
function indexError(dv: Float64Array, k: number, f: Float64Array, sigma: Float64Array, lnx: Float64Array, px: number, c: ContinuumFit): number {
  const n = f.length;
  const h = px <= 1 ? 0 : (px - 1) >> 1;
  const coef = new Float64Array(n);
  let dLnA = 0;
  let dAlpha = 0;
  for (let i = 0; i < n; i++) {
    if (dv[i] === 0) continue;
    const dXdf = -k * dv[i];
    const j0 = Math.max(0, i - h);
    const j1 = Math.min(n - 1, i + h);
    for (let j = j0; j <= j1; j++) coef[j] += dXdf / (j1 - j0 + 1);
    // d f_i / d ln a = -f_i; d f_i / d alpha = -f_i ln(lambda_i / refA) (smoothing ignored here: the slope varies slowly).
    dLnA += dXdf * -f[i];
    dAlpha += dXdf * -f[i] * lnx[i];
  }
  let v = 0;
  for (let j = 0; j < n; j++) if (coef[j] !== 0) v += coef[j] * coef[j] * sigma[j] * sigma[j];
  v += (dLnA * c.aErr) ** 2 / (c.a * c.a) + (dAlpha * c.alphaErr) ** 2;
  return Math.sqrt(v);
}
