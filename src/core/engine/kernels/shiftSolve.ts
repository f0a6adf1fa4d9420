/**
 * The least-squares solve at one shift, from the sums a scan or a direct
 * evaluation produced. The polynomial is orthonormal under the weights
 * (polynomial.ts), so it leaves the system as a fixed projection (block
 * elimination / Schur complement):
 *   S = TT - TQ TQ^T,  r = Tf - TQ g,  chi2 = F - |g|^2 - r . a,  S a = r,
 * with TT_jl = sum w t_j t_l, Tf_j = sum w f t_j, TQ_ja = sum w t_j q_a,
 * g_a = sum w f q_a, F = sum w f^2. Amplitudes flagged non-negative that come
 * out negative are dropped and the rest solved again (an active-set step of
 * Lawson & Hanson 1974, NNLS; exact when at most one constraint binds).
 *
 * Fast path: no allocation per call; buffers live in a ShiftSolver.
 */
import { choleskySolveSubset } from '../../numeric/cholesky';

/** A vector whose diagonal of S falls below this fraction of the largest is treated as absent at this shift (no overlap with good data). */
const ABSENT_FRACTION = 1e-9;

export interface ShiftSolver {
  K: number;
  P: number;
  /** Inputs, filled by the caller: TT (K x K row-major), Tf (K), TQ (K x P row-major). */
  tt: Float64Array;
  tf: Float64Array;
  tq: Float64Array;
  S: Float64Array;
  r: Float64Array;
  a: Float64Array;
  L: Float64Array;
  idx: Int32Array;
  /** Number of amplitudes used at the last solve (after dropping absent and negative ones). */
  used: number;
}

export function makeShiftSolver(K: number, P: number): ShiftSolver {
  return { K, P, tt: new Float64Array(K * K), tf: new Float64Array(K), tq: new Float64Array(K * P), S: new Float64Array(K * K), r: new Float64Array(K), a: new Float64Array(K), L: new Float64Array(K * K), idx: new Int32Array(K), used: 0 };
}

/**
 * chi2 at one shift from the sums in solver.tt, .tf, .tq (only the lower
 * triangle of tt is read); g and F are shift-free. Leaves the amplitudes in
 * solver.a.
 */
export function solveShift(solver: ShiftSolver, g: Float64Array, F: number, nonNegative: readonly boolean[]): number {
  const { K, P, S, r, a, L, idx, tt, tf, tq } = solver;
  let base = F;
  for (let q = 0; q < P; q++) base -= g[q] * g[q];
  let maxDiag = 0;
  for (let j = 0; j < K; j++) {
    for (let l = 0; l <= j; l++) {
      let s = tt[j * K + l];
      for (let q = 0; q < P; q++) s -= tq[j * P + q] * tq[l * P + q];
      S[j * K + l] = s;
      S[l * K + j] = s;
    }
    let rj = tf[j];
    for (let q = 0; q < P; q++) rj -= tq[j * P + q] * g[q];
    r[j] = rj;
    if (S[j * K + j] > maxDiag) maxDiag = S[j * K + j];
  }
  let m = 0;
  for (let j = 0; j < K; j++) if (S[j * K + j] > ABSENT_FRACTION * maxDiag && maxDiag > 0) idx[m++] = j;
  for (let pass = 0; pass <= K; pass++) {
    if (m === 0) {
      a.fill(0);
      solver.used = 0;
      return base;
    }
    const explained = choleskySolveSubset(S, r, K, idx, m, a, L);
    if (!Number.isFinite(explained)) {
      // degenerate subset: drop the last listed vector and try again
      m--;
      continue;
    }
    let kept = 0;
    for (let p = 0; p < m; p++) {
      const j = idx[p];
      if (!(nonNegative[j] && a[j] < 0)) idx[kept++] = j;
    }
    if (kept === m) {
      solver.used = m;
      return base - explained;
    }
    m = kept;
  }
  solver.used = 0;
  a.fill(0);
  return base;
}
