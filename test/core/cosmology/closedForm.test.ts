import { describe, expect, it } from 'vitest';
import { flatMatterLambdaAgeGyr } from '../../../src/core/cosmology/closedForm';
import { ageGyr } from '../../../src/core/cosmology/times';
import { CASE_A, CASE_C, tolerance } from './referenceValues';

const ZS = [0, 0.5, 1, 2, 3, 5, 7];

for (const c of [CASE_A, CASE_C]) {
  describe(`flatMatterLambdaAgeGyr(z, params), ${c.label}`, () => {
    it('equals the numerical age integral to 1e-9 relative at z = 0, 0.5, 1, 2, 3, 5, 7', () => {
      for (const z of ZS) {
        const closed = flatMatterLambdaAgeGyr(z, c.params);
        expect(Math.abs(ageGyr(z, c.params) / closed - 1)).toBeLessThan(1e-9);
      }
    });
    it("matches the ages of docs/reference.md sec. 4 (astropy [C]) to the table's last digit", () => {
      for (const [z, age] of c.ages) {
        expect(Math.abs(flatMatterLambdaAgeGyr(z, c.params) - age)).toBeLessThanOrEqual(tolerance(age, 1e-5, 4));
      }
    });
  });
}

describe('flatMatterLambdaAgeGyr refuses models it does not describe', () => {
  it('curved, with radiation, or without Lambda', () => {
    expect(() => flatMatterLambdaAgeGyr(1, { h0: 70, omegaM: 0.3, omegaK: 0.1, omegaR: 0 })).toThrow(/flat model/);
    expect(() => flatMatterLambdaAgeGyr(1, { h0: 70, omegaM: 0.3, omegaK: 0, omegaR: 1e-4 })).toThrow(/flat model/);
    expect(() => flatMatterLambdaAgeGyr(1, { h0: 70, omegaM: 1, omegaK: 0, omegaR: 0 })).toThrow(/flat model/);
  });
});
