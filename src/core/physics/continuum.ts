/**
 * The local quasar continuum: a power law plus, near Mg II and H-beta, the
 * Fe II pseudo-continuum (feTemplate), fitted by weighted least squares to the
 * continuum windows of a region,
 *
 *   f(lambda) = a (lambda / refA)^alpha + b T_Fe(lambda)      (rest lambda),
 *
 * as in Shen et al. (2011, ApJS 194, 45, sec. 3.2). a and b are linear: for
 * each trial alpha they are solved exactly (b >= 0), so alpha is found on a
 * grid of 0.5 refined by Brent's method and the covariance of (a, alpha, b) is taken
 * from the Jacobian at the best point, scaled by the reduced chi-square when
 * it exceeds 1. `a` is the power law at refA, in the file's flux unit.
 */
import { inverseSpd } from '../numeric';
import { feTemplateAt } from './feTemplate';
import { indexRange, type RestData } from './restData';

export interface ContinuumFit {
  ok: true;
  refA: number;
  /** Power law at refA, file flux unit (observed f_lambda). */
  a: number;
  aErr: number;
  alpha: number;
  alphaErr: number;
  /** Fe II pseudo-continuum scale (0 when not fitted or when the fit wants none). */
  fe: number;
  feErr: number;
  chi2: number;
  dof: number;
  nPix: number;
  /** Windows that held enough good pixels, rest Angstrom. */
  windowsA: [number, number][];
}

export type ContinuumOutcome = ContinuumFit | { ok: false; reason: string };

export interface ContinuumOptions {
  windowsA: readonly (readonly [number, number])[];
  refA: number;
  withFe: boolean;
  /** Fewest good pixels a window needs to count. */
  minPixelsPerWindow?: number;
  /** Flux to fit instead of d.flux (resampling draws). */
  flux?: Float64Array;
  /** Passes that drop pixels more than this many sigma below the fit (absorption); default none. */
  clipBelowSigma?: number;
  /** Start of the alpha search (a previous fit's alpha) to search near it only. */
  alphaNear?: number;
}

const ALPHA_MIN = -5;
const ALPHA_MAX = 3;

/** Power law plus Fe II at a rest wavelength. */
export function continuumAt(c: Pick<ContinuumFit, 'a' | 'alpha' | 'fe' | 'refA'>, restA: number): number {
  return c.a * (restA / c.refA) ** c.alpha + c.fe * feTemplateAt(restA);
}

/** Power law alone at a rest wavelength (the part luminosities use). */
export function powerLawAt(c: Pick<ContinuumFit, 'a' | 'alpha' | 'refA'>, restA: number): number {
  return c.a * (restA / c.refA) ** c.alpha;
}

interface Pts {
  lnx: Float64Array;
  /** Scratch: the power law at the pixels, and the step factor of the grid. */
  q: Float64Array;
  r: Float64Array;
  t: Float64Array;
  y: Float64Array;
  w: Float64Array;
  n: number;
}

/** Best (a, b) given the power-law values q at the pixels, and its chi-square; b held >= 0. */
function solveWith(p: Pts, q: Float64Array, withFe: boolean): { a: number; b: number; chi2: number } {
  let spp = 0, spt = 0, stt = 0, spy = 0, sty = 0, syy = 0;
  for (let i = 0; i < p.n; i++) {
    const qi = q[i];
    const w = p.w[i];
    const y = p.y[i];
    spp += w * qi * qi;
    spy += w * qi * y;
    syy += w * y * y;
    if (withFe) {
      const t = p.t[i];
      spt += w * qi * t;
      stt += w * t * t;
      sty += w * t * y;
    }
  }
  let a = spy / spp;
  let b = 0;
  if (withFe && stt > 0) {
    const det = spp * stt - spt * spt;
    if (det > 1e-12 * spp * stt) {
      const a2 = (spy * stt - sty * spt) / det;
      const b2 = (spp * sty - spt * spy) / det;
      if (b2 > 0) {
        a = a2;
        b = b2;
      }
    }
  }
  // chi2 = sum w (y - a q - b t)^2 expanded in the sums.
  const chi2 = syy - 2 * a * spy - 2 * b * sty + a * a * spp + 2 * a * b * spt + b * b * stt;
  return { a, b, chi2 };
}

/** Best (a, b) at one alpha and its chi-square. */
function solveAt(p: Pts, alpha: number, withFe: boolean): { a: number; b: number; chi2: number } {
  const q = p.q;
  for (let i = 0; i < p.n; i++) q[i] = Math.exp(alpha * p.lnx[i]);
  return solveWith(p, q, withFe);
}

/**
 * Minimum of chi2(alpha) on [from, to]: a grid of `step` (the power law at
 * each grid point by one multiplication per pixel, q(alpha + step) = q(alpha)
 * r), then Brent's method (parabolic steps guarded by golden section; Brent
 * 1973, Algorithms for Minimization without Derivatives, ch. 5) in the best
 * cell's neighbourhood to 1e-4 in alpha.
 */
function bestAlpha(p: Pts, withFe: boolean, from: number, to: number, step: number): { alpha: number; chi2: number } {
  const q = p.q;
  const r = p.r;
  for (let i = 0; i < p.n; i++) {
    q[i] = Math.exp(from * p.lnx[i]);
    r[i] = Math.exp(step * p.lnx[i]);
  }
  let best = { alpha: from, chi2: Infinity };
  const nGrid = Math.floor((to - from) / step + 1e-9);
  for (let k = 0; k <= nGrid; k++) {
    if (k > 0) for (let i = 0; i < p.n; i++) q[i] *= r[i];
    const c = solveWith(p, q, withFe).chi2;
    if (c < best.chi2) best = { alpha: from + k * step, chi2: c };
  }
  const f = (al: number) => solveAt(p, al, withFe).chi2;
  const found = brentMin(f, Math.max(from, best.alpha - step), Math.min(to, best.alpha + step), best.alpha, best.chi2, 1e-4);
  return found.f < best.chi2 ? { alpha: found.x, chi2: found.f } : best;
}

/** Brent's minimiser on [a, b] from the point x (value fx), to absolute tolerance tol. */
function brentMin(f: (x: number) => number, a: number, b: number, x: number, fx: number, tol: number): { x: number; f: number } {
  const CGOLD = 0.381966;
  let w = x, v = x, fw = fx, fv = fx;
  let d = 0, e = 0;
  for (let it = 0; it < 60; it++) {
    const xm = (a + b) / 2;
    const tol1 = tol / 2 + 1e-10 * Math.abs(x);
    const tol2 = 2 * tol1;
    if (Math.abs(x - xm) <= tol2 - (b - a) / 2) break;
    let useGolden = true;
    if (Math.abs(e) > tol1) {
      let rr = (x - w) * (fx - fv);
      let qq = (x - v) * (fx - fw);
      let pp = (x - v) * qq - (x - w) * rr;
      qq = 2 * (qq - rr);
      if (qq > 0) pp = -pp;
      qq = Math.abs(qq);
      const eOld = e;
      if (Math.abs(pp) < Math.abs(0.5 * qq * eOld) && pp > qq * (a - x) && pp < qq * (b - x)) {
        e = d;
        d = pp / qq;
        const u = x + d;
        if (u - a < tol2 || b - u < tol2) d = xm >= x ? tol1 : -tol1;
        useGolden = false;
      }
    }
    if (useGolden) {
      e = x >= xm ? a - x : b - x;
      d = CGOLD * e;
    }
    const u = Math.abs(d) >= tol1 ? x + d : x + (d > 0 ? tol1 : -tol1);
    const fu = f(u);
    if (fu <= fx) {
      if (u >= x) a = x;
      else b = x;
      v = w; fv = fw;
      w = x; fw = fx;
      x = u; fx = fu;
    } else {
      if (u < x) a = u;
      else b = u;
      if (fu <= fw || w === x) {
        v = w; fv = fw;
        w = u; fw = fu;
      } else if (fu <= fv || v === x || v === w) {
        v = u; fv = fu;
      }
    }
  }
  return { x, f: fx };
}

/** Search within 0.3 of a known slope; the full range when the answer sits at the edge of that window. */
function alphaNearOrFull(p: Pts, withFe: boolean, near: number): { alpha: number; chi2: number } {
  const lo = Math.max(ALPHA_MIN, near - 0.3);
  const hi = Math.min(ALPHA_MAX, near + 0.3);
  const r = bestAlpha(p, withFe, lo, hi, 0.1);
  const atEdge = (r.alpha <= lo + 1e-3 && lo > ALPHA_MIN) || (r.alpha >= hi - 1e-3 && hi < ALPHA_MAX);
  return atEdge ? bestAlpha(p, withFe, ALPHA_MIN, ALPHA_MAX, 0.5) : r;
}

function gather(d: RestData, o: ContinuumOptions, dropped: ReadonlySet<number> | null): { pts: Pts; windowsA: [number, number][]; idx: Int32Array } {
  const minPix = o.minPixelsPerWindow ?? 5;
  const y = o.flux ?? d.flux;
  const good = (i: number) => d.weight[i] > 0 && Number.isFinite(y[i]) && !(dropped && dropped.has(i));
  const ranges: [number, number][] = [];
  const windowsA: [number, number][] = [];
  let n = 0;
  for (const [lo, hi] of o.windowsA) {
    const [i0, i1] = indexRange(d.restA, lo, hi);
    let k = 0;
    for (let i = i0; i < i1; i++) if (good(i)) k++;
    if (k >= minPix) {
      ranges.push([i0, i1]);
      windowsA.push([lo, hi]);
      n += k;
    }
  }
  const pts: Pts = { lnx: new Float64Array(n), q: new Float64Array(n), r: new Float64Array(n), t: new Float64Array(n), y: new Float64Array(n), w: new Float64Array(n), n };
  const idx = new Int32Array(n);
  let k = 0;
  for (const [i0, i1] of ranges)
    for (let i = i0; i < i1; i++) {
      if (!good(i)) continue;
      idx[k] = i;
      pts.lnx[k] = Math.log(d.restA[i] / o.refA);
      pts.t[k] = o.withFe ? feTemplateAt(d.restA[i]) : 0;
      pts.y[k] = y[i];
      pts.w[k] = d.weight[i];
      k++;
    }
  return { pts, windowsA, idx };
}

/** Fit the continuum of one region; refuses when fewer than two windows are covered or refA lies outside them. */
export function fitContinuum(d: RestData, o: ContinuumOptions): ContinuumOutcome {
  const dropped = new Set<number>();
  let g = gather(d, o, null);
  let fit: { alpha: number; a: number; b: number; chi2: number } | null = null;
  const passes = o.clipBelowSigma ? 2 : 1;
  let near = o.alphaNear;
  for (let pass = 0; pass < passes; pass++) {
    if (g.windowsA.length < 2) return { ok: false, reason: `continuum windows not covered (${g.windowsA.length} of ${o.windowsA.length} usable)` };
    const span: [number, number] = [Math.min(...g.windowsA.map((w) => w[0])), Math.max(...g.windowsA.map((w) => w[1]))];
    if (o.refA < span[0] - 25 || o.refA > span[1] + 25) return { ok: false, reason: `${o.refA} A lies outside the covered continuum windows` };
    const fine = near !== undefined ? alphaNearOrFull(g.pts, o.withFe, near) : bestAlpha(g.pts, o.withFe, ALPHA_MIN, ALPHA_MAX, 0.5);
    fit = { alpha: fine.alpha, ...solveAt(g.pts, fine.alpha, o.withFe) };
    near = fit.alpha; // a clipping pass moves the slope little
    if (!o.clipBelowSigma || pass === passes - 1) break;
    const y = o.flux ?? d.flux;
    let more = 0;
    for (const i of g.idx) {
      const m = fit.a * (d.restA[i] / o.refA) ** fit.alpha + fit.b * (o.withFe ? feTemplateAt(d.restA[i]) : 0);
      if ((m - y[i]) * Math.sqrt(d.weight[i]) > o.clipBelowSigma && !dropped.has(i)) {
        dropped.add(i);
        more++;
      }
    }
    if (more === 0) break;
    g = gather(d, o, dropped);
  }
  if (!fit) return { ok: false, reason: 'no continuum fit' };
  if (fit.alpha <= ALPHA_MIN + 0.01 || fit.alpha >= ALPHA_MAX - 0.01) return { ok: false, reason: `power-law slope at the edge of its range (${fit.alpha.toFixed(2)})` };
  const { a, b, alpha } = fit;
  const nPar = b > 0 ? 3 : 2;
  const dof = g.pts.n - nPar;
  if (dof < 1) return { ok: false, reason: 'too few continuum pixels' };
  // Covariance from J^T W J at the best point: columns d/da, d/dalpha, d/db.
  const m = new Float64Array(nPar * nPar);
  for (let i = 0; i < g.pts.n; i++) {
    const q = Math.exp(alpha * g.pts.lnx[i]);
    const jac = [q, a * g.pts.lnx[i] * q, g.pts.t[i]];
    for (let r = 0; r < nPar; r++) for (let c = 0; c < nPar; c++) m[r * nPar + c] += g.pts.w[i] * jac[r] * jac[c];
  }
  const inv = inverseSpd(m, nPar);
  if (!inv) return { ok: false, reason: 'continuum fit is degenerate' };
  const scale = Math.max(1, fit.chi2 / dof);
  return {
    ok: true,
    refA: o.refA,
    a,
    aErr: Math.sqrt(inv[0] * scale),
    alpha,
    alphaErr: Math.sqrt(inv[nPar + 1] * scale),
    fe: b,
    feErr: nPar === 3 ? Math.sqrt(inv[8] * scale) : 0,
    chi2: fit.chi2,
    dof,
    nPix: g.pts.n,
    windowsA: g.windowsA,
  };
}
