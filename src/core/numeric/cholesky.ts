/**
 * Small dense symmetric positive-definite solves (Cholesky, Golub & Van Loan
 * 2013, sec. 4.2): the subset solve of the fit's normal equations, and the
 * factor / solve / inverse the line fits use for their covariance.
 * Works in place on caller-owned buffers so hot loops allocate nothing.
 */

/** Relative pivot below which a variable is degenerate (dropped by the caller). */
export const PIVOT_TOL = 1e-12;

/**
 * Solve M x = b for the variables listed in idx (ascending; the others fixed at 0).
 * M: n x n row-major symmetric; L: scratch of n*n; x: out (length n, zeroed
 * outside idx). Returns x . b restricted to idx (the chi-square explained), or
 * NaN when M restricted to idx is not positive definite.
 */
export function choleskySolveSubset(M: Float64Array, b: Float64Array, n: number, idx: ArrayLike<number>, m: number, x: Float64Array, L: Float64Array): number {
  for (let p = 0; p < m; p++) {
    const ip = idx[p];
    for (let q = 0; q <= p; q++) {
      let s = M[ip * n + idx[q]];
      for (let k = 0; k < q; k++) s -= L[p * n + k] * L[q * n + k];
      if (p === q) {
        if (!(s > PIVOT_TOL * Math.abs(M[ip * n + ip]))) return NaN;
        L[p * n + p] = Math.sqrt(s);
      } else L[p * n + q] = s / L[q * n + q];
    }
  }
  // forward: L y = b ; back: L^T x = y (y stored in x's first m slots, then scattered)
  const y = x;
  for (let p = 0; p < m; p++) {
    let s = b[idx[p]];
    for (let k = 0; k < p; k++) s -= L[p * n + k] * y[k];
    y[p] = s / L[p * n + p];
  }
  for (let p = m - 1; p >= 0; p--) {
    let s = y[p];
    for (let k = p + 1; k < m; k++) s -= L[k * n + p] * y[k];
    y[p] = s / L[p * n + p];
  }
  // scatter from compact to full positions, highest index first (idx ascending)
  let explained = 0;
  for (let p = m - 1; p >= 0; p--) {
    const v = y[p];
    const ip = idx[p];
    explained += v * b[ip];
    x[ip] = v;
    // zero the gap between this and the previous listed index
    const prev = p > 0 ? idx[p - 1] : -1;
    for (let j = ip - 1; j > prev; j--) x[j] = 0;
  }
  for (let j = (m > 0 ? idx[m - 1] : -1) + 1; j < n; j++) x[j] = 0;
  return explained;
}

/** Solve the full system (every variable free). */
export function choleskySolve(M: Float64Array, b: Float64Array, n: number, x: Float64Array, L: Float64Array, idx: Int32Array): number {
  for (let i = 0; i < n; i++) idx[i] = i;
  return choleskySolveSubset(M, b, n, idx, n, x, L);
}

/**
 * In-place Cholesky factorisation of a symmetric positive-definite n x n matrix
 * (row-major); returns false when it is not positive definite.
 */
export function choleskyFactor(a: Float64Array, n: number): boolean {
  for (let j = 0; j < n; j++) {
    let d = a[j * n + j];
    for (let k = 0; k < j; k++) d -= a[j * n + k] * a[j * n + k];
    if (!(d > 0) || !Number.isFinite(d)) return false;
    const ljj = Math.sqrt(d);
    a[j * n + j] = ljj;
    for (let i = j + 1; i < n; i++) {
      let s = a[i * n + j];
      for (let k = 0; k < j; k++) s -= a[i * n + k] * a[j * n + k];
      a[i * n + j] = s / ljj;
    }
  }
  return true;
}

/** Solve L L^T x = b with the factor from choleskyFactor(), into x (may be b itself). */
export function choleskyFactorSolve(l: Float64Array, n: number, b: ArrayLike<number>, x: Float64Array): Float64Array {
  for (let i = 0; i < n; i++) {
    let s = b[i];
    for (let k = 0; k < i; k++) s -= l[i * n + k] * x[k];
    x[i] = s / l[i * n + i];
  }
  for (let i = n - 1; i >= 0; i--) {
    let s = x[i];
    for (let k = i + 1; k < n; k++) s -= l[k * n + i] * x[k];
    x[i] = s / l[i * n + i];
  }
  return x;
}

/**
 * Symmetric matrix inverse into `out`, or false when not positive definite.
 * The matrix is first equilibrated by its diagonal so that parameters of very
 * different scale (Angstrom, flux) do not spoil the factorisation.
 */
export function inverseSpdInto(m: Float64Array, n: number, out: Float64Array, work: Float64Array, d: Float64Array, e: Float64Array, col: Float64Array): boolean {
  for (let i = 0; i < n; i++) {
    if (!(m[i * n + i] > 0)) return false;
    d[i] = 1 / Math.sqrt(m[i * n + i]);
  }
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) work[i * n + j] = m[i * n + j] * d[i] * d[j];
  if (!choleskyFactor(work, n)) return false;
  for (let j = 0; j < n; j++) {
    e.fill(0);
    e[j] = 1;
    choleskyFactorSolve(work, n, e, col);
    for (let i = 0; i < n; i++) out[i * n + j] = col[i] * d[i] * d[j];
  }
  return true;
}

export function inverseSpd(m: Float64Array, n: number): Float64Array | null {
  const out = new Float64Array(n * n);
  return inverseSpdInto(m, n, out, new Float64Array(n * n), new Float64Array(n), new Float64Array(n), new Float64Array(n)) ? out : null;
}
