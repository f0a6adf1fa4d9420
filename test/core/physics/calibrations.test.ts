import { describe, expect, it } from 'vitest';
import { MASS_CALIBRATIONS, BOLOMETRIC_CORRECTION, logVirialMass, preferredOrder } from '../../../src/core/physics/calibrations';

const cal = (id: string) => MASS_CALIBRATIONS.find((c) => c.id === id)!;

describe('single-epoch mass calibrations against values worked by hand from each paper\'s formula', () => {
  it('H-beta, Vestergaard & Peterson 2006 eq. 5: FWHM 4000 km/s, lambda L5100 = 1e45 erg/s', () => {
    // 6.91 + 0.50 log10(10) + 2 log10(4) = 6.91 + 0.5 + 1.2041200 = 8.6141200
    expect(logVirialMass(cal('hbeta_vp06'), 4000, 1e45)).toBeCloseTo(8.61412, 5);
  });
  it('C IV, Vestergaard & Peterson 2006 eq. 7: FWHM 5000 km/s, lambda L1350 = 3e45 erg/s', () => {
    // 6.66 + 0.53 log10(30) + 2 log10(5) = 6.66 + 0.7828743 + 1.3979400 = 8.8408143
    expect(logVirialMass(cal('civ_vp06'), 5000, 3e45)).toBeCloseTo(8.840814, 5);
  });
  it('Mg II, Vestergaard & Osmer 2009 eq. 1: FWHM 3000 km/s, lambda L3000 = 2e44 erg/s', () => {
    // 6.86 + 0.50 log10(2) + 2 log10(3) = 6.86 + 0.1505150 + 0.9542425 = 7.9647575
    expect(logVirialMass(cal('mgii_vo09'), 3000, 2e44)).toBeCloseTo(7.964758, 5);
  });
  it('Mg II, Shen et al. 2011 eq. 8 (FWHM in km/s): FWHM 3000 km/s, lambda L3000 = 2e44 erg/s', () => {
    // 0.740 + 0.62 log10(2) + 2 log10(3000) = 0.740 + 0.1866386 + 6.9542425 = 7.8808811
    expect(logVirialMass(cal('mgii_s11'), 3000, 2e44)).toBeCloseTo(7.880881, 5);
  });
  it('bolometric corrections are those of Shen et al. 2011 sec. 3.4 (Richards et al. 2006 SED)', () => {
    expect(BOLOMETRIC_CORRECTION).toEqual({ 1350: 3.81, 3000: 5.15, 5100: 9.26 });
  });
  it('prefers by redshift as Shen et al. 2011 did: H-beta below 0.7, Mg II to 1.9, C IV above', () => {
    expect(preferredOrder(0.5)[0]).toBe('hbeta_vp06');
    expect(preferredOrder(1.2)[0]).toBe('mgii_s11');
    expect(preferredOrder(2.4)[0]).toBe('civ_vp06');
  });
});
