/**
 * The continuum polynomial in the observed frame, made orthonormal under the
 * data's weights (polynomials of the pixel index scaled to [-1, 1]). With an
 * orthonormal basis the polynomial drops out of
 * every per-shift solve as a fixed projection (kernels/shiftSolve.ts).
 */

/**
 * P polynomials q_a of degree a in x (the pixel index scaled to [-1, 1])
 * with sum_i w_i q_a(i) q_b(i) = delta_ab, by the three-term recurrence of
 * orthogonal polynomials (Stieltjes procedure; Gautschi 2004, Orthogonal
 * Polynomials: Computation and Approximation, sec. 2.2.3):
 *   v = x q_k - a_k q_k - b_k q_(k-1),  a_k = <x q_k, q_k>,  b_k = |v_(k-1)|,
 *   q_(k+1) = v / |v|.
 * These are the polynomials Gram-Schmidt gives from 1, x, x^2, ... (unique
 * up to sign; here the leading coefficient is positive), in three passes
 * over the pixels per term instead of one per pair of terms. A term whose
 * norm falls below 1e-10 of |x q_k| is degenerate under the weights (too few
 * good pixels for that degree) and ends the list, so fewer than P may come
 * back.
 */
export function weightedOrthonormalPolys(w: Float64Array, P: number): Float64Array[] {
  const n = w.length;
  const out: Float64Array[] = [];
  if (P < 1) return out;
  const x = new Float64Array(n);
  for (let i = 0; i < n; i++) x[i] = n > 1 ? (2 * i) / (n - 1) - 1 : 0;
  let sw = 0;
  for (let i = 0; i < n; i++) sw += w[i];
  if (!(sw > 0)) return out;
  const q0 = new Float64Array(n).fill(1 / Math.sqrt(sw));
  out.push(q0);
  let bPrev = 0;
  for (let k = 0; k + 1 < P; k++) {
    const qk = out[k];
    const qm = k > 0 ? out[k - 1] : null;
    let a = 0;
    let xq2 = 0;
    for (let i = 0; i < n; i++) {
      const t = x[i] * qk[i];
      a += w[i] * t * qk[i];
      xq2 += w[i] * t * t;
    }
    const v = new Float64Array(n);
    let nn = 0;
    for (let i = 0; i < n; i++) {
      const vi = (x[i] - a) * qk[i] - (qm ? bPrev * qm[i] : 0);
      v[i] = vi;
      nn += w[i] * vi * vi;
    }
    if (!(nn > 1e-10 * xq2)) break;
    const norm = Math.sqrt(nn);
    const inv = 1 / norm;
    for (let i = 0; i < n; i++) v[i] *= inv;
    out.push(v);
    bPrev = norm;
  }
  return out;
}
