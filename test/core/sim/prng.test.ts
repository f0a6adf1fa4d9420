import { describe, it, expect } from 'vitest';
import { createRng, mulberry32, mixSeed } from '../../../src/core/sim/prng';

describe('prng', () => {
  it('createRng(seed) gives the same sequence for the same seed', () => {
    const a = createRng(12345);
    const b = createRng(12345);
    for (let i = 0; i < 1000; i++) {
      expect(a.next()).toBe(b.next());
      expect(a.gaussian()).toBe(b.gaussian());
    }
  });

  it('different seeds give different sequences', () => {
    const a = mulberry32(1);
    const b = mulberry32(2);
    let same = 0;
    for (let i = 0; i < 100; i++) if (a() === b()) same++;
    expect(same).toBe(0);
  });

  it('uniform deviates lie in [0, 1) with mean 1/2 and variance 1/12', () => {
    const r = createRng(7);
    const n = 200_000;
    let s = 0;
    let s2 = 0;
    let outside = 0;
    for (let i = 0; i < n; i++) {
      const u = r.next();
      if (!(u >= 0 && u < 1)) outside++;
      s += u;
      s2 += u * u;
    }
    expect(outside).toBe(0);
    const mean = s / n;
    // Standard error of the mean: sqrt(1/12 / n) = 6.5e-4; allow 5 sigma.
    expect(Math.abs(mean - 0.5)).toBeLessThan(0.0033);
    expect(Math.abs(s2 / n - mean * mean - 1 / 12)).toBeLessThan(0.002);
  });

  it('gaussian() has mean 0, variance 1 and the normal 1-sigma fraction 0.6827', () => {
    const r = createRng(99);
    const n = 200_000;
    let s = 0;
    let s2 = 0;
    let within = 0;
    for (let i = 0; i < n; i++) {
      const g = r.gaussian();
      s += g;
      s2 += g * g;
      if (Math.abs(g) < 1) within++;
    }
    // Tolerances ~5 standard errors for n = 2e5 (common practice).
    expect(Math.abs(s / n)).toBeLessThan(0.012);
    expect(Math.abs(s2 / n - 1)).toBeLessThan(0.016);
    // P(|g| < 1) = erf(1/sqrt 2) = 0.682689 (standard normal table).
    expect(Math.abs(within / n - 0.682689)).toBeLessThan(0.006);
  });

  it('int(lo, hi) covers both ends and nothing outside', () => {
    const r = createRng(3);
    const seen = new Set<number>();
    for (let i = 0; i < 2000; i++) seen.add(r.int(2, 5));
    expect([...seen].sort()).toEqual([2, 3, 4, 5]);
  });

  it('poisson(mean) has the requested mean', () => {
    const r = createRng(5);
    let s = 0;
    const n = 20_000;
    for (let i = 0; i < n; i++) s += r.poisson(4);
    // sigma of the mean = sqrt(4/n) = 0.014; allow 5 sigma.
    expect(Math.abs(s / n - 4)).toBeLessThan(0.07);
  });

  it('mixSeed separates neighbouring streams', () => {
    expect(mixSeed(1, 2)).not.toBe(mixSeed(1, 3));
    expect(mixSeed(1, 2)).not.toBe(mixSeed(2, 1));
    expect(mixSeed(1, 2)).toBe(mixSeed(1, 2));
  });
});
