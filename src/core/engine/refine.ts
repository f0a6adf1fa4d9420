/**
 * The full model of a family at one whole-pixel shift on the fine grid, by
 * direct sums: every basis vector (with its observed-frame modulation, e.g.
 * the mean Lyman-alpha forest), the continuum polynomial, non-negative
 * amplitudes. Used only around the best few minima of the fast scan.
 */
import { makeNnlsWork, nnlsNormal, type NnlsWork } from './linalg';
import { forestDepth } from './forest';
import type { TemplateFamily } from './templates';
import { DLOG10 } from './logGrid';
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
  const table = dlog10 === DLOG10 ? forestTable(kMax) : null;
  for (let i = 0; i < n && data.k0 + i <= kMax; i++) {
    const k = data.k0 + i;
    fd[i] = table && k >= 0 ? table[k] : forestDepth(Math.pow(10, k * dlog10));
  }
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

/** forestDepth at every absolute pixel k = 0 .. kMax of the shared grid (the same numbers, computed once per thread). */
let forestTab: Float64Array | null = null;
function forestTable(kMax: number): Float64Array {
  const m = Math.floor(kMax) + 1;
  if (!forestTab || forestTab.length < m) {
    forestTab = new Float64Array(m);
    for (let k = 0; k < m; k++) forestTab[k] = forestDepth(Math.pow(10, k * DLOG10));
  }
  return forestTab;
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

/**
 * One set of prefix buffers per thread, reused from spectrum to spectrum (they
 * are large: (n + 1) P^2 numbers twice); `prefixOwner` says whose sums they
 * hold and `prefixUpTo` how far they are filled (extended on demand: a
 * quasar at low z never needs more than the first few pixels).
 */
let prefixBuf: ForestPrefix | null = null;
let prefixOwner: RefineContext | null = null;
let prefixUpTo = 0;

/** Prefix sums valid at least for indices 0 .. upTo (<= n). */
function forestPrefix(ctx: RefineContext, upTo: number): ForestPrefix {
  const { P, poly, wf, wp } = ctx;
  const n = ctx.data.flux.length;
  const T = P * P;
  if (prefixOwner !== ctx || !prefixBuf) {
    if (!prefixBuf || prefixBuf.pForest.length < (n + 1) * T || prefixBuf.fForest.length < (n + 1) * P) {
      prefixBuf = {
        pForest: new Float64Array((n + 1) * T),
        pAbs: new Float64Array((n + 1) * T),
        fForest: new Float64Array((n + 1) * P),
        fAbs: new Float64Array((n + 1) * P),
      };
    }
    prefixBuf.pForest.fill(0, 0, T);
    prefixBuf.pAbs.fill(0, 0, T);
    prefixBuf.fForest.fill(0, 0, P);
    prefixBuf.fAbs.fill(0, 0, P);
    prefixOwner = ctx;
    prefixUpTo = 0;
  }
  const ps = prefixBuf;
  const { pForest, pAbs, fForest, fAbs } = ps;
  const end = Math.min(n, upTo);
  for (let i = prefixUpTo; i < end; i++) {
    const F = ctx.forestTrans[i];
    const d = F * F - 1;
    const e = F - 1;
    const wfi = wf[i];
    for (let a = 0; a < P; a++) {
      const o = i * P + a;
      const pai = poly[a][i];
      fForest[o + P] = fForest[o] + wfi * pai * e;
      fAbs[o + P] = fAbs[o] - wfi * pai;
      const wpai = wp[a][i];
      for (let c = 0; c < P; c++) {
        const u = i * T + a * P + c;
        const wpp = wpai * poly[c][i];
        pForest[u + T] = pForest[u] + wpp * d;
        pAbs[u + T] = pAbs[u] - wpp;
      }
    }
  }
  if (end > prefixUpTo) prefixUpTo = end;
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

/** A piece of a basis vector, with its modulation as a number (0 none, 1 forest depth, 2 forest transmission). */
interface PieceGeom {
  kStart: number;
  values: Float64Array;
  mod: 0 | 1 | 2;
}

/** Per basis vector: the non-zero rest span of all its pieces, the pieces, and its line centres as rest pixels (fractional). */
interface VectorGeom {
  lo: number;
  hi: number;
  pieces: PieceGeom[];
  peaksPix: number[] | null;
}

const geomCache = new WeakMap<TemplateFamily, Map<number, VectorGeom[]>>();

function vectorGeoms(family: TemplateFamily, dlog10: number): VectorGeom[] {
  let byD = geomCache.get(family);
  if (!byD) {
    byD = new Map();
    geomCache.set(family, byD);
  }
  let g = byD.get(dlog10);
  if (!g) {
    g = family.vectors.map((v) => {
      let lo = Infinity;
      let hi = -Infinity;
      const pieces: PieceGeom[] = [];
      for (const p of v.pieces) {
        if (p.rest.lo > p.rest.hi) continue;
        lo = Math.min(lo, p.rest.lo);
        hi = Math.max(hi, p.rest.hi);
        pieces.push({ kStart: p.rest.kStart, values: p.rest.values, mod: p.modulation === 'forestDepth' ? 1 : p.modulation === 'forestTransmission' ? 2 : 0 });
      }
      const peaks = v.pieces[0].rest.peaksA;
      return { lo, hi, pieces, peaksPix: peaks ? peaks.map((pk) => Math.log10(pk) / dlog10) : null };
    });
    byD.set(dlog10, g);
  }
  return g;
}

/** Scratch columns shared by all evaluations (one fit at a time per thread). */
let scratch: Float64Array[] = [];
function scratchColumns(K: number, n: number): Float64Array[] {
  if (scratch.length < K || scratch[0].length < n) {
    const len = Math.max(n, scratch[0]?.length ?? 0);
    scratch = Array.from({ length: Math.max(K, scratch.length) }, () => new Float64Array(len));
  }
  return scratch;
}
const workCache = new Map<number, NnlsWork>();
function nnlsWorkOf(n: number): NnlsWork {
  let w = workCache.get(n);
  if (!w) {
    w = makeNnlsWork(n);
    workCache.set(n, w);
  }
  return w;
}

/**
 * Column j at whole shift s written into v over [i0, i1] (data pixels); returns
 * false when it touches no data pixel. Pixels outside [i0, i1] are left as they were.
 */
function fillColumn(ctx: RefineContext, g: VectorGeom, s: number, v: Float64Array, span: Int32Array): boolean {
  const { data } = ctx;
  const n = data.flux.length;
  const i0 = Math.max(0, g.lo + s - data.k0);
  const i1 = Math.min(n - 1, g.hi + s - data.k0);
  if (!(i1 >= i0)) return false;
  v.fill(0, i0, i1 + 1);
  for (const p of g.pieces) {
    const off = data.k0 - s - p.kStart;
    const a = Math.max(i0, -off);
    const b = Math.min(i1, p.values.length - 1 - off);
    const vals = p.values;
    if (p.mod === 0) for (let i = a; i <= b; i++) v[i] += vals[i + off];
    else {
      const m = p.mod === 1 ? ctx.forestDepth : ctx.forestTrans;
      for (let i = a; i <= b; i++) v[i] += vals[i + off] * m[i];
    }
  }
  span[0] = i0;
  span[1] = i1;
  return true;
}

/**
 * Chi-square of the full model at shift s. With `fixedActive`, the template
 * set is fixed and solved without constraints (for a smooth curvature).
 * Sums over each column's non-zero span (evaluateFullSlow: the same numbers
 * from explicit columns, kept for tests).
 */
export function evaluateFull(ctx: RefineContext, family: TemplateFamily, s: number, fixedActive?: boolean[]): FullFit {
  if (s !== Math.floor(s)) return evaluateFullSlow(ctx, family, s, fixedActive);
  const { data, P, consts } = ctx;
  const K = family.vectors.length;
  const n = P + K;
  const nPix = data.flux.length;
  const M = new Float64Array(n * n);
  const b = new Float64Array(n);
  for (let a = 0; a < P; a++) {
    b[a] = consts.pf[a];
    for (let c = 0; c < P; c++) M[a * n + c] = consts.pp[a * P + c];
  }
  // Quasars: continuum times the mean forest transmission blueward of Ly-alpha,
  // zero below the Lyman limit (templates.ts, forestOnContinuum); see polyForestCorrection.
  let iLl = 0;
  let iLya = 0;
  if (family.forestOnContinuum) [iLl, iLya] = polyForestCorrection(ctx, s, M, b, n);
  const geoms = vectorGeoms(family, ctx.dlog10);
  const cols = scratchColumns(K, nPix);
  const spans = new Int32Array(2 * K);
  const has = new Uint8Array(K);
  const span = new Int32Array(2);
  for (let j = 0; j < K; j++) {
    // An emission vector counts only when one of its line centres is inside
    // the data; otherwise it is left out of the solve, so its sums are not needed.
    const pk = geoms[j].peaksPix;
    if (pk) {
      let inside = false;
      for (const kp of pk) {
        const i = kp + s - data.k0;
        if (i >= PEAK_MARGIN_PIX && i <= nPix - 1 - PEAK_MARGIN_PIX) inside = true;
      }
      if (!inside) continue;
    }
    if (!fillColumn(ctx, geoms[j], s, cols[j], span)) continue;
    has[j] = 1;
    spans[2 * j] = span[0];
    spans[2 * j + 1] = span[1];
  }
  const w = data.ivar;
  const { wf, wp, forestTrans } = ctx;
  // Stars and passive galaxies: every vector spans the same pixels; then all
  // template-template sums come from one pass (the same products).
  let sameSpan = K >= 2 && K <= 4;
  for (let j = 0; j < K && sameSpan; j++) sameSpan = has[j] === 1 && spans[2 * j] === spans[0] && spans[2 * j + 1] === spans[1];
  if (sameSpan) templateSumsOnePass(cols, K, spans[0], spans[1], w, M, n, P);
  for (let j = 0; j < K; j++) {
    if (!has[j]) continue;
    const v = cols[j];
    const i0 = spans[2 * j];
    const i1 = spans[2 * j + 1];
    const r = P + j;
    // Polynomial cross terms: the continuum multiplier is 0 below iLl, F in [iLl, iLya), 1 above.
    const f0 = Math.max(i0, iLl);
    const f1 = Math.min(i1 + 1, iLya);
    const u0 = Math.max(i0, iLya);
    if (P === 5) {
      // The default: all six sums in one pass over the column (same sums, fewer loads).
      const [w0, w1, w2, w3, w4] = wp;
      let bf = 0, s0 = 0, s1 = 0, s2 = 0, s3 = 0, s4 = 0;
      for (let i = i0, e = Math.min(f0, i1 + 1); i < e; i++) bf += v[i] * wf[i];
      for (let i = f0; i < f1; i++) {
        const t = v[i];
        bf += t * wf[i];
        const tc = t * forestTrans[i];
        s0 += tc * w0[i];
        s1 += tc * w1[i];
        s2 += tc * w2[i];
        s3 += tc * w3[i];
        s4 += tc * w4[i];
      }
      for (let i = Math.max(u0, f0); i <= i1; i++) {
        const t = v[i];
        bf += t * wf[i];
        s0 += t * w0[i];
        s1 += t * w1[i];
        s2 += t * w2[i];
        s3 += t * w3[i];
        s4 += t * w4[i];
      }
      b[r] = bf;
      M[r * n] = M[r] = s0;
      M[r * n + 1] = M[n + r] = s1;
      M[r * n + 2] = M[2 * n + r] = s2;
      M[r * n + 3] = M[3 * n + r] = s3;
      M[r * n + 4] = M[4 * n + r] = s4;
    } else {
      let bf = 0;
      for (let i = i0; i <= i1; i++) bf += v[i] * wf[i];
      b[r] = bf;
      for (let a = 0; a < P; a++) {
        const wpa = wp[a];
        let sum = 0;
        for (let i = f0; i < f1; i++) sum += v[i] * forestTrans[i] * wpa[i];
        for (let i = u0; i <= i1; i++) sum += v[i] * wpa[i];
        M[r * n + a] = sum;
        M[a * n + r] = sum;
      }
    }
    if (sameSpan) continue;
    for (let k = j; k < K; k++) {
      if (!has[k]) continue;
      const from = Math.max(i0, spans[2 * k]);
      const to = Math.min(i1, spans[2 * k + 1]);
      const vk = cols[k];
      let sum = 0;
      for (let i = from; i <= to; i++) sum += w[i] * v[i] * vk[i];
      M[r * n + P + k] = sum;
      M[(P + k) * n + r] = sum;
    }
  }
  return solveFull(ctx, family, s, M, b, fixedActive);
}

/** sum_i w_i v_j(i) v_k(i) over [i0, i1] for all j <= k < K (2 <= K <= 4), into M (size n, template block at P). */
function templateSumsOnePass(cols: Float64Array[], K: number, i0: number, i1: number, w: Float64Array, M: Float64Array, n: number, P: number): void {
  const v0 = cols[0];
  const v1 = cols[1];
  const v2 = K > 2 ? cols[2] : cols[1];
  const v3 = K > 3 ? cols[3] : cols[1];
  let s00 = 0, s01 = 0, s02 = 0, s03 = 0, s11 = 0, s12 = 0, s13 = 0, s22 = 0, s23 = 0, s33 = 0;
  if (K === 2) {
    for (let i = i0; i <= i1; i++) {
      const wi = w[i];
      const a = wi * v0[i];
      const b = wi * v1[i];
      s00 += a * v0[i];
      s01 += a * v1[i];
      s11 += b * v1[i];
    }
  } else {
    for (let i = i0; i <= i1; i++) {
      const wi = w[i];
      const x0 = v0[i], x1 = v1[i], x2 = v2[i], x3 = v3[i];
      const a = wi * x0, b = wi * x1, c = wi * x2;
      s00 += a * x0;
      s01 += a * x1;
      s02 += a * x2;
      s03 += a * x3;
      s11 += b * x1;
      s12 += b * x2;
      s13 += b * x3;
      s22 += c * x2;
      s23 += c * x3;
      s33 += wi * x3 * x3;
    }
  }
  const all = [s00, s01, s02, s03, s11, s12, s13, s22, s23, s33];
  const at = (j: number, k: number) => all[j * 4 - (j * (j - 1)) / 2 + (k - j)];
  for (let j = 0; j < K; j++)
    for (let k = j; k < K; k++) {
      const v = at(j, k);
      M[(P + j) * n + P + k] = v;
      M[(P + k) * n + P + j] = v;
    }
}

/**
 * Forest corrections of the polynomial block of the normal equations at
 * shift s (added into M and b, size n): the multiplier depends on s only
 * through where the Lyman limit and Ly-alpha fall, so they are differences
 * of prefix sums. Returns [iLl, iLya], the first data pixels at or above each.
 */
function polyForestCorrection(ctx: RefineContext, s: number, M: Float64Array, b: Float64Array, n: number): [number, number] {
  const { data, P } = ctx;
  const nPix = data.flux.length;
  const kLya = Math.log10(LYA_A) / ctx.dlog10 + s;
  const kLl = Math.log10(LL_A) / ctx.dlog10 + s;
  const iLya = Math.min(nPix, Math.max(0, Math.ceil(kLya - data.k0)));
  const iLl = Math.min(iLya, Math.max(0, Math.ceil(kLl - data.k0)));
  const ps = forestPrefix(ctx, iLya);
  const T = P * P;
  for (let a = 0; a < P; a++) {
    b[a] += ps.fAbs[iLl * P + a] + ps.fForest[iLya * P + a] - ps.fForest[iLl * P + a];
    for (let c = 0; c < P; c++) {
      const q = a * P + c;
      M[a * n + c] += ps.pAbs[iLl * T + q] + ps.pForest[iLya * T + q] - ps.pForest[iLl * T + q];
    }
  }
  return [iLl, iLya];
}

function solveFull(ctx: RefineContext, family: TemplateFamily, s: number, M: Float64Array, b: Float64Array, fixedActive?: boolean[]): FullFit {
  const { P, consts } = ctx;
  const K = family.vectors.length;
  const n = P + K;
  const tiny = 1e-10 * Math.max(consts.sumW, 1e-300);
  const x = new Float64Array(n);
  const work = nnlsWorkOf(n);
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

/**
 * The same chi-square from explicit columns (column(); also fractional
 * shifts, for model curves at a refined z). Slow; the reference for tests.
 */
export function evaluateFullSlow(ctx: RefineContext, family: TemplateFamily, s: number, fixedActive?: boolean[]): FullFit {
  const { data, P, consts } = ctx;
  const K = family.vectors.length;
  const n = P + K;
  const M = new Float64Array(n * n);
  const b = new Float64Array(n);
  for (let a = 0; a < P; a++) {
    b[a] = consts.pf[a];
    for (let c = 0; c < P; c++) M[a * n + c] = consts.pp[a * P + c];
  }
  let iLl = 0;
  let iLya = 0;
  if (family.forestOnContinuum) [iLl, iLya] = polyForestCorrection(ctx, s, M, b, n);
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
      const tc = t * cmAt(i);
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
  return solveFull(ctx, family, s, M, b, fixedActive);
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
