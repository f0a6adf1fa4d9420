/**
 * Line measurements at a chosen redshift: for each catalogue line that falls
 * in the spectrum, a Gaussian plus a straight local continuum fitted to a
 * window around the expected position (gaussFit.ts).
 *
 * Works directly on the observed pixels (no resampling), so the errors are the
 * file's own. Caveats a reader of the numbers should know:
 * - FWHM is the observed width; the instrumental resolution is NOT removed.
 * - Doublets the catalogue lists as one blend ([O II], Mg II, C IV, Si IV) are
 *   fitted as one Gaussian; their centre depends on the component ratio.
 * - Neighbouring catalogue lines inside a window are masked, not fitted jointly.
 * - A line with no matched-filter signal of its kind near the expected place
 *   (S/N < FORCED_FIT_SNR) gets a forced measurement: flux at the expected
 *   centre with a typical width; its centre error, own redshift and FWHM are
 *   NaN (not measured) and it is never detected.
 * Over 300 lines: the free and the forced measurement share their window,
 * masking and unit conventions, and are kept in one file for that.
 */
import type { LineMeasurement, Spectrum, SpectrumClass } from '../types';
import type { CatalogueLine } from '../lines/catalogue';
import { classLines } from '../lines/classLines';
import { inverseSpd } from '../numeric/cholesky';
import { FWHM_PER_SIGMA, continuumAt, fitGaussLine, fittedFlux, propagateVariance, type GaussFitResult } from './gaussFit';
import { bestFilterHitStrided, continuumValue, fitClippedContinuum } from './lines/matchedFilter';
import { lowerIndex, pixelWidthAt, pixelWindow } from './lines/pixelWindow';

import { C_KMS } from '../constants';

export { C_KMS };

/** How a line is fitted: window, centre freedom and starting widths, all in km/s. */
export interface LineProfile {
  name: 'broad' | 'narrow' | 'absorption';
  /** Fit window half-width; the outer half on each side serves as side band. */
  halfWindowKms: number;
  /** The fitted centre may move this far from (1+z) * rest wavelength. */
  centreSearchKms: number;
  /** Starting FWHMs tried by the matched filter before the fit. */
  startFwhmKms: readonly number[];
  /** Lines closer than this are one blend: neither masks the other. */
  blendKms: number;
  /** Half-width of the mask this line puts on a neighbour's window. */
  maskHalfKms: number;
}

/**
 * Quasar broad lines: windows +-15000 km/s, start near FWHM 4000 km/s (typical
 * broad-line FWHM 2000-10000 km/s; Schneider et al. 2007, AJ 134, 102 use
 * FWHM > 1000 km/s as "broad"). The centre may move 5000 km/s, since C IV peaks
 * can be blueshifted by thousands of km/s (Richards et al. 2002, AJ 124, 1).
 */
export const BROAD: LineProfile = {
  name: 'broad', halfWindowKms: 15000, centreSearchKms: 5000, startFwhmKms: [2000, 4000, 8000], blendKms: 3000, maskHalfKms: 3000,
};
/** Narrow nebular lines: windows +-1500 km/s, widths of a few hundred km/s (common practice). */
export const NARROW: LineProfile = {
  name: 'narrow', halfWindowKms: 1500, centreSearchKms: 500, startFwhmKms: [150, 300, 600], blendKms: 450, maskHalfKms: 600,
};
/** Stellar and galaxy absorption features: same window, wider starting widths (velocity dispersion plus intrinsic width). */
export const ABSORPTION: LineProfile = {
  name: 'absorption', halfWindowKms: 1500, centreSearchKms: 500, startFwhmKms: [300, 600, 1000], blendKms: 450, maskHalfKms: 600,
};

export interface PlannedLine {
  line: CatalogueLine;
  profile: LineProfile;
}

const PROFILES = { broad: BROAD, narrow: NARROW, absorption: ABSORPTION } as const;

/**
 * Which catalogue lines are measured for a class, and how: the one rule of
 * src/core/lines/classLines.ts (the markers a reviewer sees follow it too).
 */
export function linesForClass(cls: SpectrumClass): PlannedLine[] {
  return classLines(cls).map((c) => ({ line: c.line, profile: PROFILES[c.profile] }));
}

/** Fraction of the window that must lie inside the spectrum on each side (core plus half a side band). */
const COVERAGE_FRACTION = 0.75;
/** Minimum good pixels in a window, and in the centre search range. */
const MIN_GOOD_WINDOW = 10;
const MIN_GOOD_CORE = 3;
/** Detection threshold on signal-to-noise (brief: snr >= 3). */
export const DETECTION_SNR = 3;

/**
 * Measure every planned line whose window fits in the spectrum at redshift z.
 * Lines outside the coverage, or with too few good pixels, are left out.
 * Without an uncertainty array the noise is estimated from the local scatter.
 *
 * Conventions: flux and ewRestA are negative for a trough; snr is
 * flux / fluxErr with the sign flipped for absorption lines, so a line of the
 * expected kind has snr > 0. ewRestA = flux / continuum(centre) / (1 + z) with
 * the z given here; NaN when the fitted continuum there is not positive.
 * A failed fit gives NaN numbers and detected = false.
 */
export function measureLines(spectrum: Spectrum, z: number, cls: SpectrumClass): LineMeasurement[] {
  const plan = linesForClass(cls);
  const wl = spectrum.wavelengthA;
  const lamMin = wl[0];
  const lamMax = wl[wl.length - 1];
  const out: LineMeasurement[] = [];
  for (const p of plan) {
    const obsA = (1 + z) * p.line.restA;
    const reach = (COVERAGE_FRACTION * p.profile.halfWindowKms) / C_KMS;
    if (!(obsA * (1 - reach) >= lamMin && obsA * (1 + reach) <= lamMax)) continue;
    const m = measureOne(spectrum, z, p, plan);
    if (m) out.push(m);
  }
  return out;
}

/** Zero the weights of pixels on other catalogue lines that are not blended with this one. */
function maskNeighbours(xA: Float64Array, w: Float64Array, z: number, me: PlannedLine, plan: readonly PlannedLine[]): void {
  for (const other of plan) {
    if (other.line.id === me.line.id) continue;
    const sepKms = (Math.abs(other.line.restA - me.line.restA) / me.line.restA) * C_KMS;
    if (sepKms <= me.profile.blendKms) continue;
    const half = Math.min(other.profile.maskHalfKms, sepKms / 2) / C_KMS;
    const c = (1 + z) * other.line.restA;
    if (xA.length === 0 || c - xA[xA.length - 1] > half * c || xA[0] - c > half * c) continue;
    // xA is increasing: start a pixel before the first candidate, test each with the same condition.
    for (let k = Math.max(0, lowerIndex(xA, c - half * c) - 1); k < xA.length && xA[k] - c <= half * c; k++) if (Math.abs(xA[k] - c) <= half * c) w[k] = 0;
  }
}

function measureOne(s: Spectrum, z: number, p: PlannedLine, plan: readonly PlannedLine[]): LineMeasurement | null {
  const { line, profile } = p;
  const obsA = (1 + z) * line.restA;
  const halfA = (profile.halfWindowKms / C_KMS) * obsA;
  const searchA = (profile.centreSearchKms / C_KMS) * obsA;
  const win = pixelWindow(s, obsA - halfA, obsA + halfA);
  const w = Float64Array.from(win.w);
  maskNeighbours(win.xA, w, z, p, plan);
  let nGood = 0;
  for (let k = 0; k < w.length; k++) if (w[k] > 0) nGood++;
  const kFrom = lowerIndex(win.xA, obsA - searchA);
  const kTo = lowerIndex(win.xA, obsA + searchA) - 1;
  let nCore = 0;
  for (let k = kFrom; k <= kTo; k++) if (w[k] > 0) nCore++;
  if (nGood < MIN_GOOD_WINDOW || nCore < MIN_GOOD_CORE) return null;

  const pixA = pixelWidthAt(s, obsA);
  const sign = line.kind === 'emission' ? 1 : -1;

  // Starting continuum from the side bands (outer half of the window), clipped.
  const side = (k: number): boolean => Math.abs(win.xA[k] - obsA) > 0.5 * halfA;
  let sideCount = 0;
  for (let k = 0; k < w.length; k++) if (w[k] > 0 && side(k)) sideCount++;
  const cont = fitClippedContinuum(win.xA, win.y, w, sideCount >= 3 ? side : () => true, obsA, 1);
  if (!cont) return null;
  const resid = new Float64Array(win.xA.length);
  for (let k = 0; k < resid.length; k++) resid[k] = win.y[k] - continuumValue(cont, win.xA[k]);

  // Starting Gaussian from a matched filter over the centre search range.
  const sigmas = profile.startFwhmKms.map((f) => Math.max(0.8 * pixA, ((f / C_KMS) * obsA) / FWHM_PER_SIGMA));
  // Strided search (tested against the exhaustive bestFilterHit): broad filters span hundreds of pixels.
  const start = bestFilterHitStrided(win.xA, resid, w, kFrom, kTo, sigmas, sign as 1 | -1);
  // Nothing of the expected sign near the expected place: a free Gaussian
  // would only chase noise (slowly), so measure the flux at the expected
  // centre and a typical width instead (a forced fit, never a detection).
  if (!start || sign * start.snr < FORCED_FIT_SNR) {
    return forcedMeasurement(line, z, win.xA, win.y, w, obsA, sigmas[1] ?? sigmas[0]);
  }

  const fit = fitGaussLine(win.xA, win.y, w, {
    initial: { amplitude: start.amplitude, centre: start.centreA, sigma: start.sigmaA, c0: cont.coef[0], c1: cont.coef[1] ?? 0 },
    xRef: obsA,
    centreBounds: [obsA - searchA, obsA + searchA],
    sigmaBounds: [0.3 * pixA, halfA / 2],
  });
  return toMeasurement(line, z, fit, profile, pixelWidthAt(s, fit.params.centre || obsA));
}

/**
 * Matched-filter S/N (of the expected sign) below which a line gets the forced
 * measurement instead of a free Gaussian fit. Below 2 a free fit of a line
 * reaching the detection S/N of 3 is mostly noise being chased; the forced
 * flux is the honest number there (common practice for upper limits).
 */
export const FORCED_FIT_SNR = 2;

/**
 * Flux at a fixed centre and width: amplitude and straight continuum by
 * weighted linear least squares, errors from the inverse normal matrix
 * scaled by max(1, reduced chi2) as in the free fit. Centre, width and the
 * line's own redshift are not measured (NaN); never detected.
 */
function forcedMeasurement(
  line: CatalogueLine, z: number, xA: Float64Array, y: Float64Array, w: Float64Array, centreA: number, sigmaA: number,
): LineMeasurement {
  const base = { id: line.id, label: line.label, kind: line.kind, restA: line.restA, observedA: centreA, observedErrA: NaN, z: NaN, zErr: NaN, fwhmKms: NaN, fwhmErrKms: NaN, detected: false };
  // Normal equations for [g, 1, x - centre].
  let gg = 0, g1 = 0, gx = 0, s11 = 0, s1x = 0, sxx = 0, gy = 0, y1 = 0, yx = 0, yy = 0;
  let n = 0;
  const inv = 1 / sigmaA;
  for (let k = 0; k < xA.length; k++) {
    const wk = w[k];
    if (!(wk > 0)) continue;
    n++;
    const dx = xA[k] - centreA;
    const u = dx * inv;
    const g = u < 8 && u > -8 ? Math.exp(-0.5 * u * u) : 0;
    const yk = y[k];
    gg += wk * g * g;
    g1 += wk * g;
    gx += wk * g * dx;
    s11 += wk;
    s1x += wk * dx;
    sxx += wk * dx * dx;
    gy += wk * g * yk;
    y1 += wk * yk;
    yx += wk * yk * dx;
    yy += wk * yk * yk;
  }
  const C = inverseSpd(Float64Array.of(gg, g1, gx, g1, s11, s1x, gx, s1x, sxx), 3);
  const nan = { flux: NaN, fluxErr: NaN, ewRestA: NaN, ewRestErrA: NaN, snr: NaN };
  if (!C || n <= 3) return { ...base, ...nan };
  const a = C[0] * gy + C[1] * y1 + C[2] * yx;
  const c0 = C[1] * gy + C[4] * y1 + C[5] * yx;
  const c1 = C[2] * gy + C[5] * y1 + C[8] * yx;
  // chi2 = y'Wy - b.x at the least-squares solution.
  const chi2 = Math.max(0, yy - (a * gy + c0 * y1 + c1 * yx));
  const scale = Math.max(1, chi2 / (n - 3));
  const k = sigmaA * Math.sqrt(2 * Math.PI);
  const flux = a * k;
  const fluxErr = Math.sqrt(C[0] * scale) * k;
  let ewRestA = NaN;
  let ewRestErrA = NaN;
  if (c0 > 0) {
    // EW = flux / c0 / (1 + z); first-order propagation over (a, c0).
    ewRestA = flux / c0 / (1 + z);
    const da = k / c0 / (1 + z);
    const dc = -ewRestA / c0;
    ewRestErrA = Math.sqrt(Math.max(0, scale * (da * da * C[0] + 2 * da * dc * C[1] + dc * dc * C[4])));
  }
  const sign = line.kind === 'emission' ? 1 : -1;
  return { ...base, flux, fluxErr, ewRestA, ewRestErrA, snr: (sign * flux) / fluxErr };
}

function toMeasurement(
  line: CatalogueLine, z: number, fit: GaussFitResult, profile: LineProfile, pixA: number,
): LineMeasurement {
  const base = { id: line.id, label: line.label, kind: line.kind, restA: line.restA };
  if (fit.status === 'failed') {
    return {
      ...base, observedA: NaN, observedErrA: NaN, z: NaN, zErr: NaN, fwhmKms: NaN, fwhmErrKms: NaN,
      flux: NaN, fluxErr: NaN, ewRestA: NaN, ewRestErrA: NaN, snr: NaN, detected: false,
    };
  }
  const { amplitude: a, centre: mu, sigma } = fit.params;
  const muErr = fit.errors.centre;
  const { flux, fluxErr } = fittedFlux(fit);
  const fwhmA = FWHM_PER_SIGMA * sigma;
  const fwhmKms = (fwhmA / mu) * C_KMS;
  const fwhmErrKms = ((FWHM_PER_SIGMA * fit.errors.sigma) / mu) * C_KMS;

  // EW_rest = F / C(mu) / (1 + z); gradient over (A, mu, sigma, c0, c1) for the error.
  const c = continuumAt(fit, mu);
  let ewRestA = NaN;
  let ewRestErrA = NaN;
  if (c > 0) {
    const k = Math.sqrt(2 * Math.PI) / (1 + z);
    ewRestA = (a * sigma * k) / c;
    const grad = [(sigma * k) / c, (-ewRestA * fit.params.c1) / c, (a * k) / c, -ewRestA / c, (-ewRestA * (mu - fit.xRef)) / c];
    ewRestErrA = Math.sqrt(Math.max(0, propagateVariance(fit, grad)));
  }

  const sign = line.kind === 'emission' ? 1 : -1;
  const snr = (sign * flux) / fluxErr;
  const detected =
    fit.status === 'converged' && snr >= DETECTION_SNR && fwhmA > pixA && fwhmKms < profile.halfWindowKms;
  return {
    ...base, observedA: mu, observedErrA: muErr, z: mu / line.restA - 1, zErr: muErr / line.restA,
    fwhmKms, fwhmErrKms, flux, fluxErr, ewRestA, ewRestErrA, snr, detected,
  };
}

/** Catalogue doublets whose members are one physical feature for counting. */
const DOUBLETS: readonly (readonly string[])[] = [
  ['OIII_4960', 'OIII_5008'],
  ['NII_6550', 'NII_6585'],
  ['SII_6718', 'SII_6733'],
  ['CaK', 'CaH'],
];
/** Detections closer than this (observed, km/s) are one blended group. */
const GROUP_KMS = 1000;

/**
 * Number of independent detected features: detected lines grouped when they
 * are members of one doublet or lie within 1000 km/s of each other (blends
 * such as H-alpha with [N II]); each group counts once.
 */
export function countDetectedFeatures(lines: LineMeasurement[]): number {
  const det = lines.filter((l) => l.detected);
  const parent = det.map((_, i) => i);
  const find = (i: number): number => (parent[i] === i ? i : (parent[i] = find(parent[i])));
  const sameDoublet = (a: string, b: string): boolean => DOUBLETS.some((d) => d.includes(a) && d.includes(b));
  for (let i = 0; i < det.length; i++) {
    for (let j = i + 1; j < det.length; j++) {
      const a = det[i];
      const b = det[j];
      const sepKms = (Math.abs(a.observedA - b.observedA) / (0.5 * (a.observedA + b.observedA))) * C_KMS;
      if (sameDoublet(a.id, b.id) || sepKms < GROUP_KMS) parent[find(i)] = find(j);
    }
  }
  return new Set(det.map((_, i) => find(i))).size;
}
