import { describe, expect, it } from 'vitest';
import { agreementOf, checkRule, scaledDz, verdictsAgree } from '../../../src/core/team/agreement';

// Edges of the rule |dz| / (1 + z) < 0.003 (z the mean of the two), worked by hand:
// at z = 1 the bar is dz < 0.006 (0.003 * (1 + 1)); at z = 0 it is dz < 0.003.
describe('verdictsAgree(a, b, rule): same class and |dz|/(1+z) below the tolerance', () => {
  it('agrees just inside the tolerance and not just outside it', () => {
    expect(verdictsAgree({ class: 'qso', z: 0.997 }, { class: 'qso', z: 1.00299 })).toBe(true); // dz = 0.00599, 1 + mean = 1.99999...
    expect(verdictsAgree({ class: 'qso', z: 0.997 }, { class: 'qso', z: 1.00301 })).toBe(false); // dz = 0.00601
    expect(verdictsAgree({ class: 'galaxy', z: 0 }, { class: 'galaxy', z: 0.00299 })).toBe(true);
    expect(verdictsAgree({ class: 'galaxy', z: 0 }, { class: 'galaxy', z: 0.00302 })).toBe(false);
  });

  it('counts exactly the tolerance as a disagreement (strictly below)', () => {
    // The tolerance set to the pair's own scaled dz: equal is not below.
    const a = { class: 'star' as const, z: -0.50075 };
    const b = { class: 'star' as const, z: -0.49925 };
    const d = scaledDz(a.z, b.z);
    expect(verdictsAgree(a, b, { tolerance: d })).toBe(false);
    expect(verdictsAgree(a, b, { tolerance: d * (1 + 1e-12) })).toBe(true);
  });

  it('is symmetric and needs the same class', () => {
    const a = { class: 'qso' as const, z: 2.1 };
    const b = { class: 'galaxy' as const, z: 2.1 };
    expect(verdictsAgree(a, b)).toBe(false);
    expect(verdictsAgree({ class: 'qso', z: 2.1 }, { class: 'qso', z: 2.11 }, { tolerance: 0.01 })).toBe(verdictsAgree({ class: 'qso', z: 2.11 }, { class: 'qso', z: 2.1 }, { tolerance: 0.01 }));
  });

  it('takes two rejections as agreeing and a rejection against a redshift as not', () => {
    expect(verdictsAgree({ class: 'unknown', z: null }, { class: 'unknown', z: null })).toBe(true);
    expect(verdictsAgree({ class: 'unknown', z: null }, { class: 'unknown', z: 0.5 })).toBe(false);
  });

  it('a settable tolerance changes the verdict', () => {
    const a = { class: 'qso' as const, z: 2.0 };
    const b = { class: 'qso' as const, z: 2.02 }; // dz/(1+z) = 0.02/3.01 = 0.00664
    expect(verdictsAgree(a, b)).toBe(false);
    expect(verdictsAgree(a, b, { tolerance: 0.01 })).toBe(true);
    expect(() => checkRule({ tolerance: 0 })).toThrow(/above 0/);
    expect(() => checkRule({ tolerance: Number.NaN })).toThrow(/tolerance/);
  });
});

describe('agreementOf(verdicts)', () => {
  it('none, single, agree, and disagree when any pair differs', () => {
    expect(agreementOf([])).toBe('none');
    expect(agreementOf([{ class: 'qso', z: 1 }])).toBe('single');
    expect(agreementOf([{ class: 'qso', z: 1 }, { class: 'qso', z: 1.001 }])).toBe('agree');
    // a-b and b-c within 0.003 but a-c not: the spectrum is a disagreement.
    expect(agreementOf([{ class: 'qso', z: 1 }, { class: 'qso', z: 1.005 }, { class: 'qso', z: 1.01 }])).toBe('disagree');
  });
});
