/**
 * Eigen-decomposition of a small real symmetric matrix by cyclic Jacobi
 * rotations (Golub & Van Loan 2013, Matrix Computations, sec. 8.5). Used at
 * template-build time (eigenspectra from a few hundred spectra), never per fit.
 */

export interface SymmetricEigen {
  /** Eigenvalues, largest first. */
  values: Float64Array;
  /** vectors[i] is the unit eigenvector of values[i]. */
  vectors: Float64Array[];
}

/** a: n x n row-major symmetric matrix (not modified). */
export function symmetricEigen(a: Float64Array, n: number, maxSweeps = 100): SymmetricEigen {
  const m = Float64Array.from(a);
  const v = new Float64Array(n * n);
  for (let i = 0; i < n; i++) v[i * n + i] = 1;
  for (let sweep = 0; sweep < maxSweeps; sweep++) {
    let off = 0;
    let diag = 0;
    for (let p = 0; p < n; p++) {
      diag += m[p * n + p] * m[p * n + p];
      for (let q = p + 1; q < n; q++) off += m[p * n + q] * m[p * n + q];
    }
    if (off <= 1e-30 * diag || off === 0) break;
    for (let p = 0; p < n; p++) {
      for (let q = p + 1; q < n; q++) {
        const apq = m[p * n + q];
        if (apq === 0) continue;
        const theta = (m[q * n + q] - m[p * n + p]) / (2 * apq);
        const t = Math.sign(theta || 1) / (Math.abs(theta) + Math.sqrt(theta * theta + 1));
        const c = 1 / Math.sqrt(t * t + 1);
        const s = t * c;
        for (let k = 0; k < n; k++) {
          const akp = m[k * n + p];
          const akq = m[k * n + q];
          m[k * n + p] = c * akp - s * akq;
          m[k * n + q] = s * akp + c * akq;
        }
        for (let k = 0; k < n; k++) {
          const apk = m[p * n + k];
          const aqk = m[q * n + k];
          m[p * n + k] = c * apk - s * aqk;
          m[q * n + k] = s * apk + c * aqk;
        }
        for (let k = 0; k < n; k++) {
          const vkp = v[k * n + p];
          const vkq = v[k * n + q];
          v[k * n + p] = c * vkp - s * vkq;
          v[k * n + q] = s * vkp + c * vkq;
        }
      }
    }
  }
  const order = Array.from({ length: n }, (_, i) => i).sort((i, j) => m[j * n + j] - m[i * n + i]);
  return {
    values: Float64Array.from(order, (i) => m[i * n + i]),
    vectors: order.map((i) => Float64Array.from({ length: n }, (_, k) => v[k * n + i])),
  };
}
