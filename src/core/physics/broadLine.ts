/**
 * One broad line on its region's continuum: one or two broad Gaussians (the
 * count chosen by the Bayesian information criterion, Schwarz 1978, Ann. Stat.
 * 6, 461) plus the region's narrow lines sharing one shift and width, fitted to
 * the flux minus the continuum; then the FWHM and line dispersion of the broad
 * part with errors from the fit covariance (first-order propagation with
 * numerical derivatives).
 */
import { FWHM_PER_SIGMA } from '../engine/gaussFit';
import { restWavelengthA } from '../lines/catalogue';
import { continuumAt, type ContinuumFit } from './continuum';
import { fitGaussSum, type GaussComponent, type GaussSumFit, type GaussSumModel } from './gaussianSum';
import { profileDispersionKms, profileFwhmKms, profilePeakKms, type VelocityGaussian } from './profile';
import { BROAD_MAX_FWHM_KMS, BROAD_MIN_FWHM_KMS, type RegionDef } from './regions';
import { indexRange, type RestData } from './restData';

const SIG_BROAD: [number, number] = [BROAD_MIN_FWHM_KMS / FWHM_PER_SIGMA, BROAD_MAX_FWHM_KMS / FWHM_PER_SIGMA];
const SIG_NARROW: [number, number] = [30, BROAD_MIN_FWHM_KMS / FWHM_PER_SIGMA];
const NARROW_SHIFT_KMS = 1000;

export interface LineFitData {
  x: Float64Array;
  y: Float64Array;
  w: Float64Array;
}

/** Pixels of the line range with the continuum subtracted; null when the range is poorly covered. */
export function lineData(d: RestData, r: RegionDef, c: ContinuumFit, flux: Float64Array = d.flux): LineFitData | string {
  const [lo, hi] = indexRange(d.restA, r.lineRangeA[0], r.lineRangeA[1]);
  const centre = restWavelengthA(r.line);
  const xs: number[] = [];
  let blue = 0;
  let red = 0;
  for (let i = lo; i < hi; i++) if (d.weight[i] > 0 && Number.isFinite(flux[i])) {
    xs.push(i);
    if (d.restA[i] < centre) blue++;
    else red++;
  }
  if (blue < 8 || red < 8) return `too few good pixels across ${r.line} (${blue} blue, ${red} red of its centre)`;
  const n = xs.length;
  const out = { x: new Float64Array(n), y: new Float64Array(n), w: new Float64Array(n) };
  xs.forEach((i, k) => {
    out.x[k] = d.restA[i];
    out.y[k] = flux[i] - continuumAt(c, d.restA[i]);
    out.w[k] = d.weight[i];
  });
  return out;
}

/** The model for nBroad broad Gaussians plus the region's narrow lines; parameters: broad (a, v, s) x n, narrow amplitudes, narrow v, narrow s. */
export function lineModel(r: RegionDef, nBroad: number, ampMax: number): GaussSumModel {
  const comps: GaussComponent[] = [];
  const lower: number[] = [];
  const upper: number[] = [];
  const restA = restWavelengthA(r.line);
  for (let k = 0; k < nBroad; k++) {
    const i = lower.length;
    comps.push({ restA, amp: i, ampFactor: 1, vel: i + 1, sig: i + 2, broad: true });
    lower.push(0, r.broadShiftKms[0], SIG_BROAD[0]);
    upper.push(ampMax, r.broadShiftKms[1], SIG_BROAD[1]);
  }
  if (r.narrow.length > 0) {
    const free = r.narrow.filter((nl) => !nl.tiedTo);
    const ampIndex = new Map<string, number>();
    for (const nl of free) {
      ampIndex.set(nl.id, lower.length);
      lower.push(0);
      upper.push(ampMax);
    }
    const vel = lower.length;
    lower.push(-NARROW_SHIFT_KMS, SIG_NARROW[0]);
    upper.push(NARROW_SHIFT_KMS, SIG_NARROW[1]);
    for (const nl of r.narrow) {
      const amp = nl.tiedTo ? ampIndex.get(nl.tiedTo.id)! : ampIndex.get(nl.id)!;
      comps.push({ restA: restWavelengthA(nl.id), amp, ampFactor: nl.tiedTo?.ratio ?? 1, vel, sig: vel + 1, broad: false });
    }
  }
  return { components: comps, lower, upper };
}

/** Starting values: broad widths spread around 4,700 km/s FWHM, narrow lines at 400 km/s. */
export function startParams(m: GaussSumModel, nBroad: number, peak: number): number[] {
  const p: number[] = new Array(m.lower.length).fill(0);
  const sigmas = nBroad === 1 ? [2000] : [1200, 3500];
  for (let k = 0; k < nBroad; k++) {
    p[3 * k] = peak / nBroad;
    p[3 * k + 1] = 0;
    p[3 * k + 2] = sigmas[k];
  }
  for (let i = 3 * nBroad; i < p.length - 2; i++) p[i] = peak * 0.2;
  if (p.length > 3 * nBroad) {
    p[p.length - 2] = 0;
    p[p.length - 1] = 170;
  }
  return p;
}

/** The broad Gaussians of a fit, in velocity. */
export function broadGaussians(m: GaussSumModel, p: readonly number[]): VelocityGaussian[] {
  return m.components.filter((c) => c.broad).map((c) => ({ amp: p[c.amp] * c.ampFactor, vel: p[c.vel], sig: p[c.sig] }));
}

export interface WidthSet {
  fwhmKms: number;
  sigmaKms: number;
  peakKms: number;
}

export function widthsOf(m: GaussSumModel, p: readonly number[]): WidthSet {
  const g = broadGaussians(m, p);
  return { fwhmKms: profileFwhmKms(g), sigmaKms: profileDispersionKms(g), peakKms: profilePeakKms(g) };
}

/** 1-sigma error of a function of the broad parameters by first-order propagation (central differences). */
export function propagatedError(m: GaussSumModel, fit: GaussSumFit, f: (p: readonly number[]) => number): number {
  const np = fit.params.length;
  const grad = new Array(np).fill(0);
  for (let k = 0; k < np; k++) {
    if (!m.components.some((c) => c.broad && (c.amp === k || c.vel === k || c.sig === k))) continue;
    const h = Math.max(1e-6, Math.abs(fit.params[k]) * 1e-4);
    const up = fit.params.slice();
    const dn = fit.params.slice();
    up[k] += h;
    dn[k] -= h;
    grad[k] = (f(up) - f(dn)) / (2 * h);
  }
  let v = 0;
  for (let a = 0; a < np; a++) for (let b = 0; b < np; b++) v += grad[a] * fit.covariance[a * np + b] * grad[b];
  return Math.sqrt(Math.max(0, v));
}

export interface BestLineFit {
  model: GaussSumModel;
  fit: GaussSumFit;
  nBroad: number;
}

/** Fit one and two broad Gaussians and keep the one the BIC prefers. */
export function fitBroadLine(r: RegionDef, data: LineFitData): BestLineFit | string {
  let peak = 0;
  for (let i = 0; i < data.y.length; i++) peak = Math.max(peak, data.y[i]);
  if (!(peak > 0)) return `no emission above the continuum in ${r.lineRangeA[0]}-${r.lineRangeA[1]} A`;
  let best: (BestLineFit & { bic: number }) | null = null;
  for (const nBroad of [1, 2]) {
    const model = lineModel(r, nBroad, 20 * peak);
    const fit = fitGaussSum(model, startParams(model, nBroad, peak), data.x, data.y, data.w);
    // A component pushed to zero leaves its shift and width undetermined (singular covariance): that model is not a candidate.
    if (!fit.ok || !fit.covariance.every(Number.isFinite) || model.components.some((c) => c.broad && !(fit.params[c.amp] > 0))) continue;
    const bic = fit.chi2 + model.lower.length * Math.log(fit.nPix);
    if (!best || bic < best.bic) best = { model, fit, nBroad, bic };
  }
  if (!best) return 'line fit failed';
  return best;
}

/** Integrated broad flux over its error, velocity units: amp * sig * sqrt(2 pi) summed; the line counts as detected above 3. */
export function broadSnr(m: GaussSumModel, fit: GaussSumFit): number {
  const area = (p: readonly number[]) => broadGaussians(m, p).reduce((s, g) => s + g.amp * g.sig, 0);
  const a = area(fit.params);
  const e = propagatedError(m, fit, area);
  return e > 0 ? a / e : 0;
}
