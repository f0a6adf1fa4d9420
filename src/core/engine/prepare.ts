/**
 * Spectrum -> the data every fit step shares: artifacts masked, resampled
 * onto the fine log grid, telluric bands down-weighted, a fractional error
 * floor added, normalised so the typical sigma is 1 (chi2 unchanged in
 * meaning; sums stay O(1..1e5)), and the same data binned for the scan.
 */
import type { Spectrum } from '../types';
import { medianInPlace } from '../numeric/median';
import { findArtifacts, type MaskedReason } from './artifacts';
import { DLOG10 } from './logGrid';
import { binLogSpectrum, resampleToLogGrid } from './resample';

/** Fewest usable log-grid pixels a fit accepts. */
export const MIN_GOOD_PIXELS = 50;
/** Fine pixels per scan pixel: 3 (207 km/s) keeps 250 km/s nebular lines in one or two scan pixels. */
export const SCAN_BINNING = 3;

/**
 * Strong telluric O2 bands, observed vacuum Angstrom (B band 6867-6945,
 * A band 7594-7705; band edges common practice). Weight multiplied by
 * TELLURIC_WEIGHT for every family alike, so chi2 stays comparable between
 * families: stars carry these bands too, but the templates do not.
 */
export const TELLURIC_BANDS_A: readonly [number, number][] = [[6864, 6950], [7590, 7710]];
export const TELLURIC_WEIGHT = 0.1;
/**
 * Fractional error floor added in quadrature (of a smoothed |flux|): flux
 * calibration and template mismatch at the 2 % level (common practice for
 * survey spectra), so bright spectra are not decided by residual shapes
 * that no template family can follow.
 */
export const ERROR_FLOOR_FRACTION = 0.02;

export interface GridData {
  /** Absolute log-grid index of element 0 (at this data's binning). */
  k0: number;
  flux: Float64Array;
  ivar: Float64Array;
}

export interface PreparedData {
  fine: GridData;
  /** fine binned by SCAN_BINNING. */
  binned: GridData;
  /** data flux x scale = input flux unit. */
  scale: number;
  noiseEstimated: boolean;
  /** Median |flux| sqrt(ivar) over good fine pixels, before the error floor. */
  medianSnr: number;
  masked: MaskedReason[];
  goodFine: number;
}

export function prepareData(spectrum: Spectrum): PreparedData | string {
  const { bad, report } = findArtifacts(spectrum);
  const mask = new Uint8Array(spectrum.mask.length);
  for (let i = 0; i < mask.length; i++) mask[i] = spectrum.mask[i] || bad[i] ? 1 : 0;
  const ls = resampleToLogGrid({ ...spectrum, mask }, DLOG10);
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
  const scale = medianInPlace(sig, n) || 1;
  const medianSnr = medianInPlace(snr, n);
  const flux = ls.flux;
  const ivar = ls.ivar;
  const s2 = scale * scale;
  for (let i = 0; i < m; i++) {
    flux[i] /= scale;
    ivar[i] *= s2;
  }
  downweightTellurics(ls.k0, ivar);
  addErrorFloor(flux, ivar);
  const fine = { k0: ls.k0, flux, ivar };
  const b = binLogSpectrum({ ...ls, flux, ivar }, SCAN_BINNING);
  return { fine, binned: { k0: b.k0, flux: b.flux, ivar: b.ivar }, scale, noiseEstimated: ls.noiseEstimated, medianSnr, masked: report, goodFine: n };
}

function downweightTellurics(k0: number, ivar: Float64Array): void {
  for (const [a, b] of TELLURIC_BANDS_A) {
    const i0 = Math.max(0, Math.ceil(Math.log10(a) / DLOG10) - k0);
    const i1 = Math.min(ivar.length - 1, Math.floor(Math.log10(b) / DLOG10) - k0);
    for (let i = i0; i <= i1; i++) ivar[i] *= TELLURIC_WEIGHT;
  }
}

/** Running mean of |flux| over good pixels within +-FLOOR_HALF_PIX, then var += (floor x that)^2. */
const FLOOR_HALF_PIX = 10;
function addErrorFloor(flux: Float64Array, ivar: Float64Array): void {
  if (!(ERROR_FLOOR_FRACTION > 0)) return;
  const n = flux.length;
  const cs = new Float64Array(n + 1);
  const cn = new Float64Array(n + 1);
  for (let i = 0; i < n; i++) {
    const g = ivar[i] > 0;
    cs[i + 1] = cs[i] + (g ? Math.abs(flux[i]) : 0);
    cn[i + 1] = cn[i] + (g ? 1 : 0);
  }
  const f2 = ERROR_FLOOR_FRACTION * ERROR_FLOOR_FRACTION;
  for (let i = 0; i < n; i++) {
    if (!(ivar[i] > 0)) continue;
    const a = Math.max(0, i - FLOOR_HALF_PIX);
    const b = Math.min(n, i + FLOOR_HALF_PIX + 1);
    const c = cn[b] - cn[a];
    const level = c > 0 ? (cs[b] - cs[a]) / c : 0;
    ivar[i] = 1 / (1 / ivar[i] + f2 * level * level);
  }
}
