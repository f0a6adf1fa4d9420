import { describe, expect, it } from 'vitest';
import { polyBasis, weightedOrthonormalPolys } from '../../../src/core/engine/polynomial';
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
