/**
 * A sum of Gaussians in velocity, with parameters shared between components
 * (narrow lines with one width and shift; doublets with a fixed ratio), fitted
 * to continuum-subtracted flux by Levenberg-Marquardt (Levenberg 1944, Q. Appl.
 * Math. 2, 164; Marquardt 1963, J. SIAM 11, 431) with an analytic Jacobian and
 * box bounds (trial steps are clipped to the box; a parameter held at a
 * bound by the gradient sits out the step, so a narrow line the data do not
 * want goes to zero in one step instead of many). Speed matters (every
 * quasar of a batch is fitted): buffers are reused, each Gaussian is summed
 * only within 8 sigma. The engine's gaussFit.ts
 * fits one Gaussian on a straight line; a broad line with narrow neighbours
 * needs several at once, hence this one.
 *
 * Each component c is a_c exp(-(u_c - v_c)^2 / (2 s_c^2)) with u_c = c ln(lambda
 * / lambda_c) (km/s, rest lambda), v_c its shift and s_c its sigma (km/s).
 */
import { C_KMS } from '../constants';
import { choleskyFactor, choleskyFactorSolve, inverseSpd } from '../numeric';

export interface GaussComponent {
  /** Rest wavelength of the line, Angstrom. */
  restA: number;
  /** Parameter index of the amplitude (file flux unit), times ampFactor. */
  amp: number;
  ampFactor: number;
  /** Parameter index of the velocity shift, km/s. */
  vel: number;
  /** Parameter index of the sigma, km/s. */
  sig: number;
  /** True for the broad-line components whose profile is measured. */
  broad: boolean;
}

export interface GaussSumModel {
  components: GaussComponent[];
  lower: number[];
  upper: number[];
}

export interface GaussSumFit {
  ok: boolean;
  reason?: string;
  params: number[];
  /** Covariance (row-major, params x params), scaled by max(1, reduced chi-square). */
  covariance: number[];
  chi2: number;
  dof: number;
  nPix: number;
}

/** Model value at a rest wavelength. */
export function gaussSumAt(m: Pick<GaussSumModel, 'components'>, p: ArrayLike<number>, restA: number, onlyBroad = false): number {
  let f = 0;
  for (const c of m.components) {
    if (onlyBroad && !c.broad) continue;
    const t = (C_KMS * Math.log(restA / c.restA) - p[c.vel]) / p[c.sig];
    if (t > 8 || t < -8) continue;
    f += p[c.amp] * c.ampFactor * Math.exp(-0.5 * t * t);
  }
  return f;
}

/**
 * Scratch reused across fits on one thread (the fit is called thousands of
 * times in a batch): buffers grow to the largest fit seen and are never freed.
 */
class Scratch {
  n = 0;
  np = 0;
  nc = 0;
  u = new Float64Array(0);
  model = new Float64Array(0);
  trialModel = new Float64Array(0);
  jac = new Float64Array(0);
  trialJac = new Float64Array(0);
  A = new Float64Array(0);
  L = new Float64Array(0);
  g = new Float64Array(0);
  step = new Float64Array(0);
  /** Per component: centre in u (km/s), sigma, amplitude, and the pixel window where |t| <= 8. */
  centre = new Float64Array(0);
  lo = new Int32Array(0);
  hi = new Int32Array(0);
  size(n: number, np: number, nc: number): void {
    if (n > this.u.length) {
      this.u = new Float64Array(n);
      this.model = new Float64Array(n);
      this.trialModel = new Float64Array(n);
    }
    if (n * np > this.jac.length) {
      this.jac = new Float64Array(n * np);
      this.trialJac = new Float64Array(n * np);
    }
    if (np * np > this.A.length) {
      this.A = new Float64Array(np * np);
      this.L = new Float64Array(np * np);
    }
    if (np > this.g.length) {
      this.g = new Float64Array(np);
      this.step = new Float64Array(np);
    }
    if (nc > this.centre.length) {
      this.centre = new Float64Array(nc);
      this.lo = new Int32Array(nc);
      this.hi = new Int32Array(nc);
    }
    this.n = n;
    this.np = np;
    this.nc = nc;
  }
}
const scratch = new Scratch();

/** First index with u[i] >= v (u increasing). */
function lowerBound(u: Float64Array, n: number, v: number): number {
  let a = 0;
  let b = n;
  while (a < b) {
    const m = (a + b) >> 1;
    if (u[m] < v) a = m + 1;
    else b = m;
  }
  return a;
}

/**
 * chi2 at p; fills `model` and the Jacobian `jac` (n x np, row-major).
 * Each component is summed only over its pixels within 8 sigma (found by
 * binary search: the pixels are in increasing wavelength).
 */
function evaluate(m: GaussSumModel, p: ArrayLike<number>, y: Float64Array, w: Float64Array, model: Float64Array, jac: Float64Array, sc: Scratch): number {
  const { n, np, u } = sc;
  model.fill(0, 0, n);
  jac.fill(0, 0, n * np);
  const comps = m.components;
  for (let k = 0; k < comps.length; k++) {
    const c = comps[k];
    const s = p[c.sig];
    const a = p[c.amp] * c.ampFactor;
    const centre = sc.centre[k] + p[c.vel];
    const i0 = lowerBound(u, n, centre - 8 * s);
    const i1 = lowerBound(u, n, centre + 8 * s);
    const inv = 1 / s;
    for (let i = i0; i < i1; i++) {
      const t = (u[i] - centre) * inv;
      const e = Math.exp(-0.5 * t * t);
      model[i] += a * e;
      const row = i * np;
      jac[row + c.amp] += c.ampFactor * e;
      const ae = a * e * t * inv;
      jac[row + c.vel] += ae;
      jac[row + c.sig] += ae * t;
    }
  }
  let chi2 = 0;
  for (let i = 0; i < n; i++) {
    const r = y[i] - model[i];
    chi2 += w[i] * r * r;
  }
  return chi2;
}

/** Normal equations J^T W J (full) and J^T W r into sc.A, sc.g. */
function buildNormal(y: Float64Array, w: Float64Array, sc: Scratch): void {
  const { n, np, jac, A, g, model } = sc;
  A.fill(0, 0, np * np);
  g.fill(0, 0, np);
  for (let i = 0; i < n; i++) {
    const row = i * np;
    const wi = w[i];
    const r = y[i] - model[i];
    for (let a = 0; a < np; a++) {
      const ja = jac[row + a];
      if (ja === 0) continue;
      const wja = wi * ja;
      g[a] += wja * r;
      for (let b = 0; b <= a; b++) A[a * np + b] += wja * jac[row + b];
    }
  }
  for (let a = 0; a < np; a++) for (let b = 0; b < a; b++) A[b * np + a] = A[a * np + b];
}

/**
 * Covariance of the parameters the data determine. A parameter with no
 * information (the shift and width of a line whose amplitude sits at zero:
 * its Jacobian column is zero) is left out and given zero variance, so the
 * others keep a finite covariance.
 */
function covarianceOf(A: Float64Array, np: number, scale: number): number[] {
  const keep: number[] = [];
  for (let a = 0; a < np; a++) if (A[a * np + a] > 0 && Number.isFinite(A[a * np + a])) keep.push(a);
  const k = keep.length;
  const sub = new Float64Array(k * k);
  for (let i = 0; i < k; i++) for (let j = 0; j < k; j++) sub[i * k + j] = A[keep[i] * np + keep[j]];
  const inv = k > 0 ? inverseSpd(sub, k) : null;
  const cov = new Array(np * np).fill(0);
  if (!inv) return new Array(np * np).fill(NaN);
  for (let i = 0; i < k; i++) for (let j = 0; j < k; j++) cov[keep[i] * np + keep[j]] = inv[i * k + j] * scale;
  return cov;
}

/**
 * Fit the model to (x: rest Angstrom, increasing; y: flux minus continuum;
 * w: inverse variance) from p0. Stops when a step lowers chi2 by less than
 * 0.01 x max(1, reduced chi2): the parameters then sit within about a tenth
 * of their error of the minimum, far inside the quoted errors.
 */
export function fitGaussSum(m: GaussSumModel, p0: readonly number[], x: Float64Array, y: Float64Array, w: Float64Array, maxIter = 60): GaussSumFit {
  const np = p0.length;
  const lower = m.lower;
  const upper = m.upper;
  const p = p0.map((v, k) => Math.min(upper[k], Math.max(lower[k], v)));
  const n = x.length;
  const dof = n - np;
  if (dof < 3) return { ok: false, reason: 'too few pixels for the line model', params: p, covariance: [], chi2: NaN, dof, nPix: n };
  // The 8-sigma windows are found by binary search, which needs increasing wavelengths.
  for (let i = 1; i < n; i++) if (!(x[i] > x[i - 1])) return { ok: false, reason: 'line-fit wavelengths are not increasing', params: p, covariance: [], chi2: NaN, dof, nPix: n };
  const sc = scratch;
  sc.size(n, np, m.components.length);
  for (let i = 0; i < n; i++) sc.u[i] = C_KMS * Math.log(x[i]);
  m.components.forEach((c, k) => (sc.centre[k] = C_KMS * Math.log(c.restA)));
  const trial = new Array<number>(np);
  let chi2 = evaluate(m, p, y, w, sc.model, sc.jac, sc);
  buildNormal(y, w, sc);
  const { A, L, g, step } = sc;
  let lambda = 1e-3;
  const free = new Int32Array(np);
  const gFree = new Float64Array(np);
  for (let it = 0; it < maxIter; it++) {
    // Parameters held at a bound the gradient pushes against, and those the data say nothing about, sit out this step.
    let nf = 0;
    for (let k = 0; k < np; k++) {
      const atLow = p[k] <= lower[k] && g[k] <= 0;
      const atHigh = p[k] >= upper[k] && g[k] >= 0;
      if (!atLow && !atHigh && A[k * np + k] > 0) free[nf++] = k;
    }
    if (nf === 0) break;
    for (let i = 0; i < nf; i++) {
      const fi = free[i];
      for (let j = 0; j < nf; j++) L[i * nf + j] = A[fi * np + free[j]];
      L[i * nf + i] = A[fi * np + fi] * (1 + lambda);
      gFree[i] = g[fi];
    }
    if (!choleskyFactor(L, nf)) {
      lambda *= 10;
      if (lambda > 1e10) break;
      continue;
    }
    choleskyFactorSolve(L, nf, gFree, step);
    for (let k = 0; k < np; k++) trial[k] = p[k];
    for (let i = 0; i < nf; i++) {
      const k = free[i];
      trial[k] = Math.min(upper[k], Math.max(lower[k], p[k] + step[i]));
    }
    // The trial's Jacobian is computed with it: most trials are accepted, and then it is already there.
    const c2 = evaluate(m, trial, y, w, sc.trialModel, sc.trialJac, sc);
    if (c2 < chi2) {
      const small = chi2 - c2 < 0.01 * Math.max(1, c2 / dof);
      for (let k = 0; k < np; k++) p[k] = trial[k];
      chi2 = c2;
      [sc.model, sc.trialModel] = [sc.trialModel, sc.model];
      [sc.jac, sc.trialJac] = [sc.trialJac, sc.jac];
      buildNormal(y, w, sc);
      lambda = Math.max(lambda / 10, 1e-9);
      if (small) break;
    } else {
      lambda *= 10;
      if (lambda > 1e10) break;
    }
  }
  const covariance = covarianceOf(A, np, Math.max(1, chi2 / dof));
  return { ok: Number.isFinite(chi2), params: p, covariance, chi2, dof, nPix: n };
}
