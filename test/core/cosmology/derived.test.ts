import { describe, expect, it } from 'vitest';
import { derivedQuantities } from '../../../src/core/cosmology/derived';
import {
  angularDiameterDistanceMpc,
  comovingDistanceMpc,
  distanceModulusMag,
  kpcPerArcsec,
  luminosityDistanceMpc,
  transverseComovingDistanceMpc,
} from '../../../src/core/cosmology/distances';
import { ageGyr, lookbackTimeGyr } from '../../../src/core/cosmology/times';
import type { CosmologyParams } from '../../../src/core/types';
import { CASE_A } from './referenceValues';

const MODELS: CosmologyParams[] = [
  { h0: 70, omegaM: 0.3, omegaK: 0, omegaR: 0 },
  { h0: 68, omegaM: 0.31, omegaK: 0.05, omegaR: 9e-5 },
  { h0: 74, omegaM: 0.28, omegaK: -0.04, omegaR: 0 },
];

describe('derivedQuantities(z, params)', () => {
  it('equals the one-quantity functions (the slow path) for flat, open and closed models', () => {
    for (const p of MODELS) {
      for (const z of [0.01, 0.5, 2.2, 6]) {
        const d = derivedQuantities(z, p);
        expect(d.z).toBe(z);
        expect(d.comovingDistanceMpc).toBeCloseTo(comovingDistanceMpc(z, p), 9);
        expect(d.transverseComovingDistanceMpc).toBeCloseTo(transverseComovingDistanceMpc(z, p), 9);
        expect(d.luminosityDistanceMpc).toBeCloseTo(luminosityDistanceMpc(z, p), 8);
        expect(d.angularDiameterDistanceMpc).toBeCloseTo(angularDiameterDistanceMpc(z, p), 9);
        expect(d.distanceModulusMag).toBeCloseTo(distanceModulusMag(z, p), 12);
        expect(d.kpcPerArcsec).toBeCloseTo(kpcPerArcsec(z, p), 12);
        expect(d.lookbackTimeGyr).toBeCloseTo(lookbackTimeGyr(z, p), 12);
        expect(d.ageGyr).toBeCloseTo(ageGyr(z, p), 12);
      }
    }
  });
  it('matches reference-sheet case A at z = 1 (astropy [C]): D_L 6607.66 Mpc, age 5.7516 Gyr', () => {
    const d = derivedQuantities(1, CASE_A.params);
    expect(Math.abs(d.luminosityDistanceMpc - 6607.66)).toBeLessThan(0.005);
    expect(Math.abs(d.ageGyr - 5.7516)).toBeLessThan(5e-5);
  });
  it('is deterministic: the same inputs give bit-identical output', () => {
    expect(derivedQuantities(1.234567, MODELS[1])).toEqual(derivedQuantities(1.234567, MODELS[1]));
  });
  it('refuses a negative redshift and an unphysical model', () => {
    expect(() => derivedQuantities(-0.001, CASE_A.params)).toThrow(/redshift/);
    expect(() => derivedQuantities(1, { h0: -1, omegaM: 0.3, omegaK: 0, omegaR: 0 })).toThrow(/H0/);
  });
});
