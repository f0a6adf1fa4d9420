import { describe, expect, it } from 'vitest';
import { correlationSums, type ScanData } from '../../../src/core/engine/kernels/correlationSums';
import { makeShiftSolver, solveShift } from '../../../src/core/engine/kernels/shiftSolve';
import { directSums } from '../../../src/core/engine/reference/directSums';
import { FitWorkspace } from '../../../src/core/engine/workspace';
import { mulberry32 } from '../../../src/core/sim/prng';

function randomCase(seed: number, nD: number, nT: number, P: number) {
  const r = mulberry32(seed);
  const w = Float64Array.from({ length: nD }, () => (r() < 0.1 ? 0 : r()));
  const f = Float64Array.from({ length: nD }, () => r() - 0.5);
  const data: ScanData = {
    d0: 5000,
    w,
    wf: w.map((x, i) => x * f[i]),
    wq: Array.from({ length: P }, (_, a) => w.map((x, i) => x * Math.cos((a * i) / nD))),
  };
  const vectors = [0, 1, 2].map(() => Float64Array.from({ length: nT }, () => r() - 0.3));
  return { data, vectors };
}

describe('correlationSums (FFT) equals directSums (plain loops)', () => {
  const cases = [
    { name: 'template longer than the data, shifts both ways', nD: 300, nT: 900, kStart: 4700, sLo: -100, sHi: 400 },
    { name: 'template shorter than the data', nD: 500, nT: 120, kStart: 5100, sLo: -50, sHi: 300 },
    { name: 'a few shifts only', nD: 257, nT: 400, kStart: 4900, sLo: 3, sHi: 7 },
    { name: 'shifts where nothing overlaps at one end', nD: 200, nT: 100, kStart: 5000, sLo: -400, sHi: 50 },
  ];
  for (const c of cases) {
    it(c.name, () => {
      const { data, vectors } = randomCase(c.nD + c.nT, c.nD, c.nT, 3);
      const fast = correlationSums(new FitWorkspace(), 'test', vectors, c.kStart, data, c.sLo, c.sHi);
      const slow = directSums(vectors, c.kStart, data, c.sLo, c.sHi);
      let maxErr = 0;
      let scale = 0;
      for (const [A, B] of [[fast.tt, slow.tt], [fast.tf, slow.tf], [fast.tq, slow.tq]] as const) {
        for (let q = 0; q < A.length; q++) {
          for (let s = 0; s < fast.nShift; s++) {
            maxErr = Math.max(maxErr, Math.abs(A[q][s] - B[q][s]));
            scale = Math.max(scale, Math.abs(B[q][s]));
          }
        }
      }
      expect(scale).toBeGreaterThan(0);
      expect(maxErr / scale).toBeLessThan(1e-10);
    });
  }
  it('reuses the template transforms of the workspace on the next spectrum with the same window', () => {
    const ws = new FitWorkspace();
    const a = randomCase(1, 300, 600, 2);
    const b = randomCase(2, 300, 600, 2);
    correlationSums(ws, 'fam', a.vectors, 4800, a.data, 0, 200);
    const fast = correlationSums(ws, 'fam', a.vectors, 4800, b.data, 0, 200);
    const slow = directSums(a.vectors, 4800, b.data, 0, 200);
    expect(fast.tf[1][77]).toBeCloseTo(slow.tf[1][77], 9);
  });
});

describe('solveShift(solver, g, F, nonNegative)', () => {
  it('gives the chi2 of the docs/reference.md sec. 5 example with no polynomial (computed check values)', () => {
    // f = (1,3,2), t = (1,2,3), sigma = (1,1,2): chi2_min = 1.0344827586
    const w = [1, 1, 0.25], f = [1, 3, 2], t = [1, 2, 3];
    const s = makeShiftSolver(1, 0);
    s.tt[0] = w.reduce((a, wi, i) => a + wi * t[i] * t[i], 0);
    s.tf[0] = w.reduce((a, wi, i) => a + wi * t[i] * f[i], 0);
    const F = w.reduce((a, wi, i) => a + wi * f[i] * f[i], 0);
    expect(solveShift(s, new Float64Array(0), F, [false])).toBeCloseTo(1.0344827586, 9);
    expect(s.a[0]).toBeCloseTo(1.1724137931, 9);
  });
  it('drops a non-negative amplitude that comes out negative and re-solves', () => {
    // two orthonormal vectors, data = 2 v1 - 1 v2: with v2 >= 0 the best is a = (2, 0), chi2 = F - 4 = 1
    const s = makeShiftSolver(2, 0);
    s.tt.set([1, 0, 0, 1]);
    s.tf.set([2, -1]);
    expect(solveShift(s, new Float64Array(0), 5, [false, true])).toBeCloseTo(1, 12);
    expect([...s.a]).toEqual([2, 0]);
    expect(s.used).toBe(1);
    expect(solveShift(s, new Float64Array(0), 5, [false, false])).toBeCloseTo(0, 12);
  });
});

