import { describe, expect, it } from 'vitest';
import { choleskySolve, choleskySolveSubset, median, nmad, symmetricEigen } from '../../../src/core/numeric';

describe('choleskySolve(M, b, n, x, L, idx)', () => {
  it('solves the weighted least-squares example of docs/reference.md sec. 5 (computed check values)', () => {
    // f = (1,3,2), t = (1,2,3), sigma = (1,1,2): a = 1.1724137931, sigma_a = 0.3713906764
    const f = [1, 3, 2], t = [1, 2, 3], w = [1, 1, 0.25];
    const M = Float64Array.of(t.reduce((s, ti, i) => s + w[i] * ti * ti, 0));
    const b = Float64Array.of(t.reduce((s, ti, i) => s + w[i] * ti * f[i], 0));
    const x = new Float64Array(1);
    choleskySolve(M, b, 1, x, new Float64Array(1), new Int32Array(1));
    expect(x[0]).toBeCloseTo(1.1724137931, 9);
    expect(1 / Math.sqrt(M[0])).toBeCloseTo(0.3713906764, 9);
  });
  it('matches a hand-checked 3 x 3 system and leaves unlisted variables at 0', () => {
    // M = [[4,2,0],[2,3,1],[0,1,2]], x = (1,-1,2) -> b = M x = (2, 1, 3)
    const M = Float64Array.of(4, 2, 0, 2, 3, 1, 0, 1, 2);
    const x = new Float64Array(3);
    choleskySolve(M, Float64Array.of(2, 1, 3), 3, x, new Float64Array(9), new Int32Array(3));
    expect([...x].map((v) => +v.toFixed(12))).toEqual([1, -1, 2]);
    // variables 0 and 2 only: [[4,0],[0,2]] y = (2, 3) -> (0.5, 0, 1.5)
    choleskySolveSubset(M, Float64Array.of(2, 1, 3), 3, Int32Array.of(0, 2), 2, x, new Float64Array(9));
    expect([...x].map((v) => +v.toFixed(12))).toEqual([0.5, 0, 1.5]);
  });
  it('returns NaN for a singular system', () => {
    const x = new Float64Array(2);
    expect(choleskySolve(Float64Array.of(1, 1, 1, 1), Float64Array.of(1, 1), 2, x, new Float64Array(4), new Int32Array(2))).toBeNaN();
  });
});

describe('symmetricEigen(a, n)', () => {
  it('finds the eigenvalues of [[2,1],[1,2]] (3 and 1) and of a 3 x 3 with known spectrum', () => {
    const e = symmetricEigen(Float64Array.of(2, 1, 1, 2), 2);
    expect(e.values[0]).toBeCloseTo(3, 12);
    expect(e.values[1]).toBeCloseTo(1, 12);
    expect(Math.abs(e.vectors[0][0])).toBeCloseTo(Math.SQRT1_2, 12);
    // [[2,-1,0],[-1,2,-1],[0,-1,2]]: eigenvalues 2 + sqrt(2), 2, 2 - sqrt(2) (tridiagonal Toeplitz, closed form 2 - 2 cos(k pi / 4))
    const t = symmetricEigen(Float64Array.of(2, -1, 0, -1, 2, -1, 0, -1, 2), 3);
    expect([...t.values].map((v) => +v.toFixed(10))).toEqual([2 + Math.SQRT2, 2, 2 - Math.SQRT2].map((v) => +v.toFixed(10)));
  });
});

describe('median and nmad', () => {
  it('agree with sorting, ignore non-finite values, and scale the MAD by 1.4826 (common practice)', () => {
    expect(median([5, 1, 4, 2, 3])).toBe(3);
    expect(median([4, 1, 3, 2])).toBe(2.5);
    expect(median([1, NaN, 3])).toBe(2);
    expect(nmad([1, 2, 3, 4, 100])).toBeCloseTo(1.4826, 10);
  });
});

describe('segmentIndex and interpLinear', () => {
  it('find the segment and interpolate linearly (exact for a straight line), NaN outside the table', async () => {
    const { segmentIndex, interpLinear } = await import('../../../src/core/numeric');
    const xs = [1, 2, 4, 8];
    expect(segmentIndex(xs, 3)).toBe(1);
    expect(segmentIndex(xs, 8)).toBe(2);
    expect(interpLinear(xs, xs.map((x) => 3 * x + 1), 5.5)).toBeCloseTo(17.5, 12);
    expect(interpLinear(xs, xs, 0.5)).toBeNaN();
  });
});
