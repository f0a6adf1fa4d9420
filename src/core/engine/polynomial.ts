/**
 * The continuum polynomial in the observed frame, made orthonormal under the
 * data's weights (Gram-Schmidt on Legendre polynomials of the pixel index
 * scaled to [-1, 1]). With an orthonormal basis the polynomial drops out of
 * every per-shift solve as a fixed projection (kernels/shiftSolve.ts).
 */

/** Legendre P_0..P_{P-1} at x in [-1, 1] (Bonnet's recursion). */
function legendre(P: number, x: number, out: Float64Array): void {
  if (P > 0) out[0] = 1;
  if (P > 1) out[1] = x;
  for (let a = 2; a < P; a++) out[a] = ((2 * a - 1) * x * out[a - 1] - (a - 1) * out[a - 2]) / a;
}

/** Plain Legendre basis over n pixels. */
export function polyBasis(n: number, P: number): Float64Array[] {
  const basis = Array.from({ length: P }, () => new Float64Array(n));
  const tmp = new Float64Array(P);
  for (let i = 0; i < n; i++) {
    legendre(P, n > 1 ? (2 * i) / (n - 1) - 1 : 0, tmp);
    for (let a = 0; a < P; a++) basis[a][i] = tmp[a];
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
  for (const v of raw.slice(0, P)) {
    const u = Float64Array.from(v);
    for (const q of out) {
      let d = 0;
      for (let i = 0; i < n; i++) if (w[i] > 0) d += w[i] * u[i] * q[i];
      for (let i = 0; i < n; i++) u[i] -= d * q[i];
    }
    let nn = 0;
    let raw2 = 0;
    for (let i = 0; i < n; i++) {
      const wi = w[i];
      if (!(wi > 0)) continue;
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
