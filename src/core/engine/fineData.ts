/**
 * A spectrum on the fine log grid, normalised so the typical sigma is 1
 * (chi2 is unchanged; the sums stay O(1..1e5)). Shared by the fit and by the
 * model curve for plots, so both see the same data.
 */
import type { Spectrum } from '../types';
import { DLOG10 } from './logGrid';
import { resampleToLogGrid } from './resample';
import type { ScanData } from './scan';

/** Fewest usable log-grid pixels a fit accepts. */
export const MIN_GOOD_PIXELS = 50;

export interface FineData {
  data: ScanData;
  /** Flux of `data` times scale gives the input's flux unit. */
  scale: number;
  noiseEstimated: boolean;
  /** Median |flux| sqrt(ivar) over good log-grid pixels. */
  medianSnr: number;
}

/** Median of a[0..n) (reorders a): Hoare's selection (Hoare 1961, CACM 4, 321), the same value sorting gives. */
export function median(a: Float64Array, n: number): number {
  if (n === 0) return NaN;
  const m = n >> 1;
  const hiVal = select(a, 0, n - 1, m);
  if (n % 2) return hiVal;
  // the lower middle is the largest value left of m after selection
  let loVal = -Infinity;
  for (let i = 0; i < m; i++) if (a[i] > loVal) loVal = a[i];
  return 0.5 * (loVal + hiVal);
}

/** k-th smallest of a[l..r] (0-based k), leaving smaller values left of k and larger right. */
function select(a: Float64Array, l: number, r: number, k: number): number {
  while (r > l) {
    // median of three as pivot
    const mid = (l + r) >> 1;
    if (a[mid] < a[l]) swap(a, mid, l);
    if (a[r] < a[l]) swap(a, r, l);
    if (a[r] < a[mid]) swap(a, r, mid);
    const pivot = a[mid];
    let i = l;
    let j = r;
    while (i <= j) {
      while (a[i] < pivot) i++;
      while (a[j] > pivot) j--;
      if (i <= j) {
        swap(a, i, j);
        i++;
        j--;
      }
    }
    if (k <= j) r = j;
    else if (k >= i) l = i;
    else return a[k];
  }
  return a[k];
}

function swap(a: Float64Array, i: number, j: number): void {
  const t = a[i];
  a[i] = a[j];
  a[j] = t;
}

/** Resample and normalise; a one-line reason when too few pixels are usable. */
export function fineData(spectrum: Spectrum): FineData | string {
  const ls = resampleToLogGrid(spectrum, DLOG10);
  const m = ls.flux.length;
  const sig = new Float64Array(m);
  const snr = new Float64Array(m);
  let n = 0;
  for (let i = 0; i < m; i++) {
    const w = ls.ivar[i];
    if (w > 0) {
      const r = Math.sqrt(w);
      sig[n] = 1 / r;
      snr[n] = Math.abs(ls.flux[i]) * r;
      n++;
    }
  }
  if (n < MIN_GOOD_PIXELS) return `only ${n} usable pixels on the log grid (need ${MIN_GOOD_PIXELS})`;
  const scale = median(sig, n) || 1;
  const flux = ls.flux;
  const ivar = ls.ivar;
  const s2 = scale * scale;
  for (let i = 0; i < m; i++) {
    flux[i] /= scale;
    ivar[i] *= s2;
  }
  return { data: { k0: ls.k0, flux, ivar }, scale, noiseEstimated: ls.noiseEstimated, medianSnr: median(snr, n) };
}
