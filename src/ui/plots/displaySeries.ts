import { smoothBoxcar } from './decimate';

/** The arrays the spectrum canvas draws, derived once per data or smoothing change. */
export interface DisplaySeries {
  /** Observed vacuum wavelength of each pixel, Angstrom, ascending. */
  wavelengthA: Float64Array;
  /** Flux as drawn (smoothed when asked), flux units; NaN where masked or unknown, which the plot draws as a gap. */
  flux: Float64Array;
  /** flux - 1 sigma and flux + 1 sigma of the drawn flux; null when the spectrum has no usable uncertainty. */
  bandLow: Float64Array | null;
  bandHigh: Float64Array | null;
  /** 1 = bad pixel, as the spectrum gives it. */
  mask: Uint8Array;
}

/**
 * Smooths flux with an inverse-variance boxcar of smoothingPx pixels (1 = raw),
 * blanks masked pixels, and builds the 1-sigma band from the smoothed ivar
 * (sigma = 1 / sqrt(ivar)). An ivar that is all zero counts as absent.
 */
export function buildDisplaySeries(
  wavelengthA: Float64Array,
  flux: Float64Array,
  ivar: Float64Array | null,
  mask: Uint8Array,
  smoothingPx: number,
): DisplaySeries {
  const usableIvar = ivar && ivar.length === flux.length && ivar.some((v) => v > 0) ? ivar : null;
  const goodMask = mask.length === flux.length ? mask : null;
  const s = smoothBoxcar(flux, usableIvar, smoothingPx, goodMask);
  const n = flux.length;
  const out = s.y;
  let bandLow: Float64Array | null = null;
  let bandHigh: Float64Array | null = null;
  if (s.ivar) {
    bandLow = new Float64Array(n);
    bandHigh = new Float64Array(n);
  }
  for (let i = 0; i < n; i++) {
    if (goodMask && goodMask[i]) out[i] = NaN;
    if (bandLow && bandHigh && s.ivar) {
      const sigma = s.ivar[i] > 0 ? 1 / Math.sqrt(s.ivar[i]) : NaN;
      bandLow[i] = out[i] - sigma;
      bandHigh[i] = out[i] + sigma;
    }
  }
  return { wavelengthA, flux: out, bandLow, bandHigh, mask: goodMask ?? new Uint8Array(n) };
}
