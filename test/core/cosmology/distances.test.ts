import { describe, expect, it } from 'vitest';
import {
  angularDiameterDistanceMpc,
  comovingDistanceMpc,
  distanceModulusMag,
  kpcPerArcsec,
  luminosityDistanceMpc,
  transverseComovingDistanceMpc,
} from '../../../src/core/cosmology/distances';
import { hubbleDistanceMpc } from '../../../src/core/cosmology/constants';
import type { CosmologyParams } from '../../../src/core/types';
import { CASE_A, CASE_C, WRIGHT_RADIATION, tolerance } from './referenceValues';

const REL_DISTANCE = 1e-4; // suggested tolerance for distances at the top of docs/reference.md

/** Plain composite midpoint rule with n panels: the slow obvious integral. */
function midpoint(f: (x: number) => number, a: number, b: number, n: number): number {
  const h = (b - a) / n;
  let s = 0;
  for (let i = 0; i < n; i++) s += f(a + (i + 0.5) * h);
  return s * h;
}

function plainE(z: number, p: CosmologyParams): number {
  const x = 1 + z;
  const oL = 1 - p.omegaM - p.omegaK - p.omegaR;
  return Math.sqrt(p.omegaR * x ** 4 + p.omegaM * x ** 3 + p.omegaK * x ** 2 + oL);
}

for (const c of [CASE_A, CASE_C]) {
  describe(`distances against docs/reference.md sec. 4, ${c.label}`, () => {
    for (const [z, , dc, dl, da, dm, kpc] of c.rows) {
      it(`z = ${z}: D_C, D_M, D_L, D_A, DM and kpc/arcsec match astropy [C]`, () => {
        const p = c.params;
        expect(Math.abs(comovingDistanceMpc(z, p) - dc)).toBeLessThanOrEqual(tolerance(dc, REL_DISTANCE, 2));
        expect(Math.abs(transverseComovingDistanceMpc(z, p) - dc)).toBeLessThanOrEqual(tolerance(dc, REL_DISTANCE, 2)); // flat
        expect(Math.abs(luminosityDistanceMpc(z, p) - dl)).toBeLessThanOrEqual(tolerance(dl, REL_DISTANCE, 2));
        expect(Math.abs(angularDiameterDistanceMpc(z, p) - da)).toBeLessThanOrEqual(tolerance(da, REL_DISTANCE, 2));
        // DM: 1e-4 relative in D_L is 2.2e-4 mag; the table prints 4 decimals.
        expect(Math.abs(distanceModulusMag(z, p) - dm)).toBeLessThanOrEqual(2.2e-4);
        expect(Math.abs(kpcPerArcsec(z, p) - kpc)).toBeLessThanOrEqual(tolerance(kpc, REL_DISTANCE, 4));
      });
    }
  });
}

describe('distances with constant radiation (Wright 2006 calculator defaults, astropy values [C])', () => {
  const w = WRIGHT_RADIATION;
  it('z = 3: D_C, D_A, D_L, kpc/arcsec within 1e-4 relative', () => {
    expect(Math.abs(comovingDistanceMpc(w.z, w.params) - w.comovingDistanceMpc)).toBeLessThanOrEqual(tolerance(w.comovingDistanceMpc, REL_DISTANCE, 2));
    expect(Math.abs(angularDiameterDistanceMpc(w.z, w.params) - w.angularDiameterDistanceMpc)).toBeLessThanOrEqual(tolerance(w.angularDiameterDistanceMpc, REL_DISTANCE, 2));
    expect(Math.abs(luminosityDistanceMpc(w.z, w.params) - w.luminosityDistanceMpc)).toBeLessThanOrEqual(tolerance(w.luminosityDistanceMpc, REL_DISTANCE, 2));
    expect(Math.abs(kpcPerArcsec(w.z, w.params) - w.kpcPerArcsec)).toBeLessThanOrEqual(tolerance(w.kpcPerArcsec, REL_DISTANCE, 4));
  });
  it('radiation shortens D_C compared with the same model without it', () => {
    const noRad = { ...w.params, omegaR: 0 };
    expect(comovingDistanceMpc(3, w.params)).toBeLessThan(comovingDistanceMpc(3, noRad));
  });
});

describe('curved models against a plain midpoint integral (Hogg 1999 eq. 16)', () => {
  const open: CosmologyParams = { h0: 70, omegaM: 0.3, omegaK: 0.15, omegaR: 8e-5 };
  const closed: CosmologyParams = { h0: 65, omegaM: 0.35, omegaK: -0.12, omegaR: 0 };
  for (const [name, p] of [['open', open], ['closed', closed]] as const) {
    for (const z of [0.3, 1.5, 4]) {
      it(`${name} model, z = ${z}: D_C and D_M agree with 200000-panel midpoint sums to 1e-8`, () => {
        const dh = hubbleDistanceMpc(p.h0);
        const dc = dh * midpoint((x) => 1 / plainE(x, p), 0, z, 200_000);
        const r = Math.sqrt(Math.abs(p.omegaK));
        const dmPlain = p.omegaK > 0 ? (dh / r) * Math.sinh((r * dc) / dh) : (dh / r) * Math.sin((r * dc) / dh);
        expect(comovingDistanceMpc(z, p)).toBeCloseTo(dc, 6);
        expect(Math.abs(transverseComovingDistanceMpc(z, p) / dmPlain - 1)).toBeLessThan(1e-8);
        // open geometry makes D_M > D_C, closed makes it smaller
        if (p.omegaK > 0) expect(transverseComovingDistanceMpc(z, p)).toBeGreaterThan(comovingDistanceMpc(z, p));
        else expect(transverseComovingDistanceMpc(z, p)).toBeLessThan(comovingDistanceMpc(z, p));
      });
    }
  }
});

describe('analytic models (textbook closed forms, e.g. Hogg 1999 sec. 5)', () => {
  it('Einstein-de Sitter (Om = 1): D_C = 2 D_H (1 - 1/sqrt(1+z))', () => {
    const p = { h0: 50, omegaM: 1, omegaK: 0, omegaR: 0 };
    for (const z of [0.01, 0.7, 3, 10]) {
      const exact = 2 * hubbleDistanceMpc(50) * (1 - 1 / Math.sqrt(1 + z));
      expect(Math.abs(comovingDistanceMpc(z, p) / exact - 1)).toBeLessThan(1e-9);
    }
  });
  it('empty open model (Om = 0, Ok = 1): D_C = D_H ln(1+z), D_M = D_H z (1 + z/2) / (1+z)', () => {
    const p = { h0: 70, omegaM: 0, omegaK: 1, omegaR: 0 };
    const dh = hubbleDistanceMpc(70);
    for (const z of [0.2, 1, 6]) {
      expect(Math.abs(comovingDistanceMpc(z, p) / (dh * Math.log1p(z)) - 1)).toBeLessThan(1e-9);
      expect(Math.abs(transverseComovingDistanceMpc(z, p) / ((dh * z * (1 + z / 2)) / (1 + z)) - 1)).toBeLessThan(1e-9);
    }
  });
});

describe('edge values and refusals', () => {
  const p = CASE_A.params;
  it('z = 0 gives zero distances and DM = -Infinity', () => {
    expect(comovingDistanceMpc(0, p)).toBe(0);
    expect(luminosityDistanceMpc(0, p)).toBe(0);
    expect(kpcPerArcsec(0, p)).toBe(0);
    expect(distanceModulusMag(0, p)).toBe(-Infinity);
  });
  it('low z approaches the Hubble law D_L ~ cz/H0 (first order, Hogg 1999)', () => {
    const z = 1e-4;
    expect(Math.abs(luminosityDistanceMpc(z, p) / (hubbleDistanceMpc(70) * z) - 1)).toBeLessThan(1e-3);
  });
  it('refuses a negative, infinite or NaN redshift', () => {
    expect(() => comovingDistanceMpc(-0.01, p)).toThrow(/redshift must be a finite number >= 0/);
    expect(() => luminosityDistanceMpc(Infinity, p)).toThrow(RangeError);
    expect(() => kpcPerArcsec(NaN, p)).toThrow(RangeError);
  });
  it('refuses an unphysical model', () => {
    expect(() => comovingDistanceMpc(1, { ...p, h0: 0 })).toThrow(/H0 must be a positive/);
    expect(() => angularDiameterDistanceMpc(1, { ...p, omegaM: -0.1 })).toThrow(/Omega_m must be/);
  });
});
