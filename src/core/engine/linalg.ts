/**
 * Small dense least-squares solves on normal equations (A^T W A) x = A^T W f,
 * with the first `nFree` unknowns unconstrained (continuum polynomial) and the
 * rest kept non-negative (template amplitudes), so that absorption cannot pose
 * as an inverted emission line. Non-negativity follows the active-set method
 * of Lawson & Hanson (1974, Solving Least Squares Problems, ch. 23), applied
 * to the normal equations.
 *
 * Matrices are row-major Float64Array n x n. With x solving its passive set,
 * chi2 = f^T W f - b . x, so solvers return b . x ("explained chi2").
 */

/** Relative pivot below which a variable is treated as degenerate. */
const PIVOT_TOL = 1e-11;

/**
 * Solve M[idx, idx] y = b[idx] by Cholesky, writing y into x[idx] (others
 * untouched). Returns the position in idx of the first degenerate pivot, or -1.
 */
export function choleskySubset(M: Float64Array, b: Float64Array, n: number, idx: number[], x: Float64Array, L: Float64Array): number {
  const m = idx.length;
  for (let r = 0; r < m; r++) {
    for (let c = 0; c <= r; c++) {
      let s = M[idx[r] * n + idx[c]];
      for (let k = 0; k < c; k++) s -= L[r * m + k] * L[c * m + k];
      if (r === c) {
        const d = M[idx[r] * n + idx[r]];
        if (!(s > PIVOT_TOL * Math.abs(d)) || !(d > 0)) return r;
        L[r * m + r] = Math.sqrt(s);
      } else {
        L[r * m + c] = s / L[c * m + c];
      }
    }
  }
  // forward then back substitution
  const y = new Float64Array(m);
  for (let r = 0; r < m; r++) {
    let s = b[idx[r]];
    for (let k = 0; k < r; k++) s -= L[r * m + k] * y[k];
    y[r] = s / L[r * m + r];
  }
  for (let r = m - 1; r >= 0; r--) {
    let s = y[r];
    for (let k = r + 1; k < m; k++) s -= L[k * m + r] * y[k];
    y[r] = s / L[r * m + r];
  }
  for (let r = 0; r < m; r++) x[idx[r]] = y[r];
  return -1;
}

/**
 * Least squares on the variables in `idx`, dropping degenerate ones (they get
 * 0) until the Cholesky factorisation succeeds. Returns the indices kept.
 */
function solveDropping(M: Float64Array, b: Float64Array, n: number, idx: number[], x: Float64Array, L: Float64Array): number[] {
  let set = idx.slice();
  for (;;) {
    const bad = choleskySubset(M, b, n, set, x, L);
    if (bad < 0) return set;
    x[set[bad]] = 0;
    set = set.filter((_, i) => i !== bad);
    if (set.length === 0) return set;
  }
}

export interface NnlsWork {
  L: Float64Array;
  z: Float64Array;
}

export function makeNnlsWork(n: number): NnlsWork {
  return { L: new Float64Array(n * n), z: new Float64Array(n) };
}

/**
 * Minimise x^T M x - 2 b^T x with x[j] >= 0 for j >= nFree. `usable[j]` false
 * fixes x[j] = 0 (e.g. a template with no overlap with the data). Writes x and
 * returns b . x (= f^T W f - chi2 at the solution).
 */
export function nnlsNormal(M: Float64Array, b: Float64Array, n: number, nFree: number, usable: (j: number) => boolean, x: Float64Array, work: NnlsWork): number {
  x.fill(0);
  const all: number[] = [];
  for (let j = 0; j < n; j++) if (usable(j)) all.push(j);
  // Fast path: the unconstrained solution is often already feasible.
  let passive = solveDropping(M, b, n, all, x, work.L);
  let feasible = true;
  for (const j of passive) if (j >= nFree && x[j] < 0) feasible = false;
  if (!feasible) {
    // Lawson-Hanson from the polynomial-only solution.
    const inSet = new Uint8Array(n);
    x.fill(0);
    passive = solveDropping(M, b, n, all.filter((j) => j < nFree), x, work.L);
    for (const j of passive) inSet[j] = 1;
    const z = work.z;
    for (let outer = 0; outer < 3 * n; outer++) {
      // gradient of -chi2/2: g = b - M x; pick the most promising constrained variable
      let best = -1;
      let bestG = 0;
      for (const j of all) {
        if (j < nFree || inSet[j]) continue;
        let g = b[j];
        for (let k = 0; k < n; k++) g -= M[j * n + k] * x[k];
        const scale = Math.sqrt(Math.max(M[j * n + j], 0));
        if (g > 1e-12 * scale * (1 + Math.abs(b[j])) && g > bestG) {
          bestG = g;
          best = j;
        }
      }
      if (best < 0) break;
      inSet[best] = 1;
      for (let inner = 0; inner < 3 * n; inner++) {
        const set: number[] = [];
        for (const j of all) if (inSet[j]) set.push(j);
        z.fill(0);
        const kept = solveDropping(M, b, n, set, z, work.L);
        for (const j of set) if (!kept.includes(j)) inSet[j] = 0;
        let alpha = 1;
        let blocked = false;
        for (const j of kept) {
          if (j >= nFree && z[j] <= 0) {
            blocked = true;
            const a = x[j] / (x[j] - z[j]);
            if (a < alpha) alpha = a;
          }
        }
        if (!blocked) {
          for (let j = 0; j < n; j++) x[j] = inSet[j] ? z[j] : 0;
          break;
        }
        for (let j = 0; j < n; j++) x[j] += alpha * ((inSet[j] ? z[j] : 0) - x[j]);
        for (const j of kept) if (j >= nFree && x[j] <= 1e-14) {
          inSet[j] = 0;
          x[j] = 0;
        }
      }
    }
  }
  let explained = 0;
  for (let j = 0; j < n; j++) explained += b[j] * x[j];
  return explained;
}
