import { describe, expect, it } from 'vitest';
import {
  FWHM_PER_SIGMA, fitGaussLine, fittedFlux, gaussLineModel, gaussianIntegral, type GaussLineParams,
} from '../../../src/core/engine/gaussFit';
import { mean, seededNormal, std } from './lines/testKit';

const truth: GaussLineParams = { amplitude: 12.5, centre: 6510.3, sigma: 2.7, c0: 4.0, c1: -0.01 };
const xRef = 6510;

function grid(from: number, to: number, step: number): Float64Array {
  const n = Math.round((to - from) / step) + 1;
  return Float64Array.from({ length: n }, (_, i) => from + i * step);
}

describe('fitGaussLine', () => {
  it('recovers a noise-free Gaussian on a sloped continuum to 1e-6 from an offset start', () => {
    const x = grid(6480, 6540, 0.9);
    const y = x.map((v) => gaussLineModel(truth, xRef, v));
    const w = new Float64Array(x.length).fill(1);
    const r = fitGaussLine(x, y, w, {
      initial: { amplitude: 8, centre: 6509, sigma: 4, c0: 3.5, c1: 0 },
      xRef,
    });
    expect(r.status).toBe('converged');
    // Exact synthetic input: the minimum is the truth (relative 1e-6, brief requirement).
    expect(r.params.amplitude).toBeCloseTo(truth.amplitude, 5);
    expect(Math.abs(r.params.centre - truth.centre)).toBeLessThan(1e-6 * truth.sigma);
    expect(Math.abs(r.params.sigma / truth.sigma - 1)).toBeLessThan(1e-6);
    expect(Math.abs(r.params.c0 - truth.c0)).toBeLessThan(1e-6);
    expect(Math.abs(r.params.c1 - truth.c1)).toBeLessThan(1e-8);
    expect(r.chi2).toBeLessThan(1e-12);
  });

  it('recovers a trough (negative amplitude) as well', () => {
    const t = { ...truth, amplitude: -2.0 };
    const x = grid(6480, 6540, 0.9);
    const y = x.map((v) => gaussLineModel(t, xRef, v));
    const r = fitGaussLine(x, y, new Float64Array(x.length).fill(4), {
      initial: { amplitude: -1, centre: 6511.5, sigma: 2, c0: 4, c1: 0 }, xRef,
    });
    expect(r.status).toBe('converged');
    expect(r.params.amplitude).toBeCloseTo(-2.0, 6);
    expect(r.params.centre).toBeCloseTo(t.centre, 6);
  });

  it('gaussianIntegral(A, sigma) = A sigma sqrt(2 pi), checked by direct quadrature (standard integral)', () => {
    const p = { ...truth, c0: 0, c1: 0 };
    // Trapezoid rule over +-12 sigma with a fine step: no fit involved.
    const h = p.sigma / 200;
    let s = 0;
    for (let v = p.centre - 12 * p.sigma; v <= p.centre + 12 * p.sigma; v += h) s += gaussLineModel(p, 0, v) * h;
    expect(s / gaussianIntegral(p.amplitude, p.sigma)).toBeCloseTo(1, 9);
    // FWHM = 2 sqrt(2 ln 2) sigma: the model falls to half its peak there (definition).
    const halfAt = gaussLineModel(p, 0, p.centre + (FWHM_PER_SIGMA / 2) * p.sigma);
    expect(halfAt / p.amplitude).toBeCloseTo(0.5, 12);
  });

  it('reported errors match the scatter over seeded noise realisations (ratio 0.7-1.4)', () => {
    const x = grid(6480, 6540, 0.9);
    const noise = 0.8;
    const w = new Float64Array(x.length).fill(1 / noise ** 2);
    const fits = [] as ReturnType<typeof fitGaussLine>[];
    for (let k = 0; k < 200; k++) {
      const rnd = seededNormal(1000 + k);
      const y = x.map((v) => gaussLineModel(truth, xRef, v) + noise * rnd());
      const r = fitGaussLine(x, y, w, { initial: { amplitude: 10, centre: 6511, sigma: 3.5, c0: 4, c1: 0 }, xRef });
      expect(r.status).toBe('converged');
      fits.push(r);
    }
    const names = ['amplitude', 'centre', 'sigma', 'c0'] as const;
    for (const name of names) {
      const ratio = std(fits.map((f) => f.params[name])) / mean(fits.map((f) => f.errors[name]));
      expect(ratio, name).toBeGreaterThan(0.7);
      expect(ratio, name).toBeLessThan(1.4);
    }
    const fluxes = fits.map(fittedFlux);
    const fluxRatio = std(fluxes.map((f) => f.flux)) / mean(fluxes.map((f) => f.fluxErr));
    expect(fluxRatio).toBeGreaterThan(0.7);
    expect(fluxRatio).toBeLessThan(1.4);
    // Unbiased within the scatter: the mean centre sits within 3 standard errors of truth.
    const cs = fits.map((f) => f.params.centre);
    expect(Math.abs(mean(cs) - truth.centre)).toBeLessThan((3 * std(cs)) / Math.sqrt(cs.length));
  });

  it('scales the covariance by the reduced chi-square when the weights claim too little noise', () => {
    const x = grid(6480, 6540, 0.9);
    const noise = 0.8;
    const wTooBig = new Float64Array(x.length).fill(9 / noise ** 2); // errors claimed 3x too small
    const centres: number[] = [];
    const errs: number[] = [];
    for (let k = 0; k < 150; k++) {
      const rnd = seededNormal(5000 + k);
      const y = x.map((v) => gaussLineModel(truth, xRef, v) + noise * rnd());
      const r = fitGaussLine(x, y, wTooBig, { initial: { amplitude: 10, centre: 6511, sigma: 3.5, c0: 4, c1: 0 }, xRef });
      expect(r.covarianceScale).toBeGreaterThan(5);
      centres.push(r.params.centre);
      errs.push(r.errors.centre);
    }
    const ratio = std(centres) / mean(errs);
    expect(ratio).toBeGreaterThan(0.7);
    expect(ratio).toBeLessThan(1.4);
  });

  it('ignores zero-weight and non-finite points', () => {
    const x = grid(6480, 6540, 0.9);
    const y = x.map((v) => gaussLineModel(truth, xRef, v));
    const w = new Float64Array(x.length).fill(1);
    const yBad = Float64Array.from(y);
    for (let i = 10; i < 15; i++) {
      yBad[i] = 1e6;
      w[i] = 0;
    }
    yBad[40] = NaN;
    const r = fitGaussLine(x, yBad, w, { initial: { amplitude: 8, centre: 6509, sigma: 4, c0: 3.5, c1: 0 }, xRef });
    expect(r.status).toBe('converged');
    expect(r.nUsed).toBe(x.length - 6);
    expect(r.params.centre).toBeCloseTo(truth.centre, 6);
  });

  it('returns status failed with too few points, and at-bound when the truth lies outside the centre bounds', () => {
    const x = grid(6500, 6504, 1);
    const y = x.map((v) => gaussLineModel(truth, xRef, v));
    const few = fitGaussLine(x, y, new Float64Array(x.length).fill(1), { initial: truth, xRef });
    expect(few.status).toBe('failed');
    expect(few.reason).toMatch(/usable points/);

    const x2 = grid(6480, 6540, 0.9);
    const y2 = x2.map((v) => gaussLineModel(truth, xRef, v));
    const bounded = fitGaussLine(x2, y2, new Float64Array(x2.length).fill(1), {
      initial: { amplitude: 10, centre: 6505, sigma: 3, c0: 4, c1: 0 }, xRef, centreBounds: [6500, 6508],
    });
    expect(bounded.status).toBe('at-bound');
    expect(bounded.params.centre).toBeCloseTo(6508, 9);
  });

  it('returns status failed on a flat line, where the Gaussian is not constrained', () => {
    const x = grid(6480, 6540, 0.9);
    const y = new Float64Array(x.length).fill(3);
    const r = fitGaussLine(x, y, new Float64Array(x.length).fill(1), {
      initial: { amplitude: 0, centre: 6510, sigma: 3, c0: 3, c1: 0 }, xRef,
    });
    expect(r.status).toBe('failed');
  });
});
