import { describe, expect, it } from 'vitest';
import { profileDispersionKms, profileFwhmKms, profilePeakKms, profileAt, type VelocityGaussian } from '../../../src/core/physics/profile';

const FWHM_PER_SIGMA = 2 * Math.sqrt(2 * Math.LN2); // a Gaussian's FWHM / sigma (common practice)

/** Brute force: the outermost half-maximum crossings on a 0.01 km/s grid (slow, independent of the bracketing code). */
function bruteFwhm(g: VelocityGaussian[]): number {
  const lo = Math.min(...g.map((c) => c.vel - 6 * c.sig));
  const hi = Math.max(...g.map((c) => c.vel + 6 * c.sig));
  const step = 0.01;
  let peak = 0;
  for (let u = lo; u <= hi; u += step) peak = Math.max(peak, profileAt(g, u));
  let left = NaN;
  for (let u = lo; u <= hi; u += step) if (profileAt(g, u) >= peak / 2) { left = u; break; }
  let right = NaN;
  for (let u = hi; u >= lo; u -= step) if (profileAt(g, u) >= peak / 2) { right = u; break; }
  return right - left;
}

describe('profile widths of summed Gaussians (Peterson et al. 2004 define FWHM and dispersion)', () => {
  it('two Gaussians of one sigma at one centre: FWHM = 2 sqrt(2 ln 2) sigma whatever the amplitudes', () => {
    expect(profileFwhmKms([{ amp: 3, vel: 100, sig: 1500 }, { amp: 1, vel: 100, sig: 1500 }])).toBeCloseTo(FWHM_PER_SIGMA * 1500, 3);
  });
  it('two equal Gaussians far apart: FWHM = separation + one FWHM (each crossing is a lone Gaussian\'s)', () => {
    const g = [{ amp: 1, vel: -10000, sig: 500 }, { amp: 1, vel: 10000, sig: 500 }];
    expect(profileFwhmKms(g)).toBeCloseTo(20000 + FWHM_PER_SIGMA * 500, 3);
    expect(Math.abs(profilePeakKms(g))).toBeCloseTo(10000, 0);
  });
  it('core plus shifted wing: equals the brute-force crossings to 0.02 km/s', () => {
    for (const g of [
      [{ amp: 1, vel: 0, sig: 1000 }, { amp: 0.4, vel: -800, sig: 3800 }],
      [{ amp: 0.2, vel: 300, sig: 600 }, { amp: 1, vel: -200, sig: 2500 }],
      [{ amp: 1, vel: -1500, sig: 900 }, { amp: 0.9, vel: 1500, sig: 900 }],
    ]) expect(Math.abs(profileFwhmKms(g) - bruteFwhm(g))).toBeLessThan(0.02);
  });
  it('dispersion of two Gaussians: area-weighted second moment (by hand)', () => {
    // Areas 1 x 1000 and 1 x 1000 at -1000 and +1000: variance = 1000^2 + 1000^2, sigma = 1414.21.
    expect(profileDispersionKms([{ amp: 1, vel: -1000, sig: 1000 }, { amp: 1, vel: 1000, sig: 1000 }])).toBeCloseTo(Math.SQRT2 * 1000, 6);
  });
});
