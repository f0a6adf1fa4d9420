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
import { C_KMS } from '../constants';
import { fitGaussSum, gaussSumAt, type GaussComponent, type GaussSumFit, type GaussSumModel } from './gaussianSum';
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

/** Mean of y over the pixels within `halfKms` of velocity `vKms` about rest `restA` (0 when none). */
function meanNear(data: LineFitData, restA: number, vKms: number, halfKms: number): number {
  let s = 0;
  let k = 0;
  for (let i = 0; i < data.x.length; i++) {
    const v = C_KMS * Math.log(data.x[i] / restA);
    if (Math.abs(v - vKms) <= halfKms) {
      s += data.y[i];
      k++;
    }
  }
  return k > 0 ? s / k : 0;
}

/**
 * Starting values of the one-broad-Gaussian model from the data's moments
 * within 5,000 km/s of the line (a good start saves most of the iterations):
 * shift at the centroid, amplitude from a 600 km/s mean at the peak, sigma
 * from area / (peak sqrt(2 pi)); narrow amplitudes from what the data hold
 * above that broad Gaussian at their centres.
 */
export function startFromData(r: RegionDef, m: GaussSumModel, data: LineFitData): number[] {
  const restA = restWavelengthA(r.line);
  let area = 0;
  let first = 0;
  let peak = 0;
  let peakV = 0;
  const n = data.x.length;
  for (let i = 0; i < n; i++) {
    const v = C_KMS * Math.log(data.x[i] / restA);
    if (Math.abs(v) > 5000) continue;
    const du = i + 1 < n ? C_KMS * Math.log(data.x[i + 1] / data.x[i]) : 0;
    const y = Math.max(0, data.y[i]);
    area += y * du;
    first += y * v * du;
    if (data.y[i] > peak) {
      peak = data.y[i];
      peakV = v;
    }
  }
  const clamp = (v: number, k: number) => Math.min(m.upper[k], Math.max(m.lower[k], v));
  const vel = area > 0 ? first / area : peakV;
  const amp = Math.max(meanNear(data, restA, vel, 600), peak / 3);
  const p: number[] = new Array(m.lower.length).fill(0);
  p[0] = clamp(amp, 0);
  p[1] = clamp(vel, 1);
  p[2] = clamp(area > 0 && amp > 0 ? area / (amp * Math.sqrt(2 * Math.PI)) : 2000, 2);
  if (p.length > 3) {
    const vi = p.length - 2;
    p[vi] = 0;
    p[vi + 1] = 170;
    for (const c of m.components) {
      if (c.broad || c.amp === undefined) continue;
      const broadThere = gaussSumAt({ components: m.components.filter((x) => x.broad) }, p, c.restA);
      p[c.amp] = clamp(Math.max(0, (meanNear(data, c.restA, 0, 250) - broadThere) / c.ampFactor), c.amp);
    }
  }
  return p;
}

/** Starting values of the two-broad model from the one-broad fit: a narrower core and a wider wing with the same shift. */
export function startFromOne(m2: GaussSumModel, p1: readonly number[]): number[] {
  const clamp = (v: number, k: number) => Math.min(m2.upper[k], Math.max(m2.lower[k], v));
  const [a, v, s] = p1;
  const p = [clamp(0.7 * a, 0), clamp(v, 1), clamp(0.7 * s, 2), clamp(0.3 * a, 3), clamp(v, 4), clamp(1.8 * s, 5)];
  for (let k = 3; k < p1.length; k++) p.push(p1[k]);
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

/**
 * 1-sigma errors of several functions of the broad parameters by first-order
 * propagation, err_f^2 = g^T C g, with g from central differences; the
 * functions share each perturbed parameter vector, so a profile is evaluated
 * twice per broad parameter whatever the number of functions.
 */
export function propagatedErrors(m: GaussSumModel, fit: GaussSumFit, fs: readonly ((p: readonly number[]) => number)[]): number[] {
  const np = fit.params.length;
  const grads = fs.map(() => new Float64Array(np));
  const isBroad = new Array<boolean>(np).fill(false);
  for (const c of m.components) if (c.broad) isBroad[c.amp] = isBroad[c.vel] = isBroad[c.sig] = true;
  const q = fit.params.slice();
  for (let k = 0; k < np; k++) {
    if (!isBroad[k]) continue;
    const h = Math.max(1e-6, Math.abs(fit.params[k]) * 1e-4);
    q[k] = fit.params[k] + h;
    const up = fs.map((f) => f(q));
    q[k] = fit.params[k] - h;
    fs.forEach((f, j) => (grads[j][k] = (up[j] - f(q)) / (2 * h)));
    q[k] = fit.params[k];
  }
  return grads.map((grad) => {
    let v = 0;
    for (let a = 0; a < np; a++) {
      if (grad[a] === 0) continue;
      for (let b = 0; b < np; b++) v += grad[a] * fit.covariance[a * np + b] * grad[b];
    }
    return Math.sqrt(Math.max(0, v));
  });
}

/** 1-sigma error of one function of the broad parameters (propagatedErrors for one). */
export function propagatedError(m: GaussSumModel, fit: GaussSumFit, f: (p: readonly number[]) => number): number {
  return propagatedErrors(m, fit, [f])[0];
}

/** Errors of the broad profile's FWHM and dispersion, and the integrated broad flux over its error (see broadSnr). */
export function widthErrors(m: GaussSumModel, fit: GaussSumFit): { fwhmErrKms: number; sigmaErrKms: number; snr: number } {
  const [fwhmErrKms, sigmaErrKms, areaErr] = propagatedErrors(m, fit, [
    (p) => profileFwhmKms(broadGaussians(m, p)),
    (p) => profileDispersionKms(broadGaussians(m, p)),
    (p) => broadArea(m, p),
  ]);
  const area = broadArea(m, fit.params);
  return { fwhmErrKms, sigmaErrKms, snr: areaErr > 0 ? area / areaErr : 0 };
}

function broadArea(m: GaussSumModel, p: readonly number[]): number {
  return broadGaussians(m, p).reduce((s, g) => s + g.amp * g.sig, 0);
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
  let one: GaussSumFit | null = null;
  for (const nBroad of [1, 2]) {
    const model = lineModel(r, nBroad, 20 * peak);
    const start = nBroad === 1 ? startFromData(r, model, data) : one?.ok ? startFromOne(model, one.params) : startFromOne(model, startFromData(r, lineModel(r, 1, 20 * peak), data));
    const fit = fitGaussSum(model, start, data.x, data.y, data.w);
    if (nBroad === 1) one = fit;
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
  const a = broadArea(m, fit.params);
  const e = propagatedError(m, fit, (p) => broadArea(m, p));
  return e > 0 ? a / e : 0;
}
