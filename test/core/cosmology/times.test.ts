import { describe, expect, it } from 'vitest';
import { ageGyr, lookbackTimeGyr } from '../../../src/core/cosmology/times';
import { hubbleTimeGyr } from '../../../src/core/cosmology/constants';
import type { CosmologyParams } from '../../../src/core/types';
import { CASE_A, CASE_C, WRIGHT_RADIATION, tolerance } from './referenceValues';

const REL_AGE = 1e-5; // suggested tolerance for ages at the top of docs/reference.md

/** Plain composite midpoint rule: the slow obvious integral. */
function midpoint(f: (x: number) => number, a: number, b: number, n: number): number {
  const h = (b - a) / n;
  let s = 0;
  for (let i = 0; i < n; i++) s += f(a + (i + 0.5) * h);
  return s * h;
}

for (const c of [CASE_A, CASE_C]) {
  describe(`times against docs/reference.md sec. 4, ${c.label}`, () => {
    for (const [z, age] of c.ages) {
      it(`age at z = ${z} matches astropy [C] to 1e-5 relative or the table's last digit`, () => {
        expect(Math.abs(ageGyr(z, c.params) - age)).toBeLessThanOrEqual(tolerance(age, REL_AGE, 4));
      });
    }
    for (const [z, tl] of c.rows) {
      it(`lookback time at z = ${z} matches astropy [C]`, () => {
        expect(Math.abs(lookbackTimeGyr(z, c.params) - tl)).toBeLessThanOrEqual(tolerance(tl, REL_AGE, 4));
      });
    }
  });
}

describe('times with constant radiation (Wright 2006 calculator defaults, astropy values [C])', () => {
  const w = WRIGHT_RADIATION;
  it('age today and at z = 3', () => {
    expect(Math.abs(ageGyr(0, w.params) - w.ageNowGyr)).toBeLessThanOrEqual(tolerance(w.ageNowGyr, REL_AGE, 4));
    expect(Math.abs(ageGyr(w.z, w.params) - w.ageAtZGyr)).toBeLessThanOrEqual(tolerance(w.ageAtZGyr, REL_AGE, 4));
  });
});

describe('analytic ages', () => {
  it('Einstein-de Sitter: t(z) = (2/3) t_H (1+z)^-1.5 (textbook, e.g. Hogg 1999 sec. 10)', () => {
    const p = { h0: 60, omegaM: 1, omegaK: 0, omegaR: 0 };
    for (const z of [0, 1, 9, 1000]) {
      const exact = (2 / 3) * hubbleTimeGyr(60) * (1 + z) ** -1.5;
      expect(Math.abs(ageGyr(z, p) / exact - 1)).toBeLessThan(1e-9);
    }
  });
  it('pure radiation: t(z) = t_H / (2 (1+z)^2) (textbook)', () => {
    const p = { h0: 70, omegaM: 0, omegaK: 0, omegaR: 1 };
    for (const z of [0, 2, 50]) {
      expect(Math.abs(ageGyr(z, p) / (hubbleTimeGyr(70) / (2 * (1 + z) ** 2)) - 1)).toBeLessThan(1e-9);
    }
  });
  it('empty open model: t(z) = t_H / (1+z) (textbook)', () => {
    const p = { h0: 70, omegaM: 0, omegaK: 1, omegaR: 0 };
    for (const z of [0, 3]) expect(Math.abs(ageGyr(z, p) / (hubbleTimeGyr(70) / (1 + z)) - 1)).toBeLessThan(1e-9);
  });
});

describe('curved model against a plain midpoint integral over z', () => {
  const p: CosmologyParams = { h0: 72, omegaM: 0.27, omegaK: -0.08, omegaR: 5e-5 };
  const oL = 1 - p.omegaM - p.omegaK - p.omegaR;
  const integrand = (z: number) => {
    const x = 1 + z;
    return 1 / (x * Math.sqrt(p.omegaR * x ** 4 + p.omegaM * x ** 3 + p.omegaK * x ** 2 + oL));
  };
  for (const z of [0.05, 0.8, 2.5]) {
    it(`lookback at z = ${z} agrees with a 200000-panel midpoint sum to 1e-9`, () => {
      const plain = hubbleTimeGyr(p.h0) * midpoint(integrand, 0, z, 200_000);
      expect(Math.abs(lookbackTimeGyr(z, p) / plain - 1)).toBeLessThan(1e-9);
    });
  }
  it('age today = age at z + lookback to z, and age decreases with z', () => {
    const now = ageGyr(0, p);
    for (const z of [0.5, 2, 6]) {
      expect(Math.abs(ageGyr(z, p) + lookbackTimeGyr(z, p) - now) / now).toBeLessThan(1e-9);
    }
    expect(ageGyr(1, p)).toBeLessThan(ageGyr(0.5, p));
  });
  it('age today agrees with a plain midpoint integral over the scale factor (1e6 panels, 1e-6)', () => {
    // t0 / t_H = Int_0^1 a da / sqrt(Or + Om a + Ok a^2 + OL a^4)
    const plain = midpoint((a) => a / Math.sqrt(p.omegaR + p.omegaM * a + p.omegaK * a * a + oL * a ** 4), 0, 1, 1_000_000);
    expect(Math.abs(ageGyr(0, p) / (hubbleTimeGyr(p.h0) * plain) - 1)).toBeLessThan(1e-6);
  });
});

describe('refusals', () => {
  it('refuses a negative redshift and a model without a big bang', () => {
    expect(() => ageGyr(-0.5, CASE_A.params)).toThrow(/redshift/);
    expect(() => lookbackTimeGyr(1, { h0: 70, omegaM: 0, omegaK: 0, omegaR: 0 })).toThrow(/no big bang/);
  });
});
