import { describe, expect, it } from 'vitest';
import { parabolaVertex } from '../../../src/core/engine/parabola';

describe('parabolaVertex(x, h, c-, c0, c+)', () => {
  it('reproduces the reference-sheet example (sec. 5)', () => {
    // chi2(z) = 100 + ((z - 0.50023)/0.0004)^2 at 0.499/0.500/0.501 -> z0 = 0.50023, d2 = 1.25e7, sigma = 0.0004 [C]
    const v = parabolaVertex(0.5, 0.001, 109.455625, 100.330625, 103.705625);
    expect(v.x0).toBeCloseTo(0.50023, 10);
    expect(v.d2 / 1.25e7).toBeCloseTo(1, 10);
    expect(v.sigma).toBeCloseTo(0.0004, 12);
    expect(v.chi2).toBeCloseTo(100, 9);
  });

  it('reports no minimum (NaN sigma) for a flat or concave triple', () => {
    expect(Number.isNaN(parabolaVertex(0, 1, 1, 1, 1).sigma)).toBe(true);
    expect(Number.isNaN(parabolaVertex(0, 1, 0, 1, 0).sigma)).toBe(true);
  });
});
