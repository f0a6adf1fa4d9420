/**
 * A spectrum seen in the quasar's rest frame for the physics fits: rest
 * wavelength, the observed flux density (file unit per observed Angstrom,
 * unchanged) and a weight (inverse variance; 0 for masked, non-finite or
 * unweighted pixels). Where the file has no uncertainty, one noise level is
 * taken from the pixel-to-pixel scatter (NMAD of first differences / sqrt 2,
 * common practice) so that errors still mean something.
 */
import type { Spectrum } from '../types';
import { nmad } from '../numeric';

export interface RestData {
  restA: Float64Array;
  flux: Float64Array;
  weight: Float64Array;
  /** True when the weights were estimated from the scatter. */
  noiseEstimated: boolean;
}

/** Rest-frame view of a spectrum at z. */
export function restData(s: Spectrum, z: number): RestData {
  const n = s.wavelengthA.length;
  const restA = new Float64Array(n);
  const flux = new Float64Array(n);
  const weight = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    restA[i] = s.wavelengthA[i] / (1 + z);
    flux[i] = s.flux[i];
  }
  let estimated = false;
  let w0 = 0;
  if (!s.ivar) {
    const d: number[] = [];
    for (let i = 1; i < n; i++) if (Number.isFinite(s.flux[i]) && Number.isFinite(s.flux[i - 1]) && !s.mask[i] && !s.mask[i - 1]) d.push(s.flux[i] - s.flux[i - 1]);
    const sigma = d.length > 10 ? nmad(d) / Math.SQRT2 : NaN;
    w0 = sigma > 0 ? 1 / (sigma * sigma) : 0;
    estimated = true;
  }
  for (let i = 0; i < n; i++) {
    const w = s.ivar ? s.ivar[i] : w0;
    weight[i] = !s.mask[i] && Number.isFinite(flux[i]) && Number.isFinite(w) && w > 0 ? w : 0;
  }
  return { restA, flux, weight, noiseEstimated: estimated };
}

/** Index range [lo, hi) of rest wavelengths inside [fromA, toA] (restA increasing; binary search). */
export function indexRange(restA: Float64Array, fromA: number, toA: number): [number, number] {
  const firstWhere = (ok: (v: number) => boolean) => {
    let a = 0;
    let b = restA.length;
    while (a < b) {
      const m = (a + b) >> 1;
      if (ok(restA[m])) b = m;
      else a = m + 1;
    }
    return a;
  };
  const lo = firstWhere((v) => v >= fromA);
  const hi = Math.max(lo, firstWhere((v) => v > toA));
  return [lo, hi];
}

/** Pixels with weight > 0 inside [fromA, toA]. */
export function goodPixels(d: RestData, fromA: number, toA: number): number {
  const [lo, hi] = indexRange(d.restA, fromA, toA);
  let k = 0;
  for (let i = lo; i < hi; i++) if (d.weight[i] > 0) k++;
  return k;
}
