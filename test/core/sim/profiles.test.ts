import { describe, it, expect } from 'vitest';
import { erf, pixelEdges, addGaussian, addLorentzian, observedSigmaA, smoothPixels, C_KMS } from '../../../src/core/sim/profiles';
import { makeGrid, DEFAULT_GRID } from '../../../src/core/sim/grid';

describe('erf', () => {
  // Values: Abramowitz & Stegun 1964, Table 7.1.
  it.each([
    [0, 0],
    [0.5, 0.5204998778],
    [1, 0.8427007929],
    [2, 0.995322265],
    [-1, -0.8427007929],
  ])('erf(%f) = %f within 2e-7', (x, v) => {
    expect(Math.abs(erf(x) - v)).toBeLessThan(2e-7);
  });
});

describe('addGaussian', () => {
  const wl = makeGrid(DEFAULT_GRID);
  const e = pixelEdges(wl);

  it('keeps the line flux for a line narrower than a pixel', () => {
    const out = new Float64Array(wl.length);
    addGaussian(out, e, 5007.3, 0.3, 42);
    let s = 0;
    for (let i = 0; i < wl.length; i++) s += out[i] * (e[i + 1] - e[i]);
    expect(Math.abs(s - 42)).toBeLessThan(1e-5);
  });

  it('matches the slow version (profile evaluated at the centre) for a well-sampled line', () => {
    const out = new Float64Array(wl.length);
    const mu = 6000.4;
    const sig = 12;
    addGaussian(out, e, mu, sig, 100);
    for (let i = 0; i < wl.length; i++) {
      const slow = (100 / (sig * Math.sqrt(2 * Math.PI))) * Math.exp(-0.5 * ((wl[i] - mu) / sig) ** 2);
      // Pixel averaging changes the peak by ~ (width^2 / 24 sigma^2) relative: < 0.1% here.
      expect(Math.abs(out[i] - slow)).toBeLessThan(2e-3 * (100 / (sig * Math.sqrt(2 * Math.PI))));
    }
  });
});

describe('addLorentzian', () => {
  it('keeps ~99% of the area (the tails beyond 60 HWHM are dropped)', () => {
    const wl = makeGrid({ kind: 'linear', startA: 4000, endA: 6000, stepA: 0.5 });
    const e = pixelEdges(wl);
    const out = new Float64Array(wl.length);
    addLorentzian(out, e, 5000, 5, 10);
    let s = 0;
    for (let i = 0; i < wl.length; i++) s += out[i] * (e[i + 1] - e[i]);
    // (2/pi) atan(60) = 0.98939 (closed form).
    expect(Math.abs(s / 10 - 0.98939)).toBeLessThan(1e-3);
  });
});

describe('observedSigmaA', () => {
  it('adds intrinsic and instrumental FWHM in quadrature', () => {
    // R = 2000 -> instrumental FWHM c/R = 149.9 km/s; with intrinsic 0 the sigma is lambda/(R 2.3548).
    expect(observedSigmaA(5000, 0, 2000)).toBeCloseTo(5000 / 2000 / 2.354820045, 9);
    const both = observedSigmaA(5000, C_KMS / 2000, 2000);
    expect(both).toBeCloseTo(Math.SQRT2 * observedSigmaA(5000, 0, 2000), 9);
  });
});

describe('smoothPixels', () => {
  it('preserves a constant and the mean of a spike far from the ends', () => {
    const c = smoothPixels(new Float64Array(50).fill(3), 2);
    expect(Array.from(c).every((v) => Math.abs(v - 3) < 1e-12)).toBe(true);
    const x = new Float64Array(101);
    x[50] = 1;
    const y = smoothPixels(x, 2);
    expect(y.reduce((a, b) => a + b, 0)).toBeCloseTo(1, 3);
    expect(y[50]).toBeLessThan(0.25);
  });
});
