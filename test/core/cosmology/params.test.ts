import { describe, expect, it } from 'vitest';
import { checkCosmology, DEFAULT_COSMOLOGY, describeCosmology, expansionPolynomial, omegaLambda } from '../../../src/core/cosmology/params';

describe('DEFAULT_COSMOLOGY', () => {
  it('is flat with H0 = 70, Om = 0.3, OL = 0.7, no radiation (common convention) and frozen', () => {
    expect(DEFAULT_COSMOLOGY).toEqual({ h0: 70, omegaM: 0.3, omegaK: 0, omegaR: 0 });
    expect(omegaLambda(DEFAULT_COSMOLOGY)).toBeCloseTo(0.7, 15);
    expect(Object.isFrozen(DEFAULT_COSMOLOGY)).toBe(true);
  });
});

describe('omegaLambda(params) and expansionPolynomial(params, a)', () => {
  it('OL = 1 - Om - Ok - Or, and the polynomial is 1 at a = 1 (definition)', () => {
    const p = { h0: 70, omegaM: 0.25, omegaK: -0.05, omegaR: 1e-4 };
    expect(omegaLambda(p)).toBeCloseTo(0.7999, 12);
    expect(expansionPolynomial(p, 1)).toBeCloseTo(1, 14);
  });
});

describe('checkCosmology(params)', () => {
  it('accepts flat, open, closed and radiation models with a big bang', () => {
    expect(() => checkCosmology(DEFAULT_COSMOLOGY)).not.toThrow();
    expect(() => checkCosmology({ h0: 70, omegaM: 0.3, omegaK: 0.2, omegaR: 0 })).not.toThrow();
    expect(() => checkCosmology({ h0: 70, omegaM: 0.3, omegaK: -0.2, omegaR: 9e-5 })).not.toThrow();
    expect(() => checkCosmology({ h0: 70, omegaM: 0, omegaK: 1, omegaR: 0 })).not.toThrow(); // empty, open
    expect(() => checkCosmology({ h0: 70, omegaM: 1.5, omegaK: -0.5, omegaR: 0 })).not.toThrow(); // closed, no Lambda
  });
  it('refuses H0 <= 0 or not finite', () => {
    expect(() => checkCosmology({ ...DEFAULT_COSMOLOGY, h0: 0 })).toThrow(/H0 must be a positive number of km\/s\/Mpc, got 0/);
    expect(() => checkCosmology({ ...DEFAULT_COSMOLOGY, h0: -70 })).toThrow(/H0/);
    expect(() => checkCosmology({ ...DEFAULT_COSMOLOGY, h0: NaN })).toThrow(/H0/);
  });
  it('refuses negative Omega_m or Omega_r and a non-finite Omega_k', () => {
    expect(() => checkCosmology({ ...DEFAULT_COSMOLOGY, omegaM: -0.01 })).toThrow(/Omega_m must be a finite number >= 0/);
    expect(() => checkCosmology({ ...DEFAULT_COSMOLOGY, omegaR: -1e-5 })).toThrow(/Omega_r/);
    expect(() => checkCosmology({ ...DEFAULT_COSMOLOGY, omegaK: Infinity })).toThrow(/Omega_k/);
  });
  it('refuses de Sitter space (Om = Or = Ok = 0): no big bang', () => {
    expect(() => checkCosmology({ h0: 70, omegaM: 0, omegaK: 0, omegaR: 0 })).toThrow(/no big bang/);
  });
  it('refuses a bounce: Om = 0.1, Ok = -1.9 (OL = 2.8) makes E(z)^2 < 0 in the past', () => {
    // (a^2 E)^2 = 0.1 a - 1.9 a^2 + 2.8 a^4 is -0.118 at a = 0.3 (hand computed)
    expect(() => checkCosmology({ h0: 70, omegaM: 0.1, omegaK: -1.9, omegaR: 0 })).toThrow(/E\(z\)\^2 <= 0 near z = /);
  });
  it('catches a dip below zero narrower than the sampling grid', () => {
    // Om = 0.1, Or = 0, Ok = 0.9 - OL: (a^2 E)^2 = 0.1 a + (0.9 - OL) a^2 + OL a^4 falls as OL grows.
    // Find the critical OL where its minimum over (0, 1] touches zero by bisection on a
    // dense grid (slow, obvious), then step just past it on either side.
    const minOf = (ol: number) => {
      let m = Infinity;
      for (let i = 1; i <= 200_000; i++) {
        const a = i / 200_000;
        m = Math.min(m, 0.1 * a + (0.9 - ol) * a * a + ol * a ** 4);
      }
      return m;
    };
    let lo = 1; // valid: all terms non-negative
    let hi = 20; // bounce
    expect(minOf(hi)).toBeLessThan(0);
    for (let k = 0; k < 40; k++) {
      const mid = (lo + hi) / 2;
      if (minOf(mid) > 0) lo = mid;
      else hi = mid;
    }
    const mk = (ol: number) => ({ h0: 70, omegaM: 0.1, omegaR: 0, omegaK: 0.9 - ol });
    expect(() => checkCosmology(mk(hi * (1 + 1e-8)))).toThrow(/no big bang/);
    expect(() => checkCosmology(mk(lo * (1 - 1e-6)))).not.toThrow();
  });
});

describe('describeCosmology(params)', () => {
  it('names geometry, H0 with unit and every density, for export headers', () => {
    expect(describeCosmology(DEFAULT_COSMOLOGY)).toBe(
      'flat Lambda-CDM: H0 = 70 km/s/Mpc, Omega_m = 0.3, Omega_Lambda = 0.7, Omega_k = 0, Omega_r = 0',
    );
    expect(describeCosmology({ h0: 67.66, omegaM: 0.30966, omegaK: -0.01, omegaR: 0 })).toBe(
      'closed Lambda-CDM: H0 = 67.66 km/s/Mpc, Omega_m = 0.30966, Omega_Lambda = 0.70034, Omega_k = -0.01, Omega_r = 0',
    );
    expect(describeCosmology({ h0: 70, omegaM: 0.3, omegaK: 0.1, omegaR: 0 })).toMatch(/^open /);
  });
});
