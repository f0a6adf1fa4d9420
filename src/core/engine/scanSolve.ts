/**
 * Fast per-shift solve for the scan: the continuum polynomial is eliminated
 * once (its Gram matrix G = P^T W P does not depend on the shift), leaving a
 * K x K system per shift (Schur complement, standard block elimination):
 *   S = T^T W T - C^T G^-1 C,  r = T^T W f - C^T G^-1 P^T W f,  C = P^T W T,
 *   chi2 = f^T W f - (P^T W f)^T G^-1 (P^T W f) - r . a,  a = S^-1 r.
 * Non-negative amplitudes: the best of the feasible subset solutions, which is
 * the NNLS optimum (Lawson & Hanson 1974); the full set is tried first.
 * No allocation inside the loop; K up to MAX_K.
 */
export const MAX_K = 4;

/** Relative pivot below which a variable is treated as degenerate. */
const PIVOT_TOL = 1e-11;

export interface SubsetSolver {
  K: number;
  /** Solve max r.a over a >= 0 for S (K x K row-major) and r; returns explained chi2 and writes a. */
  solve(S: Float64Array, r: Float64Array, usable: Uint8Array, a: Float64Array): number;
}

export function makeSubsetSolver(K: number): SubsetSolver {
  if (K > MAX_K) throw new Error(`subset solver handles K <= ${MAX_K}`);
  const L = new Float64Array(K * K);
  const y = new Float64Array(K);
  const idx = new Int32Array(K);
  const trial = new Float64Array(K);
  // Least squares on the subset `mask`: writes trial (0 outside the subset),
  // returns explained chi2 r.a, or NaN when degenerate. `neg` says whether
  // any amplitude came out negative.
  let neg = false;
  const onSubset = (S: Float64Array, r: Float64Array, mask: number): number => {
    let m = 0;
    for (let j = 0; j < K; j++) if (mask & (1 << j)) idx[m++] = j;
    for (let p = 0; p < m; p++) {
      for (let q = 0; q <= p; q++) {
        let s = S[idx[p] * K + idx[q]];
        for (let k = 0; k < q; k++) s -= L[p * K + k] * L[q * K + k];
        if (p === q) {
          if (!(s > PIVOT_TOL * S[idx[p] * K + idx[p]])) return NaN;
          L[p * K + p] = Math.sqrt(s);
        } else L[p * K + q] = s / L[q * K + q];
      }
    }
    for (let p = 0; p < m; p++) {
      let s = r[idx[p]];
      for (let k = 0; k < p; k++) s -= L[p * K + k] * y[k];
      y[p] = s / L[p * K + p];
    }
    for (let p = m - 1; p >= 0; p--) {
      let s = y[p];
      for (let k = p + 1; k < m; k++) s -= L[k * K + p] * y[k];
      y[p] = s / L[p * K + p];
    }
    let ex = 0;
    neg = false;
    trial.fill(0);
    for (let p = 0; p < m; p++) {
      if (y[p] < 0) neg = true;
      trial[idx[p]] = y[p];
      ex += r[idx[p]] * y[p];
    }
    return ex;
  };
  // Kuhn-Tucker check for the current trial on `mask`: no variable outside
  // it would lower chi2 if allowed in (gradient r - S a <= 0 there).
  const kkt = (S: Float64Array, r: Float64Array, full: number, mask: number): boolean => {
    for (let j = 0; j < K; j++) {
      if (!(full & (1 << j)) || mask & (1 << j)) continue;
      let g = r[j];
      for (let k = 0; k < K; k++) g -= S[j * K + k] * trial[k];
      if (g > 1e-12 * (Math.abs(r[j]) + 1e-300)) return false;
    }
    return true;
  };
  return {
    K,
    solve(S, r, usable, a) {
      a.fill(0);
      let full = 0;
      for (let j = 0; j < K; j++) if (usable[j]) full |= 1 << j;
      if (full === 0) return 0;
      const e = onSubset(S, r, full);
      if (e === e && !neg) {
        a.set(trial);
        return e;
      }
      // Usually dropping the negative amplitudes gives the optimum.
      if (e === e) {
        let keep = 0;
        for (let j = 0; j < K; j++) if (full & (1 << j) && trial[j] > 0) keep |= 1 << j;
        if (keep === 0) {
          trial.fill(0);
          if (kkt(S, r, full, 0)) return 0;
        } else {
          const ek = onSubset(S, r, keep);
          if (ek === ek && !neg && kkt(S, r, full, keep)) {
            a.set(trial);
            return ek;
          }
        }
      }
      // Otherwise the best feasible subset (the NNLS optimum).
      let best = 0;
      for (let mask = full; mask > 0; mask = (mask - 1) & full) {
        const ex = onSubset(S, r, mask);
        if (ex === ex && !neg && ex > best) {
          best = ex;
          a.set(trial);
        }
      }
      return best;
    },
  };
}

/** Inverse of a small symmetric positive-definite matrix (Gauss-Jordan); null when singular. */
export function invertSmall(A: Float64Array, n: number): Float64Array | null {
  const M = Float64Array.from(A);
  const I = new Float64Array(n * n);
  for (let i = 0; i < n; i++) I[i * n + i] = 1;
  for (let c = 0; c < n; c++) {
    let piv = c;
    for (let r = c + 1; r < n; r++) if (Math.abs(M[r * n + c]) > Math.abs(M[piv * n + c])) piv = r;
    const pv = M[piv * n + c];
    if (!(Math.abs(pv) > 1e-300)) return null;
    if (piv !== c)
      for (let k = 0; k < n; k++) {
        [M[c * n + k], M[piv * n + k]] = [M[piv * n + k], M[c * n + k]];
        [I[c * n + k], I[piv * n + k]] = [I[piv * n + k], I[c * n + k]];
      }
    for (let k = 0; k < n; k++) {
      M[c * n + k] /= pv;
      I[c * n + k] /= pv;
    }
    for (let r = 0; r < n; r++) {
      if (r === c) continue;
      const f = M[r * n + c];
      if (f === 0) continue;
      for (let k = 0; k < n; k++) {
        M[r * n + k] -= f * M[c * n + k];
        I[r * n + k] -= f * I[c * n + k];
      }
    }
  }
  return I;
}
