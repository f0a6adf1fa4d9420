/**
 * A family's model at one whole-pixel shift, by direct sums over the data:
 * every vector plus the continuum polynomial, least squares with the
 * non-negative amplitudes kept >= 0 (the same solve as the scan,
 * kernels/shiftSolve.ts). Used for the few candidates, never per shift.
 */
import { makeShiftSolver, solveShift } from './kernels/shiftSolve';
import type { WeightedData } from './scanData';
import type { FitWorkspace } from './workspace';

export interface ModelFit {
  shift: number;
  chi2: number;
  /** Template amplitudes (0 for vectors not used). */
  amplitudes: Float64Array;
  /** Polynomial coefficients on data.q. */
  polyCoeffs: Float64Array;
  /** Free parameters used: template amplitudes in play plus polynomial terms. */
  nParams: number;
  /** When set, the polynomial was switched off at rest pixels below this absolute index (data's grid). */
  polyFromK?: number;
}

/**
 * vectors: arrays whose element 0 sits at absolute pixel kStart (on the
 * data's grid); shift in the data's pixels. polyFromA: the continuum
 * polynomial acts only at rest wavelengths >= this (a quasar has no flux of
 * its own below the Lyman limit, so no free continuum may put any there).
 */
export function evaluateAt(data: WeightedData, vectors: Float64Array[], kStart: number, nonNegative: readonly boolean[], shift: number, polyFromA?: number, ws?: FitWorkspace): ModelFit {
  if (polyFromA !== undefined) return evaluateGatedAt(data, vectors, kStart, nonNegative, shift, Math.ceil(Math.log10(polyFromA) / data.dlog10), ws);
  const K = vectors.length;
  const P = data.q.length;
  const solver = makeShiftSolver(K, P);
  const cols = vectorColumns(data, vectors, kStart, shift);
  modelSums(data.w, data.flux, cols, solver.tt, solver.tf, ws);
  // TQ_ja = sum w t_j q_a over t_j's range
  for (let j = 0; j < K; j++) {
    const c = cols[j];
    for (let a = 0; a < P; a++) solver.tq[j * P + a] = dotRange(c.src, c.off, data.wq[a], c.lo, c.hi);
  }
  const chi2 = solveShift(solver, data.g, data.F, nonNegative);
  const amplitudes = Float64Array.from(solver.a);
  // polynomial coefficients: the part of g the templates do not explain (q orthonormal)
  const polyCoeffs = Float64Array.from(data.g, (ga, a) => {
    let s = ga;
    for (let j = 0; j < K; j++) s -= amplitudes[j] * solver.tq[j * P + a];
    return s;
  });
  return { shift, chi2, amplitudes, polyCoeffs, nParams: solver.used + P };
}

/** evaluateAt with the polynomial gated: it becomes P ordinary columns q_a(i) [rest pixel >= polyFromK], solved together with the vectors. */
function evaluateGatedAt(data: WeightedData, vectors: Float64Array[], kStart: number, nonNegative: readonly boolean[], shift: number, polyFromK: number, ws?: FitWorkspace): ModelFit {
  const K = vectors.length;
  const P = data.q.length;
  const n = data.w.length;
  const solver = makeShiftSolver(K + P, 0);
  const cols = vectorColumns(data, vectors, kStart, shift);
  const gateFrom = Math.max(0, Math.min(n, polyFromK - data.d0 + shift));
  for (let a = 0; a < P; a++) cols.push({ src: data.q[a], off: 0, lo: gateFrom, hi: n });
  modelSums(data.w, data.flux, cols, solver.tt, solver.tf, ws);
  // data.w may carry extra variance (the forest) that data.F does not know of
  let F = 0;
  for (let i = 0; i < n; i++) F += data.w[i] * data.flux[i] * data.flux[i];
  const nonNeg = [...nonNegative, ...new Array(P).fill(false)];
  const chi2 = solveShift(solver, new Float64Array(0), F, nonNeg);
  return { shift, chi2, amplitudes: solver.a.slice(0, K), polyCoeffs: solver.a.slice(K), nParams: solver.used, polyFromK };
}

/**
 * One design-matrix column: its value at data pixel i is src[i + off], zero
 * outside pixels [lo, hi). Limiting every sum to the columns' overlap is the
 * speed-up: most vectors (line groups, the forest, the Lyman-continuum leak)
 * are non-zero over a small part of the spectrum.
 */
interface Column {
  src: Float64Array;
  off: number;
  lo: number;
  hi: number;
}

/** The vectors as columns at this shift, each cut to its non-zero span and to the data. */
function vectorColumns(data: WeightedData, vectors: Float64Array[], kStart: number, shift: number): Column[] {
  const off = data.d0 - shift - kStart;
  const n = data.w.length;
  return vectors.map((v) => {
    const [first, last] = nonZeroSpan(v);
    return { src: v, off, lo: Math.max(0, first - off), hi: Math.min(n, last + 1 - off) };
  });
}

/**
 * Normal equations of the columns under weights w: tt (row-major, lower
 * triangle) = sum w c_j c_l and tf = sum w f c_j, each over the columns'
 * overlap only. Fast kernel: w c_l is formed once per column, so every sum
 * is a plain dot product.
 */
function modelSums(w: Float64Array, flux: Float64Array, cols: Column[], tt: Float64Array, tf: Float64Array, ws?: FitWorkspace): void {
  const M = cols.length;
  // w c_l for every column, packed in one array (column l from start[l]); the workspace lends it when there is one
  const start = new Int32Array(M + 1);
  for (let l = 0; l < M; l++) start[l + 1] = start[l] + Math.max(0, cols[l].hi - cols[l].lo);
  const wc = ws ? ws.modelBuffer(start[M]) : new Float64Array(start[M]);
  for (let l = 0; l < M; l++) {
    const c = cols[l];
    const o = start[l] - c.lo;
    for (let i = c.lo; i < c.hi; i++) wc[i + o] = w[i] * c.src[i + c.off];
  }
  for (let j = 0; j < M; j++) {
    const cj = cols[j];
    tf[j] = dotRange(wc, start[j] - cj.lo, flux, cj.lo, cj.hi);
    for (let l = 0; l <= j; l++) {
      const cl = cols[l];
      const lo = Math.max(cj.lo, cl.lo);
      const hi = Math.min(cj.hi, cl.hi);
      // sum c_j (w c_l) over the overlap, with c_j read at its offset
      tt[j * M + l] = dotShifted(cj.src, cj.off, wc, start[l] - cl.lo, lo, hi);
    }
  }
}

/** sum over i in [lo, hi) of x[i + dx] * y[i + dy]. */
function dotShifted(x: Float64Array, dx: number, y: Float64Array, dy: number, lo: number, hi: number): number {
  let s = 0;
  for (let i = lo; i < hi; i++) s += x[i + dx] * y[i + dy];
  return s;
}

/** sum over data pixels [lo, hi) of src[i + off] * y[i]. */
function dotRange(src: Float64Array, off: number, y: Float64Array, lo: number, hi: number): number {
  return dotShifted(src, off, y, 0, lo, hi);
}

/** First and last index of a non-zero element ([0, -1] when none); kept per array (a WeakMap: it goes with the array). */
const spanOf = new WeakMap<Float64Array, [number, number]>();
function nonZeroSpan(v: Float64Array): [number, number] {
  let s = spanOf.get(v);
  if (!s) {
    let first = 0;
    while (first < v.length && v[first] === 0) first++;
    let last = v.length - 1;
    while (last >= first && v[last] === 0) last--;
    s = first > last ? [0, -1] : [first, last];
    spanOf.set(v, s);
  }
  return s;
}

/** The model on the data's pixels (NaN where no template covers). */
export function modelOnData(data: WeightedData, vectors: Float64Array[], kStart: number, fit: ModelFit): Float64Array {
  const n = data.w.length;
  const out = new Float64Array(n);
  const nT = vectors[0].length;
  for (let i = 0; i < n; i++) {
    const t = data.d0 + i - fit.shift - kStart;
    let m = 0;
    if (t >= 0 && t < nT) for (let j = 0; j < vectors.length; j++) m += fit.amplitudes[j] * vectors[j][t];
    const on = fit.polyFromK === undefined || data.d0 + i - fit.shift >= fit.polyFromK ? 1 : 0;
    for (let a = 0; a < data.q.length; a++) m += on * fit.polyCoeffs[a] * data.q[a][i];
    out[i] = m;
  }
  return out;
}

/** One vector: sum_j amplitudes_j vectors_j (the fit's template part), each vector summed over its non-zero span only. */
export function combination(vectors: Float64Array[], amplitudes: Float64Array): Float64Array {
  const out = new Float64Array(vectors[0].length);
  for (let j = 0; j < vectors.length; j++) {
    const a = amplitudes[j];
    if (a === 0) continue;
    const v = vectors[j];
    const [first, last] = nonZeroSpan(v);
    for (let t = first; t <= last; t++) out[t] += a * v[t];
  }
  return out;
}
