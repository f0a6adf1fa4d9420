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
  const n = v.length;
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
      bi += x * clip(a, b, runStart + 2000, Infinity);
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
        ai += (1 - f[k]) * clip(lo[k], hi[k], 0, 29000);
        depth = Math.max(depth, 1 - f[k]);
      }
      const biFrom = Math.max(vFrom, 3000);
      const biTo = Math.min(vTo, 25000);
      troughs.push({ vFromKms: vFrom, vToKms: vTo, restFromA: restOfOutflow(vTo, lambda0A), restToA: restOfOutflow(vFrom, lambda0A), depth, inBi: biTo - biFrom >= 2000 });
    }
    i = j + 1;
  }
  return { biKms: bi, aiKms: ai, troughs };
}

export type BalOutcome = ({ ok: true; continuum: ContinuumFit } & BalIndices) | { ok: false; reason: string };

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
  const f = boxcar(Float64Array.from(idx, (i) => flux[i] / powerLawAt(continuum, d.restA[i])), o.smoothPx ?? 3);
  return { ok: true, continuum, ...balIndices(v, f, l0) };
}
