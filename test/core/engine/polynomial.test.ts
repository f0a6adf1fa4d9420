import { describe, expect, it } from 'vitest';
import { weightedOrthonormalPolys } from '../../../src/core/engine/polynomial';

/** Legendre P_0..P_(P-1) over n pixels, x = index scaled to [-1, 1] (Bonnet's recursion, common practice): the reference span. */
function polyBasis(n: number, P: number): Float64Array[] {
  const out: Float64Array[] = [];
  for (let a = 0; a < P; a++) {
    out.push(Float64Array.from({ length: n }, (_, i) => {
      const x = n > 1 ? (2 * i) / (n - 1) - 1 : 0;
      let p0 = 1;
      let p1 = x;
      if (a === 0) return 1;
      for (let k = 2; k <= a; k++) [p0, p1] = [p1, ((2 * k - 1) * x * p1 - (k - 1) * p0) / k];
      return p1;
    }));
  }
  return out;
}
import { mulberry32 } from '../../../src/core/sim/prng';

describe('weightedOrthonormalPolys', () => {
  it('is orthonormal under w and spans the Legendre basis, for random weights with a gap', () => {
    const rnd = mulberry32(5);
    const n = 3000;
    const w = Float64Array.from({ length: n }, (_, i) => (i > 1200 && i < 1500 ? 0 : 0.2 + rnd() * 3));
    const q = weightedOrthonormalPolys(w, 5);
    const raw = polyBasis(n, 5);
    expect(q.length).toBe(5);
    // span: each Legendre polynomial is its own projection on the q's, P_a = sum_b <P_a, q_b>_w q_b
    for (const p of raw) {
      const c = q.map((qb) => p.reduce((s, x, i) => s + w[i] * x * qb[i], 0));
      for (let i = 0; i < n; i += 37) expect(Math.abs(q.reduce((s, qb, b) => s + c[b] * qb[i], 0) - p[i])).toBeLessThan(1e-9);
    }
    for (let a = 0; a < 5; a++) {
      for (let b = 0; b <= a; b++) {
        let s = 0;
        for (let i = 0; i < n; i++) s += w[i] * q[a][i] * q[b][i];
        expect(Math.abs(s - (a === b ? 1 : 0))).toBeLessThan(1e-10);
      }
    }
  });

  it('drops the terms the weights cannot support (three good pixels support three terms)', () => {
    const n = 100;
    const w = new Float64Array(n);
    w[10] = 1;
    w[50] = 2;
    w[90] = 1;
    expect(weightedOrthonormalPolys(w, 5).length).toBe(3);
  });
});

describe('weightedOrthonormalPolys against modified Gram-Schmidt', () => {
  it('gives the Gram-Schmidt polynomials of 1, x, x^2, ... (unique with positive leading coefficients)', () => {
    // reference: modified Gram-Schmidt of the Legendre basis (Golub & Van Loan, Matrix Computations, alg. 5.2.6), written plainly
    const n = 1500;
    const w = Float64Array.from({ length: n }, (_, i) => (i % 50 < 3 ? 0 : 1 + Math.sin(i / 37) ** 2));
    const ref: Float64Array[] = [];
    for (const v of polyBasis(n, 5)) {
      const u = Float64Array.from(v);
      for (const q of ref) {
        const d = u.reduce((s, x, i) => s + w[i] * x * q[i], 0);
        for (let i = 0; i < n; i++) u[i] -= d * q[i];
      }
      const nn = Math.sqrt(u.reduce((s, x, i) => s + w[i] * x * x, 0));
      ref.push(u.map((x) => x / nn));
    }
    const q = weightedOrthonormalPolys(w, 5);
    for (let a = 0; a < 5; a++) for (let i = 0; i < n; i += 11) expect(Math.abs(q[a][i] - ref[a][i])).toBeLessThan(1e-10);
  });
});
