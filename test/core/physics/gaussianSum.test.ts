import { describe, expect, it } from 'vitest';
import { fitGaussSum, gaussSumAt, type GaussSumModel } from '../../../src/core/physics/gaussianSum';

/**
 * Recovery on constructed data: the profile is built from known parameters
 * (no noise), so the fit must give them back; the check values are the
 * construction's own inputs.
 */
const model: GaussSumModel = {
  // A broad line at 4862.68 A and a narrow one at 5008.24 A (free amplitudes, shifts and widths).
  components: [
    { restA: 4862.68, amp: 0, ampFactor: 1, vel: 1, sig: 2, broad: true },
    { restA: 5008.24, amp: 3, ampFactor: 1, vel: 4, sig: 5, broad: false },
  ],
  lower: [0, -3000, 500, 0, -1000, 30],
  upper: [100, 3000, 9000, 100, 1000, 500],
};

function grid(): Float64Array {
  return Float64Array.from({ length: 500 }, (_, i) => 4700 + i * 0.8);
}

describe('fitGaussSum (Levenberg-Marquardt with bounds)', () => {
  it('gives back the parameters a noiseless profile was built from', () => {
    const truth = [5, 300, 2100, 8, -50, 150];
    const x = grid();
    const y = Float64Array.from(x, (v) => gaussSumAt(model, truth, v));
    const w = new Float64Array(x.length).fill(1e4);
    const fit = fitGaussSum(model, [3, 0, 1500, 4, 0, 200], x, y, w);
    expect(fit.ok).toBe(true);
    fit.params.forEach((p, k) => expect(p).toBeCloseTo(truth[k], 2));
  });
  it('a line the data do not hold goes to zero amplitude, and the rest keep a finite covariance', () => {
    const truth = [5, 300, 2100, 0, 0, 150];
    const x = grid();
    const y = Float64Array.from(x, (v) => gaussSumAt(model, truth, v));
    const w = new Float64Array(x.length).fill(1e4);
    const fit = fitGaussSum(model, [3, 0, 1500, 2, 0, 200], x, y, w);
    expect(fit.params[3]).toBeCloseTo(0, 6);
    for (const k of [0, 1, 2]) expect(Number.isFinite(fit.covariance[k * 6 + k]) && fit.covariance[k * 6 + k] > 0).toBe(true);
    expect(fit.params[2]).toBeCloseTo(2100, 2);
  });
  it('refuses wavelengths that do not increase, saying so', () => {
    const x = grid().reverse();
    const fit = fitGaussSum(model, [3, 0, 1500, 4, 0, 200], x, new Float64Array(x.length), new Float64Array(x.length).fill(1));
    expect(fit).toMatchObject({ ok: false, reason: 'line-fit wavelengths are not increasing' });
  });
});
