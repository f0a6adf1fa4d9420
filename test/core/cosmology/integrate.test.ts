import { describe, expect, it } from 'vitest';
import { integrate } from '../../../src/core/cosmology/integrate';

describe('integrate(f, a, b, relTol)', () => {
  it('integrates sin over [0, pi] to 2 (exact)', () => {
    expect(Math.abs(integrate(Math.sin, 0, Math.PI) - 2)).toBeLessThan(1e-10);
  });
  it('handles an infinite slope at the end point: Int_0^1 sqrt(x) dx = 2/3 (exact)', () => {
    expect(Math.abs(integrate(Math.sqrt, 0, 1) - 2 / 3)).toBeLessThan(1e-9);
  });
  it('is signed: reversing the limits flips the sign, equal limits give 0', () => {
    const f = (x: number) => Math.exp(-x * x);
    expect(integrate(f, 2, -1)).toBeCloseTo(-integrate(f, -1, 2), 12);
    expect(integrate(f, 1, 1)).toBe(0);
  });
  it('finds a narrow peak a single Simpson panel would miss: Int exp(-((x-0.3)/0.01)^2) = 0.01 sqrt(pi)', () => {
    const f = (x: number) => Math.exp(-(((x - 0.3) / 0.01) ** 2));
    expect(Math.abs(integrate(f, 0, 1) / (0.01 * Math.sqrt(Math.PI)) - 1)).toBeLessThan(1e-9);
  });
  it('agrees with a plain 1e6-panel midpoint sum for a smooth cosmology-like integrand', () => {
    const f = (z: number) => 1 / Math.sqrt(0.3 * (1 + z) ** 3 + 0.7);
    const n = 1_000_000;
    const h = 3 / n;
    let s = 0;
    for (let i = 0; i < n; i++) s += f((i + 0.5) * h);
    expect(Math.abs(integrate(f, 0, 3) / (s * h) - 1)).toBeLessThan(1e-10);
  });
  it('throws instead of returning a number for a non-finite integrand', () => {
    expect(() => integrate(() => NaN, 0, 1)).toThrow(RangeError);
    expect(() => integrate((x) => (x > 0.5 ? Infinity : 1), 0, 1)).toThrow(RangeError);
  });
});
