/**
 * Chi-square against redshift for one template family, at every whole-pixel
 * shift of a range: weighted least squares with the template amplitudes (kept
 * non-negative) and a low-order observed-frame polynomial solved at each shift
 * from the normal equations (A^T W A) c = A^T W f (reference sheet sec. 5).
 *
 * On the log grid a redshift is a shift, so every sum the normal equations need
 * is a correlation of an observed-frame signal with a rest-frame one:
 *   sum_i w_i f_i t_j(i - s), sum_i w_i p_a(i) t_j(i - s), sum_i w_i t_j t_k(i - s).
 * scanSumsFFT gets them all with FFTs; scanSumsDirect is the slow obvious sum
 * kept for tests (the two agree to ~1e-9 relative).
 */
import { CorrelationPlan, nextPow2, type HalfSpectrum } from './fftCorrelate';
import { makeNnlsWork, nnlsNormal } from './linalg';
import { invertSmall, makeSubsetSolver, MAX_K } from './scanSolve';
import { valueAt, type RestArray } from './restArray';

/** Data for a scan: on the log grid, pixel i at absolute index k0 + i (any binning). */
export interface ScanData {
  k0: number;
  flux: Float64Array;
  ivar: Float64Array;
}

/** All sums the normal equations need, one value per shift s = sMin .. sMin + nShift - 1. */
export interface ScanSums {
  sMin: number;
  nShift: number;
  K: number;
  P: number;
  /** tf[j][s]: sum w f t_j(i - s). */
  tf: Float64Array[];
  /** tp[j * P + a][s]: sum w p_a t_j(i - s). */
  tp: Float64Array[];
  /** tt[j * K + k][s] for j <= k: sum w t_j t_k (i - s); null when the vectors never overlap. */
  tt: (Float64Array | null)[];
}

/**
 * Legendre polynomials P_0 .. P_(P-1) of x in [-1, 1] across the data pixels
 * (well conditioned for the continuum terms). Shared arrays: never modify them.
 */
export function polyBasis(n: number, P: number): Float64Array[] {
  const key = n * 64 + P;
  const hit = polyCache.get(key);
  if (hit) return hit;
  const out = legendreBasis(n, P);
  if (polyCache.size >= 16) polyCache.delete(polyCache.keys().next().value as number);
  polyCache.set(key, out);
  return out;
}

/** polyBasis results by (n, P): they depend on nothing else, and every stage of a fit asks for them. Read-only. */
const polyCache = new Map<number, Float64Array[]>();

function legendreBasis(n: number, P: number): Float64Array[] {
  const out: Float64Array[] = [];
  for (let a = 0; a < P; a++) out.push(new Float64Array(n));
  for (let i = 0; i < n; i++) {
    const x = n > 1 ? (2 * i) / (n - 1) - 1 : 0;
    let pm1 = 1;
    let p = x;
    if (P > 0) out[0][i] = 1;
    if (P > 1) out[1][i] = x;
    for (let a = 2; a < P; a++) {
      // Bonnet recursion: a P_a = (2a - 1) x P_(a-1) - (a - 1) P_(a-2)
      const next = ((2 * a - 1) * x * p - (a - 1) * pm1) / a;
      pm1 = p;
      p = next;
      out[a][i] = p;
    }
  }
  return out;
}

/**
 * The continuum polynomials made orthonormal under the data weights
 * (sum_i w_i q_a(i) q_b(i) = delta_ab; Gram-Schmidt via the Cholesky factor of
 * the Legendre Gram matrix G = L L^T, q = L^-1 p). They span the same space as
 * polyBasis, so every chi2 is unchanged, but the polynomial block of the normal
 * equations is the identity and drops out of the per-shift solve.
 * q_0 is a constant. null when G is singular (too few good pixels).
 */
export function weightedOrthonormalBasis(data: ScanData, P: number): Float64Array[] | null {
  const n = data.flux.length;
  const p = polyBasis(n, P);
  const G = new Float64Array(P * P);
  for (let i = 0; i < n; i++) {
    const w = data.ivar[i];
    if (!(w > 0)) continue;
    for (let a = 0; a < P; a++) {
      const wa = w * p[a][i];
      for (let b = 0; b <= a; b++) G[a * P + b] += wa * p[b][i];
    }
  }
  // Cholesky G = L L^T (lower triangle of G holds the sums).
  const L = new Float64Array(P * P);
  for (let a = 0; a < P; a++) {
    for (let b = 0; b <= a; b++) {
      let v = G[a * P + b];
      for (let k = 0; k < b; k++) v -= L[a * P + k] * L[b * P + k];
      if (a === b) {
        if (!(v > 1e-12 * G[a * P + a])) return null;
        L[a * P + a] = Math.sqrt(v);
      } else L[a * P + b] = v / L[b * P + b];
    }
  }
  // q_a = (p_a - sum_{b<a} L_ab q_b) / L_aa (forward substitution, row by row).
  const q: Float64Array[] = [];
  for (let a = 0; a < P; a++) {
    const qa = Float64Array.from(p[a]);
    for (let b = 0; b < a; b++) {
      const l = L[a * P + b];
      const qb = q[b];
      for (let i = 0; i < n; i++) qa[i] -= l * qb[i];
    }
    const inv = 1 / L[a * P + a];
    for (let i = 0; i < n; i++) qa[i] *= inv;
    q.push(qa);
  }
  return q;
}

/** The constant of basis[0] when it is constant and non-zero (then sum w t t comes from the w q_0 spectrum), else NaN. */
function constantOf(b: Float64Array): number {
  const c = b[0];
  for (let i = 1; i < b.length; i++) if (b[i] !== c) return NaN;
  return c !== 0 ? c : NaN;
}

function overlaps(a: RestArray, b: RestArray): boolean {
  return a.lo <= a.hi && b.lo <= b.hi && a.lo <= b.hi && b.lo <= a.hi;
}

/** Does vector t meet any data pixel over the shift range? */
function reaches(t: RestArray, data: ScanData, sMin: number, sMax: number): boolean {
  const restLo = data.k0 - sMax;
  const restHi = data.k0 + data.flux.length - 1 - sMin;
  return t.lo <= t.hi && t.lo <= restHi && t.hi >= restLo;
}

function emptySums(sMin: number, nShift: number, K: number, P: number, vectors: RestArray[]): ScanSums {
  const tt: (Float64Array | null)[] = new Array(K * K).fill(null);
  for (let j = 0; j < K; j++) for (let k = j; k < K; k++) if (overlaps(vectors[j], vectors[k])) tt[j * K + k] = new Float64Array(nShift);
  return {
    sMin,
    nShift,
    K,
    P,
    tf: vectors.map(() => new Float64Array(nShift)),
    tp: Array.from({ length: K * P }, () => new Float64Array(nShift)),
    tt,
  };
}

/** The slow obvious sums (for tests and tiny ranges). */
export function scanSumsDirect(data: ScanData, vectors: RestArray[], sMin: number, sMax: number, P: number, basis?: Float64Array[]): ScanSums {
  const n = data.flux.length;
  const K = vectors.length;
  const nShift = sMax - sMin + 1;
  const sums = emptySums(sMin, nShift, K, P, vectors);
  const poly = basis ?? polyBasis(n, P);
  for (let si = 0; si < nShift; si++) {
    const s = sMin + si;
    for (let i = 0; i < n; i++) {
      const w = data.ivar[i];
      if (!(w > 0)) continue;
      const k = data.k0 + i - s;
      for (let j = 0; j < K; j++) {
        const tj = valueAt(vectors[j], k);
        if (tj === 0) continue;
        sums.tf[j][si] += w * data.flux[i] * tj;
        for (let a = 0; a < P; a++) sums.tp[j * P + a][si] += w * poly[a][i] * tj;
        for (let q = j; q < K; q++) {
          const arr = sums.tt[j * K + q];
          if (arr) arr[si] += w * tj * valueAt(vectors[q], k);
        }
      }
    }
  }
  return sums;
}

/**
 * The same sums for short shift ranges (stars), in plain loops over the
 * overlap of each vector with the data: O(nShift * n * K) with no FFT.
 * Tested against scanSumsDirect.
 */
export function scanSumsSmall(data: ScanData, vectors: RestArray[], sMin: number, sMax: number, P: number, basis?: Float64Array[]): ScanSums {
  const n = data.flux.length;
  const K = vectors.length;
  const nShift = sMax - sMin + 1;
  const sums = emptySums(sMin, nShift, K, P, vectors);
  const poly = basis ?? polyBasis(n, P);
  const wf = new Float64Array(n);
  const wOnly = new Float64Array(n);
  const wp = poly.map(() => new Float64Array(n));
  for (let i = 0; i < n; i++) {
    const w = data.ivar[i] > 0 ? data.ivar[i] : 0;
    wOnly[i] = w;
    wf[i] = w * data.flux[i];
    for (let a = 0; a < P; a++) wp[a][i] = w * poly[a][i];
  }
  for (let si = 0; si < nShift; si++) {
    const s = sMin + si;
    for (let j = 0; j < K; j++) {
      const v = vectors[j];
      // data pixel i meets rest pixel k = k0 + i - s; values index k - kStart
      const off = data.k0 - s - v.kStart;
      const i0 = Math.max(0, v.lo - data.k0 + s);
      const i1 = Math.min(n - 1, v.hi - data.k0 + s);
      if (i1 < i0) continue;
      const vals = v.values;
      let tf = 0;
      for (let i = i0; i <= i1; i++) tf += wf[i] * vals[i + off];
      sums.tf[j][si] = tf;
      for (let a = 0; a < P; a++) {
        const wpa = wp[a];
        let t = 0;
        for (let i = i0; i <= i1; i++) t += wpa[i] * vals[i + off];
        sums.tp[j * P + a][si] = t;
      }
      for (let q = j; q < K; q++) {
        const dest = sums.tt[j * K + q];
        if (!dest) continue;
        const u = vectors[q];
        const offq = data.k0 - s - u.kStart;
        const a0 = Math.max(i0, u.lo - data.k0 + s);
        const a1 = Math.min(i1, u.hi - data.k0 + s);
        let t = 0;
        for (let i = a0; i <= a1; i++) t += wOnly[i] * vals[i + off] * u.values[i + offq];
        dest[si] = t;
      }
    }
  }
  return sums;
}

/** Template spectra cached per (family key, FFT size, segment start). */
interface TemplateSpectra {
  single: HalfSpectrum[];
  products: (HalfSpectrum | null)[];
}
const templateCache = new Map<string, TemplateSpectra>();
const TEMPLATE_CACHE_MAX = 48;
const planCache = new Map<number, CorrelationPlan>();

function planOf(L: number): CorrelationPlan {
  let p = planCache.get(L);
  if (!p) {
    p = new CorrelationPlan(L);
    planCache.set(L, p);
  }
  return p;
}

/** Segment starts are rounded down to multiples of this (pixels), so nearby spectra share cached template spectra. */
const SEGMENT_BLOCK = 128;

function templateSpectra(key: string, vectors: RestArray[], R0: number, plan: CorrelationPlan): TemplateSpectra {
  const L = plan.size;
  const ck = `${key}|${L}|${R0}`;
  const hit = templateCache.get(ck);
  if (hit) return hit;
  const K = vectors.length;
  const seg = (f: (k: number) => number) => {
    const a = new Float64Array(L);
    for (let j = 0; j < L; j++) a[j] = f(R0 + j);
    return a;
  };
  const signals: Float64Array[] = [];
  for (let j = 0; j < K; j++) signals.push(seg((k) => valueAt(vectors[j], k)));
  const prodIdx: number[] = [];
  for (let j = 0; j < K; j++)
    for (let q = j; q < K; q++) {
      if (!overlaps(vectors[j], vectors[q])) {
        prodIdx.push(-1);
        continue;
      }
      prodIdx.push(signals.length);
      const a = signals[j];
      const b = signals[q];
      const p = new Float64Array(L);
      for (let m = 0; m < L; m++) p[m] = a[m] * b[m];
      signals.push(p);
    }
  const spectra: HalfSpectrum[] = [];
  for (let i = 0; i < signals.length; i += 2) {
    const [A, B] = plan.forwardPair(signals[i], signals[i + 1]);
    spectra.push(A);
    if (i + 1 < signals.length) spectra.push(B);
  }
  const products: (HalfSpectrum | null)[] = new Array(K * K).fill(null);
  let c = 0;
  for (let j = 0; j < K; j++)
    for (let q = j; q < K; q++) {
      const idx = prodIdx[c++];
      if (idx >= 0) products[j * K + q] = spectra[idx];
    }
  const out = { single: spectra.slice(0, K), products };
  if (templateCache.size >= TEMPLATE_CACHE_MAX) templateCache.delete(templateCache.keys().next().value as string);
  templateCache.set(ck, out);
  return out;
}

/**
 * Data-side spectra (w f, w p_0 .. w p_(P-1)) for one FFT size; compute once
 * per spectrum and share across families with the same size.
 */
export interface DataSpectra {
  L: number;
  wf: HalfSpectrum;
  wp: HalfSpectrum[];
  /** Spectrum of the weights alone (for sum w t_j t_k). */
  w: HalfSpectrum;
}

/**
 * Buffers reused by dataSpectra between spectra when the caller names a slot
 * (reuseKey): the signal scratch by length, the half spectra by slot.
 */
const signalScratch = new Map<number, Float64Array[]>();
const dataSpectraPool = new Map<string, HalfSpectrum[]>();
const DATA_POOL_MAX = 16;

function scratchSignals(n: number, count: number): Float64Array[] {
  let s = signalScratch.get(n);
  if (!s) {
    if (signalScratch.size >= DATA_POOL_MAX) signalScratch.delete(signalScratch.keys().next().value as number);
    s = [];
    signalScratch.set(n, s);
  }
  while (s.length < count) s.push(new Float64Array(n));
  return s;
}

function pooledHalfSpectra(key: string, count: number, len: number): HalfSpectrum[] {
  let s = dataSpectraPool.get(key);
  if (!s) {
    if (dataSpectraPool.size >= DATA_POOL_MAX) dataSpectraPool.delete(dataSpectraPool.keys().next().value as string);
    s = [];
    dataSpectraPool.set(key, s);
  }
  while (s.length < count) s.push(new Float64Array(len));
  return s;
}

/**
 * With `reuseKey`, the returned spectra live in a pool and are overwritten by
 * the next call with the same key, size and P: a fit names one key per data
 * set it scans (e.g. its binning) and is done with them before the next fit.
 */
export function dataSpectra(data: ScanData, P: number, L: number, basis?: Float64Array[], reuseKey?: string): DataSpectra {
  const plan = planOf(L);
  const n = data.flux.length;
  const poly = basis ?? polyBasis(n, P);
  // The weights' spectrum: w q_0 scaled when q_0 is a constant, else its own transform.
  const c0 = P > 0 ? constantOf(poly[0]) : NaN;
  const nSignals = 1 + P + (c0 === c0 ? 0 : 1);
  const signals = reuseKey !== undefined ? scratchSignals(n, nSignals) : Array.from({ length: nSignals }, () => new Float64Array(n));
  const wf = signals[0];
  for (let i = 0; i < n; i++) wf[i] = data.ivar[i] > 0 ? data.ivar[i] * data.flux[i] : 0;
  for (let a = 0; a < P; a++) {
    const s = signals[1 + a];
    const pa = poly[a];
    for (let i = 0; i < n; i++) s[i] = data.ivar[i] > 0 ? data.ivar[i] * pa[i] : 0;
  }
  if (!(c0 === c0)) {
    const s = signals[1 + P];
    for (let i = 0; i < n; i++) s[i] = data.ivar[i] > 0 ? data.ivar[i] : 0;
  }
  const h2 = L + 2;
  const outs = reuseKey !== undefined ? pooledHalfSpectra(`${reuseKey}|${L}|${P}`, nSignals + 1, h2) : null;
  const spectra: HalfSpectrum[] = [];
  for (let i = 0; i < nSignals; i += 2) {
    const [A, B] = plan.forwardPair(signals[i], i + 1 < nSignals ? signals[i + 1] : undefined, outs?.[i], outs?.[i + 1]);
    spectra.push(A);
    if (i + 1 < nSignals) spectra.push(B);
  }
  let w: HalfSpectrum;
  if (c0 === c0) {
    w = outs ? outs[nSignals] : new Float64Array(h2);
    const inv = 1 / c0;
    const s1 = spectra[1];
    for (let k = 0; k < h2; k++) w[k] = s1[k] * inv;
  } else w = spectra[1 + P];
  return { L, wf: spectra[0], wp: spectra.slice(1, 1 + P), w };
}

/** FFT size needed for a scan of nShift shifts over n data pixels. */
export function fftSizeFor(n: number, nShift: number): number {
  return nextPow2(n + nShift + SEGMENT_BLOCK);
}

/**
 * Sums by FFT. `key` names the vector set for the template cache (the same key
 * must always mean the same vectors). `ds` may be passed in to share data
 * spectra between families; it must have been made with the same P and size.
 */
/** Sums reused between spectra by scanFFT (per vector set and shift range), so a batch does not allocate them per spectrum. */
const sumsPool = new Map<string, ScanSums>();
const SUMS_POOL_MAX = 16;

function pooledSums(poolKey: string, sMin: number, nShift: number, K: number, P: number, vectors: RestArray[]): ScanSums {
  const hit = sumsPool.get(poolKey);
  if (hit) {
    for (const a of hit.tf) a.fill(0);
    for (const a of hit.tp) a.fill(0);
    for (const a of hit.tt) a?.fill(0);
    return hit;
  }
  const sums = emptySums(sMin, nShift, K, P, vectors);
  if (sumsPool.size >= SUMS_POOL_MAX) sumsPool.delete(sumsPool.keys().next().value as string);
  sumsPool.set(poolKey, sums);
  return sums;
}

/**
 * With `reuse`, the returned sums live in a pool and are overwritten by the
 * next call with the same key and range: use them before calling again.
 */
export function scanSumsFFT(
  data: ScanData, vectors: RestArray[], sMin: number, sMax: number, P: number, key: string, ds?: DataSpectra, basis?: Float64Array[], reuse = false,
): ScanSums {
  const n = data.flux.length;
  const K = vectors.length;
  const nShift = sMax - sMin + 1;
  const L = ds?.L ?? fftSizeFor(n, nShift);
  if (L < n + nShift + SEGMENT_BLOCK - 1) throw new Error('scanSumsFFT: FFT size too small for the range');
  const plan = planOf(L);
  const d = ds ?? dataSpectra(data, P, L, basis);
  const R0 = Math.floor((data.k0 - sMax) / SEGMENT_BLOCK) * SEGMENT_BLOCK;
  const ts = templateSpectra(key, vectors, R0, plan);
  const sums = reuse ? pooledSums(`${key}|${sMin}|${nShift}|${P}`, sMin, nShift, K, P, vectors) : emptySums(sMin, nShift, K, P, vectors);

  // List every correlation to compute: (data spectrum, template spectrum, destination).
  const jobs: { X: HalfSpectrum; Y: HalfSpectrum; dest: Float64Array }[] = [];
  for (let j = 0; j < K; j++) {
    if (!reaches(vectors[j], data, sMin, sMax)) continue;
    jobs.push({ X: d.wf, Y: ts.single[j], dest: sums.tf[j] });
    for (let a = 0; a < P; a++) jobs.push({ X: d.wp[a], Y: ts.single[j], dest: sums.tp[j * P + a] });
    for (let q = j; q < K; q++) {
      const prod = ts.products[j * K + q];
      const dest = sums.tt[j * K + q];
      if (prod && dest && reaches(vectors[q], data, sMin, sMax)) jobs.push({ X: d.w, Y: prod, dest });
    }
  }
  const mAt0 = data.k0 - sMin - R0; // m for s = sMin; m decreases by 1 per shift
  for (let i = 0; i < jobs.length; i += 2) {
    const a = jobs[i];
    const b = jobs[i + 1];
    plan.correlatePairLags(a.X, a.Y, a.dest, mAt0, nShift, b?.X, b?.Y, b?.dest);
  }
  return sums;
}

/** Shift-independent pieces of the normal equations. */
export interface ScanConstants {
  /** sum w f^2 */
  fwf: number;
  /** sum w f p_a */
  pf: Float64Array;
  /** sum w p_a p_b, row-major P x P */
  pp: Float64Array;
  /** good pixels */
  nGood: number;
  /** sum w (sets the scale below which a template column counts as empty) */
  sumW: number;
  /** pp is the identity (to 1e-9): a weighted-orthonormal basis, no inverse needed. */
  orthonormal?: boolean;
}

export function scanConstants(data: ScanData, P: number, basis?: Float64Array[]): ScanConstants {
  const n = data.flux.length;
  const poly = basis ?? polyBasis(n, P);
  let fwf = 0;
  let nGood = 0;
  let sumW = 0;
  const pf = new Float64Array(P);
  const pp = new Float64Array(P * P);
  const wf = new Float64Array(n);
  const wOnly = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const w = data.ivar[i];
    if (!(w > 0)) continue;
    nGood++;
    sumW += w;
    const f = data.flux[i];
    fwf += w * f * f;
    wf[i] = w * f;
    wOnly[i] = w;
  }
  if (P === 5) {
    // The default: all 20 sums in one pass (same products, fewer loads).
    const [p0, p1, p2, p3, p4] = poly;
    let f0 = 0, f1 = 0, f2 = 0, f3 = 0, f4 = 0;
    let s00 = 0, s10 = 0, s11 = 0, s20 = 0, s21 = 0, s22 = 0, s30 = 0, s31 = 0, s32 = 0, s33 = 0, s40 = 0, s41 = 0, s42 = 0, s43 = 0, s44 = 0;
    for (let i = 0; i < n; i++) {
      const w = wOnly[i];
      if (w === 0) continue;
      const x = wf[i];
      const a0 = p0[i], a1 = p1[i], a2 = p2[i], a3 = p3[i], a4 = p4[i];
      f0 += x * a0;
      f1 += x * a1;
      f2 += x * a2;
      f3 += x * a3;
      f4 += x * a4;
      const w0 = w * a0, w1 = w * a1, w2 = w * a2, w3 = w * a3, w4 = w * a4;
      s00 += w0 * a0;
      s10 += w1 * a0;
      s11 += w1 * a1;
      s20 += w2 * a0;
      s21 += w2 * a1;
      s22 += w2 * a2;
      s30 += w3 * a0;
      s31 += w3 * a1;
      s32 += w3 * a2;
      s33 += w3 * a3;
      s40 += w4 * a0;
      s41 += w4 * a1;
      s42 += w4 * a2;
      s43 += w4 * a3;
      s44 += w4 * a4;
    }
    pf.set([f0, f1, f2, f3, f4]);
    pp.set([s00, s10, s20, s30, s40, s10, s11, s21, s31, s41, s20, s21, s22, s32, s42, s30, s31, s32, s33, s43, s40, s41, s42, s43, s44]);
  } else {
    for (let a = 0; a < P; a++) {
      const pa = poly[a];
      let sf = 0;
      for (let i = 0; i < n; i++) sf += wf[i] * pa[i];
      pf[a] = sf;
      for (let b = 0; b <= a; b++) {
        const pb = poly[b];
        let sp = 0;
        for (let i = 0; i < n; i++) sp += wOnly[i] * pa[i] * pb[i];
        pp[a * P + b] = sp;
        pp[b * P + a] = sp;
      }
    }
  }
  let orthonormal = P > 0;
  for (let a = 0; a < P; a++) for (let b = 0; b < P; b++) if (Math.abs(pp[a * P + b] - (a === b ? 1 : 0)) > 1e-9) orthonormal = false;
  return { fwf, pf, pp, nGood, sumW, orthonormal };
}

export interface ScanResult {
  sMin: number;
  /** chi2 at each shift. */
  chi2: Float64Array;
  /** Number of non-zero template amplitudes at each shift. */
  nActive: Uint8Array;
}

/** Solve the normal equations at every shift (non-negative template amplitudes). */
export function chi2FromSums(sums: ScanSums, c: ScanConstants, allowed?: (Uint8Array | null)[]): ScanResult {
  const { K, P } = sums;
  if (K <= MAX_K && P > 0) {
    if (c.orthonormal) return chi2Ortho(sums, c, allowed);
    const H = invertSmall(c.pp, P);
    if (H) return chi2Schur(sums, c, H, allowed);
  }
  return chi2General(sums, c, allowed);
}

/** Margin, in pixels, that keeps a line centre "inside" the data. */
export const PEAK_MARGIN_PIX = 8;

/**
 * Per vector, per shift: 1 when one of the vector's line centres (peaksA)
 * falls inside the data at that shift; null for vectors without peaks.
 * The data's pixel size is dlog10.
 */
export function peakMasks(data: ScanData, vectors: RestArray[], sMin: number, nShift: number, dlog10: number): (Uint8Array | null)[] {
  const n = data.flux.length;
  return vectors.map((v) => {
    if (!v.peaksA) return null;
    const m = new Uint8Array(nShift);
    for (const pk of v.peaksA) {
      const kp = Math.log10(pk) / dlog10; // rest pixel (fractional)
      // observed pixel index kp + s - k0 within [margin, n - 1 - margin]
      const sLo = Math.ceil(data.k0 + PEAK_MARGIN_PIX - kp);
      const sHi = Math.floor(data.k0 + n - 1 - PEAK_MARGIN_PIX - kp);
      for (let s = Math.max(sLo, sMin); s <= Math.min(sHi, sMin + nShift - 1); s++) m[s - sMin] = 1;
    }
    return m;
  });
}

/** Fast path: polynomial eliminated once (scanSolve.ts). */
function chi2Schur(sums: ScanSums, c: ScanConstants, H: Float64Array, allowed?: (Uint8Array | null)[]): ScanResult {
  const { K, P, nShift } = sums;
  const solver = makeSubsetSolver(K);
  const chi2 = new Float64Array(nShift);
  const nActive = new Uint8Array(nShift);
  // base = fwf - pf^T H pf; Hpf = H pf
  const Hpf = new Float64Array(P);
  let base = c.fwf;
  for (let a = 0; a < P; a++) {
    for (let b = 0; b < P; b++) Hpf[a] += H[a * P + b] * c.pf[b];
    base -= c.pf[a] * Hpf[a];
  }
  const S = new Float64Array(K * K);
  const r = new Float64Array(K);
  const u = new Float64Array(K * P); // u_j = H C_j
  const amp = new Float64Array(K);
  const usable = new Uint8Array(K);
  const tiny = 1e-10 * Math.max(c.sumW, 1e-300);
  for (let si = 0; si < nShift; si++) {
    for (let j = 0; j < K; j++) {
      let rj = sums.tf[j][si];
      for (let a = 0; a < P; a++) {
        let v = 0;
        for (let b = 0; b < P; b++) v += H[a * P + b] * sums.tp[j * P + b][si];
        u[j * P + a] = v;
        rj -= sums.tp[j * P + a][si] * Hpf[a];
      }
      r[j] = rj;
    }
    for (let j = 0; j < K; j++) {
      for (let q = j; q < K; q++) {
        const arr = sums.tt[j * K + q];
        let v = arr ? arr[si] : 0;
        for (let a = 0; a < P; a++) v -= sums.tp[j * P + a][si] * u[q * P + a];
        S[j * K + q] = v;
        S[q * K + j] = v;
      }
      const d = sums.tt[j * K + j];
      const al = allowed?.[j];
      usable[j] = d && d[si] > tiny && (!al || al[si]) ? 1 : 0;
    }
    const explained = solver.solve(S, r, usable, amp);
    chi2[si] = base - explained;
    let act = 0;
    for (let j = 0; j < K; j++) if (amp[j] > 0) act++;
    nActive[si] = act;
  }
  return { sMin: sums.sMin, chi2, nActive };
}

/**
 * Fastest path, for a weighted-orthonormal polynomial basis (pp = I): the
 * Schur complement needs no inverse, S = T^T W T - C^T C, r = T^T W f - C^T pf.
 */
function chi2Ortho(sums: ScanSums, c: ScanConstants, allowed?: (Uint8Array | null)[]): ScanResult {
  const { K, P, nShift } = sums;
  if (K === 1) return chi2OrthoOne(sums, c, allowed);
  const solver = makeSubsetSolver(K);
  const chi2 = new Float64Array(nShift);
  const nActive = new Uint8Array(nShift);
  let base = c.fwf;
  for (let a = 0; a < P; a++) base -= c.pf[a] * c.pf[a];
  const S = new Float64Array(K * K);
  const r = new Float64Array(K);
  const amp = new Float64Array(K);
  const usable = new Uint8Array(K);
  const C = new Float64Array(K * P);
  const tiny = 1e-10 * Math.max(c.sumW, 1e-300);
  const pf = c.pf;
  const tp = sums.tp;
  const tt = sums.tt;
  const tf = sums.tf;
  for (let si = 0; si < nShift; si++) {
    for (let j = 0; j < K; j++) {
      let rj = tf[j][si];
      for (let a = 0; a < P; a++) {
        const v = tp[j * P + a][si];
        C[j * P + a] = v;
        rj -= v * pf[a];
      }
      r[j] = rj;
    }
    for (let j = 0; j < K; j++) {
      for (let q = j; q < K; q++) {
        const arr = tt[j * K + q];
        let v = arr ? arr[si] : 0;
        for (let a = 0; a < P; a++) v -= C[j * P + a] * C[q * P + a];
        S[j * K + q] = v;
        S[q * K + j] = v;
      }
      const d = tt[j * K + j];
      const al = allowed?.[j];
      usable[j] = d && d[si] > tiny && (!al || al[si]) ? 1 : 0;
    }
    const explained = solver.solve(S, r, usable, amp);
    chi2[si] = base - explained;
    let act = 0;
    for (let j = 0; j < K; j++) if (amp[j] > 0) act++;
    nActive[si] = act;
  }
  return { sMin: sums.sMin, chi2, nActive };
}

/** chi2Ortho for a single template: a = r / S when positive (the one-variable NNLS), else 0. */
function chi2OrthoOne(sums: ScanSums, c: ScanConstants, allowed?: (Uint8Array | null)[]): ScanResult {
  const { P, nShift } = sums;
  const chi2 = new Float64Array(nShift);
  const nActive = new Uint8Array(nShift);
  let base = c.fwf;
  for (let a = 0; a < P; a++) base -= c.pf[a] * c.pf[a];
  const tiny = 1e-10 * Math.max(c.sumW, 1e-300);
  const tf = sums.tf[0];
  const tp = sums.tp;
  const d = sums.tt[0];
  const al = allowed?.[0];
  for (let si = 0; si < nShift; si++) {
    chi2[si] = base;
    if (!d || !(d[si] > tiny) || (al && !al[si])) continue;
    let r = tf[si];
    let S = d[si];
    for (let a = 0; a < P; a++) {
      const v = tp[a][si];
      r -= v * c.pf[a];
      S -= v * v;
    }
    // The one-variable case of makeSubsetSolver: S > 0 is its pivot test, r > 0 a positive amplitude.
    if (r > 0 && S > 0) {
      chi2[si] = base - (r * r) / S;
      nActive[si] = 1;
    }
  }
  return { sMin: sums.sMin, chi2, nActive };
}

/** General path: full normal equations with Lawson-Hanson at every shift. */
function chi2General(sums: ScanSums, c: ScanConstants, allowed?: (Uint8Array | null)[]): ScanResult {
  const { K, P, nShift } = sums;
  const n = P + K;
  const M = new Float64Array(n * n);
  const b = new Float64Array(n);
  const x = new Float64Array(n);
  const work = makeNnlsWork(n);
  const chi2 = new Float64Array(nShift);
  const nActive = new Uint8Array(nShift);
  for (let a = 0; a < P; a++) {
    b[a] = c.pf[a];
    for (let q = 0; q < P; q++) M[a * n + q] = c.pp[a * P + q];
  }
  const tiny = 1e-10 * Math.max(c.sumW, 1e-300);
  let siNow = 0;
  const usable = (j: number) => j < P || (M[j * n + j] > tiny && (!allowed?.[j - P] || allowed[j - P]![siNow] === 1));
  for (let si = 0; si < nShift; si++) {
    siNow = si;
    for (let j = 0; j < K; j++) {
      const r = P + j;
      b[r] = sums.tf[j][si];
      for (let a = 0; a < P; a++) {
        const v = sums.tp[j * P + a][si];
        M[r * n + a] = v;
        M[a * n + r] = v;
      }
      for (let q = j; q < K; q++) {
        const arr = sums.tt[j * K + q];
        const v = arr ? arr[si] : 0;
        M[r * n + P + q] = v;
        M[(P + q) * n + r] = v;
      }
    }
    const explained = nnlsNormal(M, b, n, P, usable, x, work);
    chi2[si] = c.fwf - explained;
    let act = 0;
    for (let j = P; j < n; j++) if (x[j] > 0) act++;
    nActive[si] = act;
  }
  return { sMin: sums.sMin, chi2, nActive };
}

/** The general solver for every shift (kept to test the fast path against). */
export function chi2FromSumsGeneral(sums: ScanSums, c: ScanConstants, allowed?: (Uint8Array | null)[]): ScanResult {
  return chi2General(sums, c, allowed);
}

/** Chi-square at every shift sMin..sMax by FFT correlations. */
export function scanFFT(
  data: ScanData,
  vectors: RestArray[],
  sMin: number,
  sMax: number,
  P: number,
  key: string,
  ds?: DataSpectra,
  dlog10?: number,
  consts?: ScanConstants,
  basis?: Float64Array[],
): ScanResult {
  const allowed = dlog10 ? peakMasks(data, vectors, sMin, sMax - sMin + 1, dlog10) : undefined;
  return chi2FromSums(scanSumsFFT(data, vectors, sMin, sMax, P, key, ds, basis, true), consts ?? scanConstants(data, P, basis), allowed);
}

/** Chi-square at every shift by direct sums (slow; for tests). */
export function scanDirect(data: ScanData, vectors: RestArray[], sMin: number, sMax: number, P: number, dlog10?: number, consts?: ScanConstants): ScanResult {
  const allowed = dlog10 ? peakMasks(data, vectors, sMin, sMax - sMin + 1, dlog10) : undefined;
  return chi2FromSums(scanSumsDirect(data, vectors, sMin, sMax, P), consts ?? scanConstants(data, P), allowed);
}

/** Chi-square at every shift by scanSumsSmall (short ranges: stars). */
export function scanSmall(
  data: ScanData,
  vectors: RestArray[],
  sMin: number,
  sMax: number,
  P: number,
  dlog10: number,
  consts?: ScanConstants,
  basis?: Float64Array[],
): ScanResult {
  const allowed = peakMasks(data, vectors, sMin, sMax - sMin + 1, dlog10);
  return chi2FromSums(scanSumsSmall(data, vectors, sMin, sMax, P, basis), consts ?? scanConstants(data, P, basis), allowed);
}
