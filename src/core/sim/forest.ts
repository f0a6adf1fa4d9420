/**
 * Lyman-alpha forest transmission blueward of a quasar's Lyman-alpha line,
 * and the Lyman-limit cut-off. Independent of the fitting engine.
 */
import type { Rng } from './prng';
import { smoothPixels, C_KMS, FWHM_PER_SIGMA } from './profiles';

/** Rest wavelengths, vacuum Angstrom (Vanden Berk et al. 2001, AJ 122, 549; docs/reference.md sec. 1). */
export const LYA_REST_A = 1215.67;
export const LYB_REST_A = 1025.72;
/** Lyman limit, Angstrom (from memory; docs/reference.md sec. 1). */
export const LYMAN_LIMIT_REST_A = 911.75;

/**
 * Effective Lyman-alpha optical depth, tau_eff(z) = 0.0018 (1+z)^3.92
 * (Faucher-Giguère et al. 2008, ApJ 688, 85; fitted for 2 <= z <= 4.2, metals
 * included; here also extrapolated outside that range). Mean transmission
 * <F> = exp(-tau_eff).
 */
export function tauEff(zAbs: number): number {
  return 0.0018 * Math.pow(1 + zAbs, 3.92);
}

/**
 * Lyman-beta absorption is approximated as 0.16 times the Lyman-alpha
 * effective optical depth at the same absorber redshift: the ratio of
 * f * lambda for the two transitions (0.0791 * 1025.72) / (0.4164 * 1215.67)
 * (oscillator strengths from memory). An underestimate for saturated gas.
 */
export const LYB_TAU_RATIO = 0.16;

/**
 * Log-normal optical-depth field (in the spirit of Bi & Davidsen 1997, ApJ 479,
 * 523): tau = A exp(s g - s^2/2), g a unit Gaussian. A is chosen so that
 * E[exp(-tau)] = exp(-tau_eff) exactly, which keeps the Faucher-Giguère mean
 * while the field fluctuates like a population of absorbers.
 */
export const FOREST_LOG_SIGMA = 1.4;

/** E[exp(-A exp(s g - s^2/2))] over g ~ N(0,1), by the trapezoid rule on [-9, 9]. */
function meanTransmission(ampl: number, s: number): number {
  const steps = 360;
  const h = 18 / steps;
  let sum = 0;
  for (let k = 0; k <= steps; k++) {
    const g = -9 + k * h;
    const w = (k === 0 || k === steps ? 0.5 : 1) * Math.exp(-0.5 * g * g);
    sum += w * Math.exp(-ampl * Math.exp(s * g - 0.5 * s * s));
  }
  return (sum * h) / Math.sqrt(2 * Math.PI);
}

/** Table of ln(A) against ln(tau_eff), built once on first use. */
let table: { lnTau0: number; dLnTau: number; lnA: Float64Array } | null = null;

function buildTable() {
  const lnTau0 = Math.log(1e-4);
  const lnTau1 = Math.log(20);
  const m = 241;
  const dLnTau = (lnTau1 - lnTau0) / (m - 1);
  const lnA = new Float64Array(m);
  for (let j = 0; j < m; j++) {
    const target = Math.exp(-Math.exp(lnTau0 + j * dLnTau));
    // Mean transmission falls monotonically with A: bisect in ln A.
    let lo = -15;
    let hi = 12;
    for (let it = 0; it < 60; it++) {
      const mid = 0.5 * (lo + hi);
      if (meanTransmission(Math.exp(mid), FOREST_LOG_SIGMA) > target) lo = mid;
      else hi = mid;
    }
    lnA[j] = 0.5 * (lo + hi);
  }
  return { lnTau0, dLnTau, lnA };
}

/** Amplitude A of the log-normal field that reproduces a given tau_eff. */
export function forestAmplitude(tauEffTarget: number): number {
  if (!table) table = buildTable();
  const x = (Math.log(Math.max(1e-4, Math.min(20, tauEffTarget))) - table.lnTau0) / table.dLnTau;
  const j = Math.min(table.lnA.length - 2, Math.max(0, Math.floor(x)));
  const f = x - j;
  return Math.exp(table.lnA[j] * (1 - f) + table.lnA[j + 1] * f);
}

export interface ForestOptions {
  /** Instrument resolving power lambda/FWHM; the transmission is seen through it. */
  resolutionR: number;
  /** Probability that flux below the Lyman limit is fully absorbed (default 0.85). */
  pLymanLimitBlack?: number;
}

/**
 * Transmission (0..1) at each observed wavelength for a quasar at zQso:
 * Ly-alpha forest between the Lyman limit and Ly-alpha, plus the Ly-beta
 * forest below Ly-beta, plus the Lyman-limit cut-off, seen at the instrument
 * resolution. Redward of Ly-alpha the transmission is 1.
 */
export function forestTransmission(wl: Float64Array, zQso: number, rng: Rng, opt: ForestOptions): Float64Array {
  const n = wl.length;
  const tau = new Float64Array(n);
  const lyaObs = LYA_REST_A * (1 + zQso);
  const lybObs = LYB_REST_A * (1 + zQso);
  const llObs = LYMAN_LIMIT_REST_A * (1 + zQso);
  if (wl[0] >= lyaObs) return new Float64Array(n).fill(1);

  // Correlated unit Gaussian field: white noise smoothed over ~1 pixel, renormalised.
  const white = new Float64Array(n);
  for (let i = 0; i < n; i++) white[i] = rng.gaussian();
  const corrPix = 1.0;
  const g = smoothPixels(white, corrPix);
  // Smoothing lowers the variance; rescale the field back to unit variance.
  let v = 0;
  for (let i = 0; i < n; i++) v += g[i] * g[i];
  const gScale = 1 / Math.sqrt(v / n);
  const gB = new Float64Array(n);
  for (let i = 0; i < n; i++) gB[i] = rng.gaussian();

  const s = FOREST_LOG_SIGMA;
  for (let i = 0; i < n; i++) {
    const l = wl[i];
    if (l >= lyaObs) continue;
    const zA = l / LYA_REST_A - 1;
    tau[i] = forestAmplitude(tauEff(zA)) * Math.exp(s * g[i] * gScale - 0.5 * s * s);
    if (l < lybObs) {
      const zB = l / LYB_REST_A - 1;
      tau[i] += forestAmplitude(LYB_TAU_RATIO * tauEff(zB)) * Math.exp(s * gB[i] - 0.5 * s * s);
    }
  }
  const trans = new Float64Array(n);
  for (let i = 0; i < n; i++) trans[i] = Math.exp(-tau[i]);

  // Below the Lyman limit: black for most quasars (an optically thick absorber
  // along most sightlines at these redshifts), partly transmitted otherwise.
  const black = rng.chance(opt.pLymanLimitBlack ?? 0.85);
  const llTrans = black ? 0 : rng.uniform(0.05, 0.5);
  for (let i = 0; i < n; i++) if (wl[i] < llObs) trans[i] *= llTrans;

  // Seen through the instrument: smooth with the line-spread function, in pixels.
  const mid = Math.min(n - 2, Math.max(0, Math.floor(n / 2)));
  const kmsPerPix = ((wl[mid + 1] - wl[mid]) / wl[mid]) * C_KMS;
  const lsfSigmaPix = C_KMS / opt.resolutionR / FWHM_PER_SIGMA / kmsPerPix;
  const smoothed = smoothPixels(trans, lsfSigmaPix);
  for (let i = 0; i < n; i++) if (wl[i] >= lyaObs) smoothed[i] = Math.max(smoothed[i], trans[i]);
  return smoothed;
}
