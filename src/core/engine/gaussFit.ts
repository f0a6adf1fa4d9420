/**
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

/** Full width at half maximum per Gaussian sigma: 2 sqrt(2 ln 2) (exact). */
export const FWHM_PER_SIGMA = 2 * Math.sqrt(2 * Math.LN2);

/** sqrt(2 pi): the integral of exp(-t^2/2) over the real line (standard). */
const SQRT_2PI = Math.sqrt(2 * Math.PI);

/** Parameter order used by the covariance matrix. */
export const GAUSS_PARAM_NAMES = ['amplitude', 'centre', 'sigma', 'c0', 'c1'] as const;
const NP = 5;

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
 * In-place Cholesky factorisation of a symmetric positive-definite n x n matrix
 * (row-major); returns false when it is not positive definite.
 */
function cholesky(a: Float64Array, n: number): boolean {
  for (let j = 0; j < n; j++) {
    let d = a[j * n + j];
    for (let k = 0; k < j; k++) d -= a[j * n + k] * a[j * n + k];
    if (!(d > 0) || !Number.isFinite(d)) return false;
    const ljj = Math.sqrt(d);
    a[j * n + j] = ljj;
    for (let i = j + 1; i < n; i++) {
      let s = a[i * n + j];
      for (let k = 0; k < j; k++) s -= a[i * n + k] * a[j * n + k];
      a[i * n + j] = s / ljj;
    }
  }
  return true;
}

/** Solve L L^T x = b with the factor from cholesky(). */
function choleskySolve(l: Float64Array, n: number, b: ArrayLike<number>): Float64Array {
  const x = Float64Array.from(b);
  for (let i = 0; i < n; i++) {
    let s = x[i];
    for (let k = 0; k < i; k++) s -= l[i * n + k] * x[k];
    x[i] = s / l[i * n + i];
  }
  for (let i = n - 1; i >= 0; i--) {
    let s = x[i];
    for (let k = i + 1; k < n; k++) s -= l[k * n + i] * x[k];
    x[i] = s / l[i * n + i];
  }
  return x;
}

/**
 * Symmetric matrix inverse, or null when not positive definite. The matrix is
 * first equilibrated by its diagonal so that parameters of very different
 * scale (Angstrom, flux) do not spoil the factorisation.
 */
function inverseSpd(m: Float64Array, n: number): Float64Array | null {
  const d = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    if (!(m[i * n + i] > 0)) return null;
    d[i] = 1 / Math.sqrt(m[i * n + i]);
  }
  const a = new Float64Array(n * n);
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) a[i * n + j] = m[i * n + j] * d[i] * d[j];
  if (!cholesky(a, n)) return null;
  const inv = new Float64Array(n * n);
  const e = new Float64Array(n);
  for (let j = 0; j < n; j++) {
    e.fill(0);
    e[j] = 1;
    const col = choleskySolve(a, n, e);
    for (let i = 0; i < n; i++) inv[i * n + j] = col[i] * d[i] * d[j];
  }
  return inv;
}

interface Points {
  x: Float64Array;
  y: Float64Array;
  w: Float64Array;
}

function usablePoints(x: ArrayLike<number>, y: ArrayLike<number>, w: ArrayLike<number>): Points {
  const keep: number[] = [];
  for (let i = 0; i < x.length; i++) {
    if (Number.isFinite(x[i]) && Number.isFinite(y[i]) && Number.isFinite(w[i]) && w[i] > 0) keep.push(i);
  }
  const pts = { x: new Float64Array(keep.length), y: new Float64Array(keep.length), w: new Float64Array(keep.length) };
  keep.forEach((k, j) => {
    pts.x[j] = x[k];
    pts.y[j] = y[k];
    pts.w[j] = w[k];
  });
  return pts;
}

function chi2Of(pts: Points, p: ArrayLike<number>, xRef: number): number {
  let c = 0;
  for (let i = 0; i < pts.x.length; i++) {
    const t = (pts.x[i] - p[1]) / p[2];
    const r = pts.y[i] - (p[0] * Math.exp(-0.5 * t * t) + p[3] + p[4] * (pts.x[i] - xRef));
    c += pts.w[i] * r * r;
  }
  return c;
}

/** Normal matrix J^T W J and gradient J^T W r at p. */
function normalEquations(pts: Points, p: ArrayLike<number>, xRef: number): { h: Float64Array; g: Float64Array } {
  const h = new Float64Array(NP * NP);
  const g = new Float64Array(NP);
  const jac = new Float64Array(NP);
  for (let i = 0; i < pts.x.length; i++) {
    const t = (pts.x[i] - p[1]) / p[2];
    const e = Math.exp(-0.5 * t * t);
    jac[0] = e;
    jac[1] = (p[0] * e * t) / p[2];
    jac[2] = (p[0] * e * t * t) / p[2];
    jac[3] = 1;
    jac[4] = pts.x[i] - xRef;
    const r = pts.y[i] - (p[0] * e + p[3] + p[4] * jac[4]);
    const w = pts.w[i];
    for (let a = 0; a < NP; a++) {
      g[a] += w * jac[a] * r;
      for (let b = 0; b <= a; b++) h[a * NP + b] += w * jac[a] * jac[b];
    }
  }
  for (let a = 0; a < NP; a++) for (let b = 0; b < a; b++) h[b * NP + a] = h[a * NP + b];
  return { h, g };
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

  let chi2 = chi2Of(pts, p, xRef);
  if (!Number.isFinite(chi2)) return failed('non-finite chi-square at the start', fromArray(p), xRef, n, 0);
  let { h, g } = normalEquations(pts, p, xRef);
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
    const a = Float64Array.from(h);
    for (let k = 0; k < NP; k++) a[k * NP + k] = h[k * NP + k] * (1 + lambda) + 1e-300;
    // Active set: a parameter on its bound whose downhill direction points out
    // of the box is held fixed for this step, so the others are solved without it.
    const rhs = Float64Array.from(g);
    for (let k = 0; k < NP; k++) {
      if ((p[k] <= lo[k] && g[k] < 0) || (p[k] >= hi[k] && g[k] > 0)) {
        for (let j = 0; j < NP; j++) a[k * NP + j] = a[j * NP + k] = 0;
        a[k * NP + k] = 1;
        rhs[k] = 0;
      }
    }
    if (!cholesky(a, NP)) {
      lambda *= nu;
      nu *= 2;
      if (lambda > 1e16) break;
      continue;
    }
    const step = choleskySolve(a, NP, rhs);
    const trial = Float64Array.from(p);
    for (let k = 0; k < NP; k++) trial[k] += step[k];
    clamp(trial);
    const chi2Trial = chi2Of(pts, trial, xRef);
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
      const inv = inverseSpd(h, NP);
      let small = inv !== null;
      for (let k = 0; k < NP && small; k++) {
        small = Math.abs(trial[k] - p[k]) <= 1e-7 * Math.sqrt(inv![k * NP + k]) + 1e-15 * Math.abs(p[k]);
      }
      const rho = drop / predicted;
      p.set(trial);
      chi2 = chi2Trial;
      ({ h, g } = normalEquations(pts, p, xRef));
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

  const inv = inverseSpd(h, NP);
  if (!inv) return failed('singular normal matrix (parameters not constrained by the data)', fromArray(p), xRef, n, iterations);
  if (!converged) return failed(`no convergence in ${maxIter} iterations`, fromArray(p), xRef, n, iterations);

  const dof = n - NP;
  const reducedChi2 = dof > 0 ? chi2 / dof : NaN;
  const scale = dof > 0 ? Math.max(1, reducedChi2) : 1;
  const covariance = inv.map((v) => v * scale);
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
