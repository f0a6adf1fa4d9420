/**
 * Over 400 lines on purpose: one Levenberg-Marquardt fit with its bounds,
 * covariance and error propagation, kept together so the numbers it reports
 * have one home.
 *
 * Weighted least-squares fit of one Gaussian on a straight-line continuum,
 *
 *   f(x) = amplitude * exp(-(x - centre)^2 / (2 sigma^2)) + c0 + c1 * (x - xRef),
 *
 * by the Levenberg-Marquardt method (Levenberg 1944, Q. Appl. Math. 2, 164;
 * Marquardt 1963, J. SIAM 11, 431) with Marquardt's diagonal scaling and simple
 * box bounds on centre and sigma (trial steps are projected onto the box).
 *
 * x is in any unit (Angstrom in this project); amplitude, c0 in the unit of y;
 * c1 in y-unit per x-unit. Weights are inverse variances (1 / sigma_y^2);
 * a weight of 0 (or a non-finite x, y or weight) drops the point.
 */
import { choleskyFactor, choleskyFactorSolve, inverseSpd, inverseSpdInto } from '../numeric/cholesky';

/** Full width at half maximum per Gaussian sigma: 2 sqrt(2 ln 2) (exact). */
export const FWHM_PER_SIGMA = 2 * Math.sqrt(2 * Math.LN2);

/** sqrt(2 pi): the integral of exp(-t^2/2) over the real line (standard). */
const SQRT_2PI = Math.sqrt(2 * Math.PI);

/** Parameter order used by the covariance matrix. */
export const GAUSS_PARAM_NAMES = ['amplitude', 'centre', 'sigma', 'c0', 'c1'] as const;
const NP = 5;

/**
 * A step counts as converged when every parameter moves by less than this
 * fraction of its statistical error (far below anything measurable).
 */
const STEP_TOL = 1e-4;

export interface GaussLineParams {
  /** Peak height above the continuum, y unit (negative for a trough). */
  amplitude: number;
  /** Centre, x unit. */
  centre: number;
  /** Gaussian sigma, x unit, > 0. */
  sigma: number;
  /** Continuum at xRef, y unit. */
  c0: number;
  /** Continuum slope, y unit per x unit. */
  c1: number;
}

export type GaussFitStatus = 'converged' | 'failed' | 'at-bound';

export interface GaussFitOptions {
  initial: GaussLineParams;
  /** Reference x of the continuum line; default the initial centre (keeps c0 and c1 nearly uncorrelated). */
  xRef?: number;
  /** Allowed centre range, x unit (inclusive). */
  centreBounds?: readonly [number, number];
  /** Allowed sigma range, x unit; the lower end is raised to a tiny positive number. */
  sigmaBounds?: readonly [number, number];
  /** Iteration cap (accepted plus rejected trial steps); default 300. */
  maxIterations?: number;
}

export interface GaussFitResult {
  status: GaussFitStatus;
  /** Why the fit failed or which parameter sits on its bound. */
  reason?: string;
  params: GaussLineParams;
  /** 1-sigma errors: square roots of the covariance diagonal. */
  errors: GaussLineParams;
  /** 5x5 covariance, row-major, order GAUSS_PARAM_NAMES; scaled by covarianceScale. */
  covariance: Float64Array;
  xRef: number;
  chi2: number;
  /** Points used minus 5. */
  dof: number;
  /** chi2 / dof (NaN when dof <= 0). */
  reducedChi2: number;
  /** Factor applied to inverse(J^T W J): max(1, reducedChi2). */
  covarianceScale: number;
  nUsed: number;
  iterations: number;
}

/** Model value at x. */
export function gaussLineModel(p: GaussLineParams, xRef: number, x: number): number {
  const t = (x - p.centre) / p.sigma;
  return p.amplitude * Math.exp(-0.5 * t * t) + p.c0 + p.c1 * (x - xRef);
}

/** Integral of the Gaussian part over all x: amplitude * sigma * sqrt(2 pi) (standard Gaussian integral). */
export function gaussianIntegral(amplitude: number, sigma: number): number {
  return amplitude * sigma * SQRT_2PI;
}

/** Value of the fitted continuum line at x. */
export function continuumAt(r: Pick<GaussFitResult, 'params' | 'xRef'>, x: number): number {
  return r.params.c0 + r.params.c1 * (x - r.xRef);
}

/** Covariance element (i, j) of a fit, order GAUSS_PARAM_NAMES. */
export function cov(r: Pick<GaussFitResult, 'covariance'>, i: number, j: number): number {
  return r.covariance[i * NP + j];
}

/**
 * Variance of a function g(params) by first-order error propagation,
 * grad^T C grad, with grad in GAUSS_PARAM_NAMES order.
 */
export function propagateVariance(r: Pick<GaussFitResult, 'covariance'>, grad: readonly number[]): number {
  let v = 0;
  for (let i = 0; i < NP; i++) for (let j = 0; j < NP; j++) v += grad[i] * r.covariance[i * NP + j] * grad[j];
  return v;
}

/** Integrated flux of the fitted Gaussian and its 1-sigma error (x unit * y unit). */
export function fittedFlux(r: GaussFitResult): { flux: number; fluxErr: number } {
  const { amplitude: a, sigma: s } = r.params;
  const flux = gaussianIntegral(a, s);
  const grad = [s * SQRT_2PI, 0, a * SQRT_2PI, 0, 0];
  return { flux, fluxErr: Math.sqrt(Math.max(0, propagateVariance(r, grad))) };
}

function toArray(p: GaussLineParams): number[] {
  return [p.amplitude, p.centre, p.sigma, p.c0, p.c1];
}
function fromArray(a: ArrayLike<number>): GaussLineParams {
  return { amplitude: a[0], centre: a[1], sigma: a[2], c0: a[3], c1: a[4] };
}


/**
 * Beyond this many sigma the Gaussian is taken as 0 (exp(-32) ~ 1.3e-14 of
 * the peak, far below any data precision): most pixels of a narrow line's
 * window then cost no exponential.
 */
const GAUSS_CUT_SIGMA = 8;

interface Points {
  x: Float64Array;
  y: Float64Array;
  w: Float64Array;
  /** Scratch per point: Gaussian factor and (x - centre) / sigma at the last evaluated parameters. */
  e: Float64Array;
  t: Float64Array;
}

function usablePoints(x: ArrayLike<number>, y: ArrayLike<number>, w: ArrayLike<number>): Points {
  let n = 0;
  for (let i = 0; i < x.length; i++) if (Number.isFinite(x[i]) && Number.isFinite(y[i]) && Number.isFinite(w[i]) && w[i] > 0) n++;
  const pts = { x: new Float64Array(n), y: new Float64Array(n), w: new Float64Array(n), e: new Float64Array(n), t: new Float64Array(n) };
  let j = 0;
  for (let i = 0; i < x.length; i++) {
    if (!(Number.isFinite(x[i]) && Number.isFinite(y[i]) && Number.isFinite(w[i]) && w[i] > 0)) continue;
    pts.x[j] = x[i];
    pts.y[j] = y[i];
    pts.w[j] = w[i];
    j++;
  }
  return pts;
}

/** chi2 at p; leaves the Gaussian factors and scaled offsets of p in e and t. */
function chi2Of(pts: Points, p: ArrayLike<number>, xRef: number, e: Float64Array, t: Float64Array): number {
  const { x, y, w } = pts;
  const a = p[0], mu = p[1], inv = 1 / p[2], c0 = p[3], c1 = p[4];
  let c = 0;
  for (let i = 0; i < x.length; i++) {
    const u = (x[i] - mu) * inv;
    const g = u < GAUSS_CUT_SIGMA && u > -GAUSS_CUT_SIGMA ? Math.exp(-0.5 * u * u) : 0;
    e[i] = g;
    t[i] = u;
    const r = y[i] - (a * g + c0 + c1 * (x[i] - xRef));
    c += w[i] * r * r;
  }
  return c;
}

/**
 * Normal matrix J^T W J and gradient J^T W r at p, from the Gaussian factors
 * e and offsets t that chi2Of left for the same p.
 */
function normalEquations(pts: Points, p: ArrayLike<number>, xRef: number, e: Float64Array, t: Float64Array, h: Float64Array, g: Float64Array): void {
  const { x, y, w } = pts;
  const a = p[0], inv = 1 / p[2], c0 = p[3], c1 = p[4];
  let h00 = 0, h10 = 0, h11 = 0, h20 = 0, h21 = 0, h22 = 0, h30 = 0, h31 = 0, h32 = 0, h33 = 0, h40 = 0, h41 = 0, h42 = 0, h43 = 0, h44 = 0;
  let g0 = 0, g1 = 0, g2 = 0, g3 = 0, g4 = 0;
  for (let i = 0; i < x.length; i++) {
    const ei = e[i];
    const dx = x[i] - xRef;
    const wi = w[i];
    const r = y[i] - (a * ei + c0 + c1 * dx);
    const wr = wi * r;
    g3 += wr;
    g4 += wr * dx;
    h33 += wi;
    h43 += wi * dx;
    h44 += wi * dx * dx;
    if (ei === 0) continue;
    const ti = t[i];
    const j0 = ei;
    const j1 = a * ei * ti * inv;
    const j2 = j1 * ti;
    const w0 = wi * j0, w1 = wi * j1, w2 = wi * j2;
    g0 += w0 * r;
    g1 += w1 * r;
    g2 += w2 * r;
    h00 += w0 * j0;
    h10 += w1 * j0;
    h11 += w1 * j1;
    h20 += w2 * j0;
    h21 += w2 * j1;
    h22 += w2 * j2;
    h30 += w0;
    h31 += w1;
    h32 += w2;
    h40 += w0 * dx;
    h41 += w1 * dx;
    h42 += w2 * dx;
  }
  h[0] = h00;
  h[5] = h[1] = h10;
  h[6] = h11;
  h[10] = h[2] = h20;
  h[11] = h[7] = h21;
  h[12] = h22;
  h[15] = h[3] = h30;
  h[16] = h[8] = h31;
  h[17] = h[13] = h32;
  h[18] = h33;
  h[20] = h[4] = h40;
  h[21] = h[9] = h41;
  h[22] = h[14] = h42;
  h[23] = h[19] = h43;
  h[24] = h44;
  g[0] = g0;
  g[1] = g1;
  g[2] = g2;
  g[3] = g3;
  g[4] = g4;
}

function failed(reason: string, p: GaussLineParams, xRef: number, nUsed: number, iterations: number): GaussFitResult {
  const nan = { amplitude: NaN, centre: NaN, sigma: NaN, c0: NaN, c1: NaN };
  return {
    status: 'failed', reason, params: p, errors: nan, covariance: new Float64Array(NP * NP).fill(NaN), xRef,
    chi2: NaN, dof: nUsed - NP, reducedChi2: NaN, covarianceScale: NaN, nUsed, iterations,
  };
}

/**
 * Fit the Gaussian-plus-line model. Never throws on bad data: returns status
 * 'failed' (too few points, singular normal matrix, no convergence) or
 * 'at-bound' (a bounded parameter ended on its limit; numbers are returned but
 * should not be trusted as a measurement).
 */
export function fitGaussLine(
  x: ArrayLike<number>,
  y: ArrayLike<number>,
  weight: ArrayLike<number>,
  options: GaussFitOptions,
): GaussFitResult {
  const xRef = options.xRef ?? options.initial.centre;
  const pts = usablePoints(x, y, weight);
  const n = pts.x.length;
  const maxIter = options.maxIterations ?? 300;
  const cb = options.centreBounds ?? [-Infinity, Infinity];
  const s0 = Math.abs(options.initial.sigma);
  const sb: [number, number] = [
    Math.max(options.sigmaBounds?.[0] ?? 0, 1e-9 * (s0 || 1)),
    options.sigmaBounds?.[1] ?? Infinity,
  ];
  const lo = [-Infinity, cb[0], sb[0], -Infinity, -Infinity];
  const hi = [Infinity, cb[1], sb[1], Infinity, Infinity];
  const clamp = (v: Float64Array): void => {
    for (let k = 0; k < NP; k++) v[k] = Math.min(hi[k], Math.max(lo[k], v[k]));
  };

  if (n < NP + 1) return failed(`only ${n} usable points; need at least ${NP + 1}`, options.initial, xRef, n, 0);
  const p = Float64Array.from(toArray(options.initial));
  clamp(p);
  if (!p.every(Number.isFinite)) return failed('non-finite initial parameters', options.initial, xRef, n, 0);

  let eCur: Float64Array = pts.e;
  let tCur: Float64Array = pts.t;
  let eTry: Float64Array = new Float64Array(n);
  let tTry: Float64Array = new Float64Array(n);
  let chi2 = chi2Of(pts, p, xRef, eCur, tCur);
  if (!Number.isFinite(chi2)) return failed('non-finite chi-square at the start', fromArray(p), xRef, n, 0);
  const h = new Float64Array(NP * NP);
  const g = new Float64Array(NP);
  normalEquations(pts, p, xRef, eCur, tCur, h, g);
  const a = new Float64Array(NP * NP);
  const rhs = new Float64Array(NP);
  const trial = new Float64Array(NP);
  const inv = new Float64Array(NP * NP);
  const invWork = new Float64Array(NP * NP);
  const d5 = new Float64Array(NP);
  const e5 = new Float64Array(NP);
  const col5 = new Float64Array(NP);
  const step = new Float64Array(NP);
  // Damping update of Nielsen (1999, IMM-REP-1999-05, Tech. Univ. Denmark):
  // lambda follows the gain ratio rho = actual / predicted chi2 decrease, which
  // stops the zig-zag of plain x10 / /10 updates in flat, curved valleys.
  let lambda = 1e-3;
  let nu = 2;
  let iterations = 0;
  let converged = false;

  while (iterations < maxIter) {
    iterations++;
    // Marquardt (1963): scale the damping by the diagonal of J^T W J.
    a.set(h);
    for (let k = 0; k < NP; k++) a[k * NP + k] = h[k * NP + k] * (1 + lambda) + 1e-300;
    // Active set: a parameter on its bound whose downhill direction points out
    // of the box is held fixed for this step, so the others are solved without it.
    rhs.set(g);
    for (let k = 0; k < NP; k++) {
      if ((p[k] <= lo[k] && g[k] < 0) || (p[k] >= hi[k] && g[k] > 0)) {
        for (let j = 0; j < NP; j++) a[k * NP + j] = a[j * NP + k] = 0;
        a[k * NP + k] = 1;
        rhs[k] = 0;
      }
    }
    if (!choleskyFactor(a, NP)) {
      lambda *= nu;
      nu *= 2;
      if (lambda > 1e16) break;
      continue;
    }
    choleskyFactorSolve(a, NP, rhs, step);
    for (let k = 0; k < NP; k++) trial[k] = p[k] + step[k];
    clamp(trial);
    const chi2Trial = chi2Of(pts, trial, xRef, eTry, tTry);
    // Predicted decrease of the linearised chi2 for the (projected) step d: 2 d.g - d.H.d.
    let predicted = 0;
    for (let i = 0; i < NP; i++) {
      const di = trial[i] - p[i];
      let hd = 0;
      for (let j = 0; j < NP; j++) hd += h[i * NP + j] * (trial[j] - p[j]);
      predicted += di * (2 * g[i] - hd);
    }
    const drop = chi2 - chi2Trial;
    if (Number.isFinite(chi2Trial) && drop >= 0 && predicted > 0) {
      // Converged when the step is negligible against each parameter's
      // statistical error (unscaled inverse normal matrix), or when the
      // chi2 decrease is far below anything statistically meaningful.
      let small = inverseSpdInto(h, NP, inv, invWork, d5, e5, col5);
      for (let k = 0; k < NP && small; k++) {
        small = Math.abs(trial[k] - p[k]) <= STEP_TOL * Math.sqrt(inv[k * NP + k]) + 1e-15 * Math.abs(p[k]);
      }
      const rho = drop / predicted;
      p.set(trial);
      chi2 = chi2Trial;
      const eOld = eCur;
      eCur = eTry;
      eTry = eOld;
      const tOld = tCur;
      tCur = tTry;
      tTry = tOld;
      normalEquations(pts, p, xRef, eCur, tCur, h, g);
      lambda = Math.max(lambda * Math.max(1 / 3, 1 - (2 * rho - 1) ** 3), 1e-15);
      nu = 2;
      if (small || drop <= 1e-15 * chi2 || predicted <= 1e-12) {
        converged = true;
        break;
      }
    } else if (Number.isFinite(chi2Trial) && drop >= 0 && predicted <= 0) {
      // Nothing left to gain (step vanished, e.g. pressed against a bound).
      converged = true;
      break;
    } else {
      lambda *= nu;
      nu *= 2;
      if (lambda > 1e16) {
        // No downhill step left at any damping: p is the minimum to machine precision.
        converged = true;
        break;
      }
    }
  }

  const invFinal = inverseSpd(h, NP);
  if (!invFinal) return failed('singular normal matrix (parameters not constrained by the data)', fromArray(p), xRef, n, iterations);
  if (!converged) return failed(`no convergence in ${maxIter} iterations`, fromArray(p), xRef, n, iterations);

  const dof = n - NP;
  const reducedChi2 = dof > 0 ? chi2 / dof : NaN;
  const scale = dof > 0 ? Math.max(1, reducedChi2) : 1;
  const covariance = invFinal.map((v) => v * scale);
  const errors = fromArray(Array.from({ length: NP }, (_, k) => Math.sqrt(covariance[k * NP + k])));

  let status: GaussFitStatus = 'converged';
  let reason: string | undefined;
  const onBound = (v: number, b: number): boolean => Number.isFinite(b) && Math.abs(v - b) <= 1e-9 * (Math.abs(b) + p[2]);
  if (onBound(p[1], cb[0]) || onBound(p[1], cb[1])) {
    status = 'at-bound';
    reason = 'centre on its bound';
  } else if (onBound(p[2], sb[0]) || onBound(p[2], sb[1])) {
    status = 'at-bound';
    reason = 'sigma on its bound';
  }
  return {
    status, reason, params: fromArray(p), errors, covariance, xRef, chi2, dof, reducedChi2,
    covarianceScale: scale, nUsed: n, iterations,
  };
}
