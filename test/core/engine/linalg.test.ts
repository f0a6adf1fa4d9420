import { describe, expect, it } from 'vitest';
import { makeNnlsWork, nnlsNormal } from '../../../src/core/engine/linalg';

/** Build normal equations from a design matrix (columns) and data with weights. */
function normal(cols: number[][], f: number[], w: number[]) {
  const n = cols.length;
  const M = new Float64Array(n * n);
  const b = new Float64Array(n);
  let fwf = 0;
  for (let i = 0; i < f.length; i++) {
    fwf += w[i] * f[i] * f[i];
    for (let a = 0; a < n; a++) {
      b[a] += w[i] * f[i] * cols[a][i];
      for (let c = 0; c < n; c++) M[a * n + c] += w[i] * cols[a][i] * cols[c][i];
    }
  }
  return { M, b, fwf, n };
}

describe('nnlsNormal', () => {
  it('reproduces the one-template example of the reference sheet (sec. 5)', () => {
    // f = (1,3,2), t = (1,2,3), sigma = (1,1,2): a = 1.1724137931, chi2 = 1.0344827586, sigma_a = 0.3713906764 [C]
    const { M, b, fwf, n } = normal([[1, 2, 3]], [1, 3, 2], [1, 1, 0.25]);
    const x = new Float64Array(1);
    const explained = nnlsNormal(M, b, n, 0, () => true, x, makeNnlsWork(n));
    expect(x[0]).toBeCloseTo(1.1724137931, 9);
    expect(fwf - explained).toBeCloseTo(1.0344827586, 9);
    expect(1 / Math.sqrt(M[0])).toBeCloseTo(0.3713906764, 9);
  });

  it('f = 2t exactly gives a = 2 and chi2 = 0 (reference sheet sec. 5)', () => {
    const { M, b, fwf, n } = normal([[1, 2, 3]], [2, 4, 6], [1, 1, 0.25]);
    const x = new Float64Array(1);
    const explained = nnlsNormal(M, b, n, 0, () => true, x, makeNnlsWork(n));
    expect(x[0]).toBeCloseTo(2, 12);
    expect(fwf - explained).toBeCloseTo(0, 10);
  });

  it('keeps constrained amplitudes non-negative and matches a brute-force search over active sets', () => {
    // an "emission" column that the data show inverted: unconstrained amplitude is negative
    const N = 40;
    const poly = Array.from({ length: N }, () => 1);
    const line = Array.from({ length: N }, (_, i) => Math.exp(-0.5 * ((i - 20) / 2) ** 2));
    const other = Array.from({ length: N }, (_, i) => Math.exp(-0.5 * ((i - 8) / 2) ** 2));
    const f = Array.from({ length: N }, (_, i) => 5 - 2 * line[i] + 1.5 * other[i] + 0.01 * Math.sin(i));
    const w = Array.from({ length: N }, () => 1);
    const { M, b, fwf, n } = normal([poly, line, other], f, w);
    const x = new Float64Array(n);
    const chi2 = fwf - nnlsNormal(M, b, n, 1, () => true, x, makeNnlsWork(n));
    expect(x[1]).toBe(0);
    expect(x[2]).toBeGreaterThan(1.4);
    // brute force: best chi2 over subsets {poly}+S with S's solution feasible (Lawson & Hanson 1974)
    let best = Infinity;
    for (const set of [[0], [0, 1], [0, 2], [0, 1, 2]]) {
      const cols = set.map((j) => [poly, line, other][j]);
      const sub = normal(cols, f, w);
      const xs = new Float64Array(sub.n);
      const c = sub.fwf - nnlsNormal(sub.M, sub.b, sub.n, sub.n, () => true, xs, makeNnlsWork(sub.n));
      if (xs.every((v, k) => set[k] === 0 || v >= 0)) best = Math.min(best, c);
    }
    expect(chi2).toBeCloseTo(best, 9);
  });

  it('treats an unusable or degenerate column as absent', () => {
    const { M, b, n } = normal([[1, 1, 1], [0, 0, 0]], [1, 2, 3], [1, 1, 1]);
    const x = new Float64Array(n);
    nnlsNormal(M, b, n, 1, () => true, x, makeNnlsWork(n));
    expect(x[0]).toBeCloseTo(2, 12);
    expect(x[1]).toBe(0);
  });
});
