/**
 * A sum of Gaussians in velocity, with parameters shared between components
 * (narrow lines with one width and shift; doublets with a fixed ratio), fitted
 * to continuum-subtracted flux by Levenberg-Marquardt (Levenberg 1944, Q. Appl.
 * Math. 2, 164; Marquardt 1963, J. SIAM 11, 431) with an analytic Jacobian and
 * box bounds (trial steps are clipped to the box). The engine's gaussFit.ts
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

/** chi2 at p; fills the model values and (when given) the Jacobian. u holds c ln(x) per pixel, km/s. */
function evaluate(m: GaussSumModel, p: number[], u: Float64Array, y: Float64Array, w: Float64Array, model: Float64Array, jac: Float64Array | null): number {
  const np = p.length;
  let chi2 = 0;
  if (jac) jac.fill(0);
  const shifts = m.components.map((c) => C_KMS * Math.log(c.restA) + p[c.vel]);
  for (let i = 0; i < u.length; i++) {
    let f = 0;
    for (let k = 0; k < m.components.length; k++) {
      const c = m.components[k];
      const s = p[c.sig];
      const t = (u[i] - shifts[k]) / s;
      if (t > 8 || t < -8) continue;
      const e = Math.exp(-0.5 * t * t);
      const a = p[c.amp] * c.ampFactor;
      f += a * e;
      if (jac) {
        jac[i * np + c.amp] += c.ampFactor * e;
        jac[i * np + c.vel] += (a * e * t) / s;
        jac[i * np + c.sig] += (a * e * t * t) / s;
      }
    }
    model[i] = f;
    const r = y[i] - f;
    chi2 += w[i] * r * r;
  }
  return chi2;
}

/** Fit the model to (x: rest Angstrom, y: flux minus continuum, w: inverse variance) from p0. */
export function fitGaussSum(m: GaussSumModel, p0: readonly number[], x: Float64Array, y: Float64Array, w: Float64Array, maxIter = 60): GaussSumFit {
  const np = p0.length;
  const clamp = (v: number, k: number) => Math.min(m.upper[k], Math.max(m.lower[k], v));
  let p = p0.map(clamp);
  const n = x.length;
  const dof = n - np;
  if (dof < 3) return { ok: false, reason: 'too few pixels for the line model', params: p, covariance: [], chi2: NaN, dof, nPix: n };
  const jac = new Float64Array(n * np);
  const u = Float64Array.from(x, (v) => C_KMS * Math.log(v));
  const model = new Float64Array(n);
  const scratch = new Float64Array(n);
  let chi2 = evaluate(m, p, u, y, w, model, jac);
  let lambda = 1e-3;
  const A = new Float64Array(np * np);
  const g = new Float64Array(np);
  const step = new Float64Array(np);
  const buildNormal = () => {
    A.fill(0);
    g.fill(0);
    for (let i = 0; i < n; i++) {
      const r = y[i] - model[i];
      for (let a = 0; a < np; a++) {
        const ja = jac[i * np + a];
        if (ja === 0) continue;
        g[a] += w[i] * ja * r;
        for (let b = 0; b <= a; b++) A[a * np + b] += w[i] * ja * jac[i * np + b];
      }
    }
    for (let a = 0; a < np; a++) for (let b = 0; b < a; b++) A[b * np + a] = A[a * np + b];
  };
  buildNormal();
  for (let it = 0; it < maxIter; it++) {
    const L = new Float64Array(np * np);
    for (let k = 0; k < np * np; k++) L[k] = A[k];
    for (let a = 0; a < np; a++) L[a * np + a] = A[a * np + a] * (1 + lambda) + 1e-30;
    if (!choleskyFactor(L, np)) {
      lambda *= 10;
      if (lambda > 1e10) break;
      continue;
    }
    choleskyFactorSolve(L, np, g, step);
    const trial = p.map((v, k) => clamp(v + step[k], k));
    const c2 = evaluate(m, trial, u, y, w, scratch, null);
    if (c2 < chi2) {
      const small = chi2 - c2 < 1e-7 * chi2 + 1e-12;
      p = trial;
      chi2 = evaluate(m, p, u, y, w, model, jac);
      buildNormal();
      lambda = Math.max(lambda / 10, 1e-9);
      if (small) break;
    } else {
      lambda *= 10;
      if (lambda > 1e10) break;
    }
  }
  const inv = inverseSpd(A, np);
  const scale = Math.max(1, chi2 / dof);
  const covariance = inv ? Array.from(inv, (v) => v * scale) : new Array(np * np).fill(NaN);
  return { ok: Number.isFinite(chi2), params: p, covariance, chi2, dof, nPix: n };
}
