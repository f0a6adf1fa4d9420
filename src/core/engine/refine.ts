/**
 * The full model of a family at one whole-pixel shift on the fine grid, by
 * direct sums: every basis vector (with its observed-frame modulation, e.g.
 * the mean Lyman-alpha forest), the continuum polynomial, non-negative
 * amplitudes. Used only around the best few minima of the fast scan.
 */
import { makeNnlsWork, nnlsNormal } from './linalg';
import { forestDepth } from './forest';
import type { TemplateFamily } from './templates';
import { PEAK_MARGIN_PIX, polyBasis, scanConstants, type ScanConstants, type ScanData } from './scan';

/** Everything about one spectrum that the full-model evaluations share. */
export interface RefineContext {
  /** Pixel size of data, log10(lambda). */
  dlog10: number;
  data: ScanData;
  P: number;
  poly: Float64Array[];
  consts: ScanConstants;
  /** Observed-frame modulation per pixel: mean forest depth 1 - F(lambda). */
  forestDepth: Float64Array;
  /** Mean forest transmission F(lambda) per pixel (1 where no forest can be). */
  forestTrans: Float64Array;
  /** Work buffer: continuum multiplier per pixel. */
  cm: Float64Array;
  /** w_i f_i and w_i p_a(i) per pixel (0 where w = 0), precomputed for the inner loops. */
  wf: Float64Array;
  wp: Float64Array[];
}

export function makeRefineContext(data: ScanData, P: number, dlog10: number): RefineContext {
  const n = data.flux.length;
  const fd = new Float64Array(n);
  // Only wavelengths where the forest can matter (up to Ly-alpha at the largest quasar z of any family, 7.5x).
  const kMax = Math.log10(LYA_A * 8) / dlog10;
  for (let i = 0; i < n && data.k0 + i <= kMax; i++) fd[i] = forestDepth(Math.pow(10, (data.k0 + i) * dlog10));
  const poly = polyBasis(n, P);
  const wf = new Float64Array(n);
  const wp = poly.map(() => new Float64Array(n));
  for (let i = 0; i < n; i++) {
    const w = data.ivar[i] > 0 ? data.ivar[i] : 0;
    wf[i] = w * data.flux[i];
    for (let a = 0; a < P; a++) wp[a][i] = w * poly[a][i];
  }
  const ft = fd.map((d) => 1 - d);
  return { data, dlog10, P, poly, consts: scanConstants(data, P), forestDepth: fd, forestTrans: ft, cm: new Float64Array(n), wf, wp };
}

/** Prefix sums for the forest-modulated continuum (built once per spectrum, on first quasar use). */
interface ForestPrefix {
  /** [(i) * P * P + a * P + c]: sum over pixels < i of w p_a p_c (F^2 - 1), and of -w p_a p_c. */
  pForest: Float64Array;
  pAbs: Float64Array;
  /** [(i) * P + a]: sum over pixels < i of w f p_a (F - 1), and of -w f p_a. */
  fForest: Float64Array;
  fAbs: Float64Array;
}

const prefixCache = new WeakMap<RefineContext, ForestPrefix>();

function forestPrefix(ctx: RefineContext): ForestPrefix {
  let ps = prefixCache.get(ctx);
  if (ps) return ps;
  const { P, poly, wf, wp } = ctx;
  const n = ctx.data.flux.length;
  const T = P * P;
  const pForest = new Float64Array((n + 1) * T);
  const pAbs = new Float64Array((n + 1) * T);
  const fForest = new Float64Array((n + 1) * P);
  const fAbs = new Float64Array((n + 1) * P);
  for (let i = 0; i < n; i++) {
    const F = ctx.forestTrans[i];
    const d = F * F - 1;
    const e = F - 1;
    for (let a = 0; a < P; a++) {
      const o = i * P + a;
      fForest[o + P] = fForest[o] + wf[i] * poly[a][i] * e;
      fAbs[o + P] = fAbs[o] - wf[i] * poly[a][i];
      for (let c = 0; c < P; c++) {
        const u = i * T + a * P + c;
        const wpp = wp[a][i] * poly[c][i];
        pForest[u + T] = pForest[u] + wpp * d;
        pAbs[u + T] = pAbs[u] - wpp;
      }
    }
  }
  ps = { pForest, pAbs, fForest, fAbs };
  prefixCache.set(ctx, ps);
  return ps;
}

interface Column {
  i0: number;
  v: Float64Array;
}

/**
 * Column of vector j at shift s over the data pixels it touches (null when
 * none). A fractional shift is the linear interpolation of the columns at the
 * two whole shifts around it (for model curves at a refined z).
 */
function column(ctx: RefineContext, family: TemplateFamily, j: number, s: number): Column | null {
  if (s !== Math.floor(s)) {
    const s0 = Math.floor(s);
    const t = s - s0;
    const a = wholeColumn(ctx, family, j, s0);
    const b = wholeColumn(ctx, family, j, s0 + 1);
    const parts = [
      { c: a, w: 1 - t },
      { c: b, w: t },
    ].filter((p): p is { c: Column; w: number } => p.c !== null);
    if (parts.length === 0) return null;
    const i0 = Math.min(...parts.map((p) => p.c.i0));
    const v = new Float64Array(Math.max(...parts.map((p) => p.c.i0 + p.c.v.length)) - i0);
    for (const { c, w } of parts) for (let q = 0; q < c.v.length; q++) v[c.i0 + q - i0] += w * c.v[q];
    return { i0, v };
  }
  return wholeColumn(ctx, family, j, s);
}

function wholeColumn(ctx: RefineContext, family: TemplateFamily, j: number, s: number): Column | null {
  const { data } = ctx;
  const n = data.flux.length;
  let lo = Infinity;
  let hi = -Infinity;
  for (const p of family.vectors[j].pieces) {
    if (p.rest.lo > p.rest.hi) continue;
    lo = Math.min(lo, p.rest.lo);
    hi = Math.max(hi, p.rest.hi);
  }
  const i0 = Math.max(0, lo + s - data.k0);
  const i1 = Math.min(n - 1, hi + s - data.k0);
  if (!(i1 >= i0)) return null;
  const v = new Float64Array(i1 - i0 + 1);
  for (const p of family.vectors[j].pieces) {
    const { kStart, values } = p.rest;
    const mod = p.modulation === 'forestDepth' ? ctx.forestDepth : p.modulation === 'forestTransmission' ? ctx.forestTrans : null;
    for (let i = i0; i <= i1; i++) {
      const r = data.k0 + i - s - kStart;
      if (r < 0 || r >= values.length) continue;
      const t = values[r];
      if (t !== 0) v[i - i0] += mod ? t * mod[i] : t;
    }
  }
  return { i0, v };
}

export interface FullFit {
  /** Fine-grid shift (pixels). */
  shift: number;
  chi2: number;
  /** Good pixels minus free parameters. */
  dof: number;
  /** Polynomial coefficients then template amplitudes. */
  x: Float64Array;
  /** Which template amplitudes are in use (non-zero). */
  active: boolean[];
}

/**
 * Chi-square of the full model at shift s. With `fixedActive`, the template
 * set is fixed and solved without constraints (for a smooth curvature).
 */
export function evaluateFull(ctx: RefineContext, family: TemplateFamily, s: number, fixedActive?: boolean[]): FullFit {
  const { data, P, poly, consts } = ctx;
  const K = family.vectors.length;
  const n = P + K;
  const M = new Float64Array(n * n);
  const b = new Float64Array(n);
  for (let a = 0; a < P; a++) {
    b[a] = consts.pf[a];
    for (let c = 0; c < P; c++) M[a * n + c] = consts.pp[a * P + c];
  }
  // Quasars: continuum times the mean forest transmission blueward of Ly-alpha,
  // zero below the Lyman limit (templates.ts, forestOnContinuum). The
  // multiplier depends on s only through where the two edges fall, so the
  // polynomial block's corrections are differences of prefix sums.
  let iLl = 0;
  let iLya = 0;
  if (family.forestOnContinuum) {
    const nPix = data.flux.length;
    const kLya = Math.log10(LYA_A) / ctx.dlog10 + s;
    const kLl = Math.log10(LL_A) / ctx.dlog10 + s;
    iLya = Math.min(nPix, Math.max(0, Math.ceil(kLya - data.k0)));
    iLl = Math.min(iLya, Math.max(0, Math.ceil(kLl - data.k0)));
    const ps = forestPrefix(ctx);
    const T = P * P;
    for (let a = 0; a < P; a++) {
      b[a] += ps.fAbs[iLl * P + a] + ps.fForest[iLya * P + a] - ps.fForest[iLl * P + a];
      for (let c = 0; c < P; c++) {
        const q = a * P + c;
        M[a * n + c] += ps.pAbs[iLl * T + q] + ps.pForest[iLya * T + q] - ps.pForest[iLl * T + q];
      }
    }
  }
  const cmAt = (i: number) => (i < iLl ? 0 : i < iLya ? ctx.forestTrans[i] : 1);
  const cols: (Column | null)[] = [];
  for (let j = 0; j < K; j++) cols.push(column(ctx, family, j, s));
  const w = data.ivar;
  const { wf, wp } = ctx;
  const pa = new Float64Array(P);
  for (let j = 0; j < K; j++) {
    const cj = cols[j];
    if (!cj) continue;
    const r = P + j;
    let bf = 0;
    pa.fill(0);
    const v = cj.v;
    const i0 = cj.i0;
    for (let q = 0; q < v.length; q++) {
      const t = v[q];
      if (t === 0) continue;
      const i = i0 + q;
      bf += t * wf[i];
      const tc = i < iLya ? t * cmAt(i) : t;
      for (let a = 0; a < P; a++) pa[a] += tc * wp[a][i];
    }
    b[r] = bf;
    for (let a = 0; a < P; a++) {
      M[r * n + a] = pa[a];
      M[a * n + r] = pa[a];
    }
    for (let k = j; k < K; k++) {
      const ck = cols[k];
      if (!ck) continue;
      const from = Math.max(cj.i0, ck.i0);
      const to = Math.min(cj.i0 + cj.v.length, ck.i0 + ck.v.length);
      let sum = 0;
      const vk = ck.v;
      const ok = ck.i0;
      for (let i = from; i < to; i++) sum += w[i] * v[i - i0] * vk[i - ok];
      M[r * n + P + k] = sum;
      M[(P + k) * n + r] = sum;
    }
  }
  const tiny = 1e-10 * Math.max(consts.sumW, 1e-300);
  // An emission vector counts only when one of its line centres is inside the data.
  for (let j = 0; j < K; j++) {
    const peaks = family.vectors[j].pieces[0].rest.peaksA;
    if (!peaks || !cols[j]) continue;
    const nPix = data.flux.length;
    const inside = peaks.some((pk) => {
      const i = Math.log10(pk) / ctx.dlog10 + s - data.k0;
      return i >= PEAK_MARGIN_PIX && i <= nPix - 1 - PEAK_MARGIN_PIX;
    });
    if (!inside) M[(P + j) * n + P + j] = 0;
  }
  const x = new Float64Array(n);
  const work = makeNnlsWork(n);
  let explained: number;
  if (fixedActive) {
    const usable = (j: number) => j < P || (fixedActive[j - P] && M[j * n + j] > tiny);
    explained = nnlsNormal(M, b, n, n, usable, x, work);
  } else {
    explained = nnlsNormal(M, b, n, P, (j) => j < P || M[j * n + j] > tiny, x, work);
  }
  const active: boolean[] = [];
  let nPar = P;
  for (let j = 0; j < K; j++) {
    active.push(x[P + j] !== 0);
    if (x[P + j] !== 0) nPar++;
  }
  return { shift: s, chi2: consts.fwf - explained, dof: Math.max(1, consts.nGood - nPar), x, active };
}

/** Rest Ly-alpha and the Lyman limit, Angstrom (catalogue). */
const LYA_A = 1215.67;
const LL_A = 911.75;

/**
 * Continuum multiplier at shift s: F(lambda) (mean forest transmission) where
 * the rest wavelength is between the Lyman limit and Ly-alpha, 0 below the
 * limit, 1 elsewhere. `last` is one past the last pixel where it differs from 1.
 */
function continuumMultiplier(ctx: RefineContext, s: number): { v: Float64Array; last: number } {
  const { data, dlog10 } = ctx;
  const n = data.flux.length;
  const v = ctx.cm;
  const kLya = Math.log10(LYA_A) / dlog10 + s;
  const kLl = Math.log10(LL_A) / dlog10 + s;
  let last = 0;
  for (let i = 0; i < n; i++) {
    const k = data.k0 + i;
    if (k >= kLya) {
      v[i] = 1;
      continue;
    }
    v[i] = k < kLl ? 0 : 1 - ctx.forestDepth[i];
    last = i + 1;
  }
  return { v, last };
}

/** Model flux per data pixel for a full fit (normalised units), for plots and checks. */
export function modelFlux(ctx: RefineContext, family: TemplateFamily, fit: FullFit): Float64Array {
  const n = ctx.data.flux.length;
  const out = new Float64Array(n);
  const cm = family.forestOnContinuum ? continuumMultiplier(ctx, fit.shift) : null;
  for (let a = 0; a < ctx.P; a++) for (let i = 0; i < n; i++) out[i] += fit.x[a] * ctx.poly[a][i] * (cm && i < cm.last ? cm.v[i] : 1);
  family.vectors.forEach((_, j) => {
    const amp = fit.x[ctx.P + j];
    if (!amp) return;
    const c = column(ctx, family, j, fit.shift);
    if (c) for (let q = 0; q < c.v.length; q++) out[c.i0 + q] += amp * c.v[q];
  });
  return out;
}
