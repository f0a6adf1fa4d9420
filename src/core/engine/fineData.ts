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

function median(a: Float64Array, n: number): number {
  if (n === 0) return NaN;
  const s = a.subarray(0, n).sort();
  const m = n >> 1;
  return n % 2 ? s[m] : 0.5 * (s[m - 1] + s[m]);
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
