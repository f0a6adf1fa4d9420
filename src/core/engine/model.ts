/**
 * A family's model at one whole-pixel shift, by direct sums over the data:
 * every vector plus the continuum polynomial, least squares with the
 * non-negative amplitudes kept >= 0 (the same solve as the scan,
 * kernels/shiftSolve.ts). Used for the few candidates, never per shift.
 */
import { makeShiftSolver, solveShift } from './kernels/shiftSolve';
import type { WeightedData } from './scanData';

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
export function evaluateAt(data: WeightedData, vectors: Float64Array[], kStart: number, nonNegative: readonly boolean[], shift: number, polyFromA?: number): ModelFit {
  if (polyFromA !== undefined) return evaluateGatedAt(data, vectors, kStart, nonNegative, shift, Math.ceil(Math.log10(polyFromA) / data.dlog10));
  const K = vectors.length;
  const P = data.q.length;
  const solver = makeShiftSolver(K, P);
  const { tt, tf, tq } = solver;
  const nT = vectors[0].length;
  const rows = transposed(vectors);
  const n = data.w.length;
  const { w: W, wf: WF, wq: WQ } = data;
  // pixels where the vectors are defined: t = d0 + i - shift - kStart in [0, nT)
  const iFrom = Math.max(0, kStart + shift - data.d0);
  const iTo = Math.min(n, kStart + shift - data.d0 + nT);
  for (let i = iFrom; i < iTo; i++) {
    const w = W[i];
    if (!(w > 0)) continue;
    const base = (data.d0 + i - shift - kStart) * K;
    const wfi = WF[i];
    for (let j = 0; j < K; j++) {
      const r = rows[base + j];
      if (r === 0) continue;
      const wr = w * r;
      const o = j * K;
      for (let l = 0; l <= j; l++) tt[o + l] += wr * rows[base + l];
      tf[j] += r * wfi;
      for (let a = 0; a < P; a++) tq[j * P + a] += r * WQ[a][i];
    }
  }
  const chi2 = solveShift(solver, data.g, data.F, nonNegative);
  const amplitudes = Float64Array.from(solver.a);
  // polynomial coefficients: the part of g the templates do not explain (q orthonormal)
  const polyCoeffs = Float64Array.from(data.g, (ga, a) => {
    let s = ga;
    for (let j = 0; j < K; j++) s -= amplitudes[j] * tq[j * P + a];
    return s;
  });
  return { shift, chi2, amplitudes, polyCoeffs, nParams: solver.used + P };
}

/**
 * The vectors as one row-major matrix (template pixel t, vector j at
 * t * K + j), so a pixel's row is contiguous in memory. Kept per vectors
 * array (a WeakMap: it goes with the array, nothing to evict by hand).
 */
const transposedOf = new WeakMap<Float64Array[], Float64Array>();
function transposed(vectors: Float64Array[]): Float64Array {
  if (vectors.length === 1) return vectors[0];
  let m = transposedOf.get(vectors);
  if (!m) {
    const K = vectors.length;
    const nT = vectors[0].length;
    m = new Float64Array(nT * K);
    for (let j = 0; j < K; j++) {
      const v = vectors[j];
      for (let t = 0; t < nT; t++) m[t * K + j] = v[t];
    }
    transposedOf.set(vectors, m);
  }
  return m;
}

/** evaluateAt with the polynomial gated: it becomes P ordinary columns q_a(i) [rest pixel >= polyFromK], solved together with the vectors. */
function evaluateGatedAt(data: WeightedData, vectors: Float64Array[], kStart: number, nonNegative: readonly boolean[], shift: number, polyFromK: number): ModelFit {
  const K = vectors.length;
  const P = data.q.length;
  const M = K + P;
  const solver = makeShiftSolver(M, 0);
  const { tt, tf } = solver;
  const nT = vectors[0].length;
  const rows = transposed(vectors);
  const row = new Float64Array(M);
  const n = data.w.length;
  let F = 0;
  for (let i = 0; i < n; i++) {
    const w = data.w[i];
    if (!(w > 0)) continue;
    const f = data.flux[i];
    F += w * f * f;
    const t = data.d0 + i - shift - kStart;
    const inT = t >= 0 && t < nT;
    for (let j = 0; j < K; j++) row[j] = inT ? rows[t * K + j] : 0;
    const on = data.d0 + i - shift >= polyFromK ? 1 : 0;
    for (let a = 0; a < P; a++) row[K + a] = on * data.q[a][i];
    for (let j = 0; j < M; j++) {
      const wr = w * row[j];
      if (wr === 0) continue;
      for (let l = 0; l <= j; l++) tt[j * M + l] += wr * row[l];
      tf[j] += wr * f;
    }
  }
  const nonNeg = [...nonNegative, ...new Array(P).fill(false)];
  const chi2 = solveShift(solver, new Float64Array(0), F, nonNeg);
  return { shift, chi2, amplitudes: solver.a.slice(0, K), polyCoeffs: solver.a.slice(K), nParams: solver.used, polyFromK };
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

/** One vector: sum_j amplitudes_j vectors_j (the fit's template part). */
export function combination(vectors: Float64Array[], amplitudes: Float64Array): Float64Array {
  const out = new Float64Array(vectors[0].length);
  for (let j = 0; j < vectors.length; j++) {
    const a = amplitudes[j];
    if (a === 0) continue;
    const v = vectors[j];
    for (let t = 0; t < out.length; t++) out[t] += a * v[t];
  }
  return out;
}
