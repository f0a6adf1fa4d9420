/**
 * The continuum polynomial in the observed frame, made orthonormal under the
 * data's weights (Gram-Schmidt on Legendre polynomials of the pixel index
 * scaled to [-1, 1]). With an orthonormal basis the polynomial drops out of
 * every per-shift solve as a fixed projection (kernels/shiftSolve.ts).
 */

/** Plain Legendre basis P_0..P_{P-1} over n pixels, x = pixel index scaled to [-1, 1] (Bonnet's recursion, one polynomial at a time). */
export function polyBasis(n: number, P: number): Float64Array[] {
  const basis: Float64Array[] = [];
  const x = new Float64Array(n);
  for (let i = 0; i < n; i++) x[i] = n > 1 ? (2 * i) / (n - 1) - 1 : 0;
  for (let a = 0; a < P; a++) {
    const out = new Float64Array(n);
    if (a === 0) out.fill(1);
    else if (a === 1) out.set(x);
    else {
      const p1 = basis[a - 1];
      const p2 = basis[a - 2];
      for (let i = 0; i < n; i++) out[i] = ((2 * a - 1) * x[i] * p1[i] - (a - 1) * p2[i]) / a;
    }
    basis.push(out);
  }
  return basis;
}

/**
 * P polynomials q_a with sum_i w_i q_a(i) q_b(i) = delta_ab (modified
 * Gram-Schmidt). Terms that are degenerate under the weights (too few good
 * pixels) are dropped, so fewer than P may come back.
 */
export function weightedOrthonormalPolys(w: Float64Array, P: number, raw: Float64Array[] = polyBasis(w.length, P)): Float64Array[] {
  const out: Float64Array[] = [];
  const n = w.length;
  // Weights are >= 0 and the polynomials finite, so pixels with w = 0 add
  // exact zeros: the sums run over every pixel without a branch.
  for (const v of raw.slice(0, P)) {
    const u = Float64Array.from(v);
    for (const q of out) {
      let d = 0;
      for (let i = 0; i < n; i++) d += w[i] * u[i] * q[i];
      for (let i = 0; i < n; i++) u[i] -= d * q[i];
    }
    let nn = 0;
    let raw2 = 0;
    for (let i = 0; i < n; i++) {
      const wi = w[i];
      nn += wi * u[i] * u[i];
      raw2 += wi * v[i] * v[i];
    }
    if (!(nn > 1e-10 * raw2)) continue;
    const s = 1 / Math.sqrt(nn);
    for (let i = 0; i < u.length; i++) u[i] *= s;
    out.push(u);
  }
  return out;
}
