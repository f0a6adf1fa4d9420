/**
 * The local quasar continuum: a power law plus, near Mg II and H-beta, the
 * Fe II pseudo-continuum (feTemplate), fitted by weighted least squares to the
 * continuum windows of a region,
 *
 *   f(lambda) = a (lambda / refA)^alpha + b T_Fe(lambda)      (rest lambda),
 *
 * as in Shen et al. (2011, ApJS 194, 45, sec. 3.2). a and b are linear: for
 * each trial alpha they are solved exactly (b >= 0), so alpha is found on a
 * grid of 0.5 refined by golden-section search and the covariance of (a, alpha, b) is taken
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
  t: Float64Array;
  y: Float64Array;
  w: Float64Array;
  n: number;
}

/** Best (a, b) at one alpha and its chi-square; b held >= 0. */
function solveAt(p: Pts, alpha: number, withFe: boolean): { a: number; b: number; chi2: number } {
  let spp = 0, spt = 0, stt = 0, spy = 0, sty = 0, syy = 0;
  for (let i = 0; i < p.n; i++) {
    const q = Math.exp(alpha * p.lnx[i]);
    const w = p.w[i];
    spp += w * q * q;
    spy += w * q * p.y[i];
    syy += w * p.y[i] * p.y[i];
    if (withFe) {
      spt += w * q * p.t[i];
      stt += w * p.t[i] * p.t[i];
      sty += w * p.t[i] * p.y[i];
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

/** Minimum of chi2(alpha) on [from, to]: a grid of `step`, then golden-section search in the best cell's neighbourhood. */
function bestAlpha(p: Pts, withFe: boolean, from: number, to: number, step: number): { alpha: number; chi2: number } {
  let best = { alpha: from, chi2: Infinity };
  for (let al = from; al <= to + 1e-12; al += step) {
    const c = solveAt(p, al, withFe).chi2;
    if (c < best.chi2) best = { alpha: al, chi2: c };
  }
  let lo = Math.max(from, best.alpha - step);
  let hi = Math.min(to, best.alpha + step);
  const g = (Math.sqrt(5) - 1) / 2;
  let x1 = hi - g * (hi - lo);
  let x2 = lo + g * (hi - lo);
  let f1 = solveAt(p, x1, withFe).chi2;
  let f2 = solveAt(p, x2, withFe).chi2;
  while (hi - lo > 1e-4) {
    if (f1 < f2) {
      hi = x2;
      x2 = x1;
      f2 = f1;
      x1 = hi - g * (hi - lo);
      f1 = solveAt(p, x1, withFe).chi2;
    } else {
      lo = x1;
      x1 = x2;
      f1 = f2;
      x2 = lo + g * (hi - lo);
      f2 = solveAt(p, x2, withFe).chi2;
    }
  }
  const alpha = (lo + hi) / 2;
  const c = solveAt(p, alpha, withFe).chi2;
  return c < best.chi2 ? { alpha, chi2: c } : best;
}

function gather(d: RestData, o: ContinuumOptions, keep: (i: number) => boolean): { pts: Pts; windowsA: [number, number][]; idx: number[] } {
  const minPix = o.minPixelsPerWindow ?? 5;
  const y = o.flux ?? d.flux;
  const idx: number[] = [];
  const windowsA: [number, number][] = [];
  for (const [lo, hi] of o.windowsA) {
    const [i0, i1] = indexRange(d.restA, lo, hi);
    const here: number[] = [];
    for (let i = i0; i < i1; i++) if (d.weight[i] > 0 && Number.isFinite(y[i]) && keep(i)) here.push(i);
    if (here.length >= minPix) {
      idx.push(...here);
      windowsA.push([lo, hi]);
    }
  }
  const n = idx.length;
  const pts: Pts = { lnx: new Float64Array(n), t: new Float64Array(n), y: new Float64Array(n), w: new Float64Array(n), n };
  idx.forEach((i, k) => {
    pts.lnx[k] = Math.log(d.restA[i] / o.refA);
    pts.t[k] = o.withFe ? feTemplateAt(d.restA[i]) : 0;
    pts.y[k] = y[i];
    pts.w[k] = d.weight[i];
  });
  return { pts, windowsA, idx };
}

/** Fit the continuum of one region; refuses when fewer than two windows are covered or refA lies outside them. */
export function fitContinuum(d: RestData, o: ContinuumOptions): ContinuumOutcome {
  const dropped = new Set<number>();
  let g = gather(d, o, () => true);
  let fit: { alpha: number; a: number; b: number; chi2: number } | null = null;
  const passes = o.clipBelowSigma ? 2 : 1;
  for (let pass = 0; pass < passes; pass++) {
    if (g.windowsA.length < 2) return { ok: false, reason: `continuum windows not covered (${g.windowsA.length} of ${o.windowsA.length} usable)` };
    const span: [number, number] = [Math.min(...g.windowsA.map((w) => w[0])), Math.max(...g.windowsA.map((w) => w[1]))];
    if (o.refA < span[0] - 25 || o.refA > span[1] + 25) return { ok: false, reason: `${o.refA} A lies outside the covered continuum windows` };
    const fine =
      o.alphaNear !== undefined
        ? bestAlpha(g.pts, o.withFe, Math.max(ALPHA_MIN, o.alphaNear - 0.3), Math.min(ALPHA_MAX, o.alphaNear + 0.3), 0.1)
        : bestAlpha(g.pts, o.withFe, ALPHA_MIN, ALPHA_MAX, 0.5);
    fit = { alpha: fine.alpha, ...solveAt(g.pts, fine.alpha, o.withFe) };
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
    g = gather(d, o, (i) => !dropped.has(i));
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
