import { describe, expect, it } from 'vitest';
import { fitSpectrum, refitNear, CURVE_MAX_POINTS, TEMPLATE_SET_ID, ENGINE_VERSION } from '../../../src/core/engine';
import { templateFamilies } from '../../../src/core/engine/templates';
import { velocitySeparationKms } from '../../../src/core/engine/logGrid';
import { injectFamily } from './synth';
import type { Spectrum } from '../../../src/core/types';

const fam = (id: string) => templateFamilies().find((f) => f.id === id)!;
const slope = (lam: number) => 2 + lam / 8000;

describe('fitSpectrum: injected redshifts are recovered for each family', () => {
  const cases: { id: string; amps: number[]; z: number; cls: string; cont?: (l: number) => number; forest?: boolean }[] = [
    // qso: Ly-alpha, C IV (two blueshifts), C III], Mg II groups over a sloped continuum with the mean forest
    { id: 'qso', amps: [6, 3, 1, 2, 2, 0, 0, 0], z: 2.3456, cls: 'qso', cont: slope, forest: true },
    { id: 'qso', amps: [0, 0, 0, 0, 3, 4, 1, 0], z: 0.4321, cls: 'qso', cont: slope },
    { id: 'galaxy-sf', amps: [4, 4, 5, 2, 0], z: 0.7123, cls: 'galaxy', cont: slope },
    { id: 'galaxy-passive', amps: [20, 2], z: 0.3517, cls: 'galaxy' },
    { id: 'star', amps: [0, 20, 0, 0], z: 0.0002, cls: 'star' },
    { id: 'star', amps: [0, 0, 5, 15], z: -0.0003, cls: 'star' },
  ];
  for (const c of cases) {
    it(`${c.id} at z = ${c.z}`, () => {
      const s = injectFamily(fam(c.id), c.amps, c.z, { sigma: 1, seed: 5, cont: c.cont, forest: c.forest });
      const r = fitSpectrum(s);
      expect(r.status).toBe('ok');
      expect(r.class).toBe(c.cls);
      // well inside the catastrophic limit |dz|/(1+z) < 0.01: within 100 km/s of the injected value
      expect(Math.abs(velocitySeparationKms(c.z, r.z))).toBeLessThan(100);
      expect(r.zErr).toBeGreaterThan(0);
      expect(r.nFeatures).toBeGreaterThanOrEqual(1);
    });
  }
});

describe('fitSpectrum: result contract', () => {
  it('fills every field, with curves of at most CURVE_MAX_POINTS points whose minimum is 0', () => {
    const s = injectFamily(fam('galaxy-sf'), [4, 4, 5, 2, 0], 0.25, { sigma: 1, seed: 9, cont: slope });
    const r = fitSpectrum(s);
    expect(r.templateSet).toBe(TEMPLATE_SET_ID);
    expect(r.engineVersion).toBe(ENGINE_VERSION);
    expect(r.candidates[0].deltaChi2).toBe(0);
    expect(r.chi2Gap).toBeCloseTo(r.candidates[1].chi2 - r.candidates[0].chi2, 9);
    expect(r.score).toBeGreaterThanOrEqual(0);
    expect(r.score).toBeLessThanOrEqual(1);
    expect(r.input.nPix).toBe(s.flux.length);
    expect(r.noiseEstimated).toBe(false);
    let globalMin = Infinity;
    for (const c of r.curves) {
      expect(c.z.length).toBeLessThanOrEqual(CURVE_MAX_POINTS);
      expect(c.z.length).toBe(c.deltaChi2.length);
      for (const v of c.deltaChi2) globalMin = Math.min(globalMin, v);
    }
    expect(globalMin).toBe(0);
  });

  it('estimates the noise when ivar is null and says so', () => {
    const s = injectFamily(fam('galaxy-sf'), [4, 4, 5, 2, 0], 0.25, { sigma: 1, seed: 9, cont: slope });
    const r = fitSpectrum({ ...s, ivar: null });
    expect(r.status).toBe('ok');
    expect(r.noiseEstimated).toBe(true);
    expect(Math.abs(velocitySeparationKms(0.25, r.z))).toBeLessThan(100);
  });

  it('returns status failed with a one-line error, and does not throw, when too little is usable', () => {
    const s = injectFamily(fam('galaxy-sf'), [4, 4, 5, 2, 0], 0.25, { sigma: 1, seed: 9 });
    const bad: Spectrum = { ...s, ivar: new Float64Array(s.flux.length), mask: new Uint8Array(s.flux.length) };
    bad.ivar![10] = 1;
    const r = fitSpectrum(bad);
    expect(r.status).toBe('failed');
    expect(r.error).toMatch(/usable pixels/);
    expect(r.error).not.toMatch(/\n/);
    const nanFlux: Spectrum = { ...s, flux: s.flux.map((f, i) => (i % 3 === 0 ? NaN : f)), mask: s.mask.map((_, i) => (i % 3 === 0 ? 1 : 0)) };
    expect(fitSpectrum(nanFlux).status).toBe('ok');
  });

  it('class is unknown for pure noise on a smooth continuum', () => {
    const s = injectFamily(fam('galaxy-sf'), [0, 0, 0, 0, 0], 0.25, { sigma: 1, seed: 3, cont: slope });
    const r = fitSpectrum(s);
    expect(r.class).toBe('unknown');
    expect(r.confidence).toBe('none');
  });
});

describe('fitSpectrum: z error from the chi-square curvature', () => {
  it('matches the scatter of z over seeded noise realisations (ratio 0.7..1.4)', () => {
    const zTrue = 0.41237;
    const zs: number[] = [];
    const errs: number[] = [];
    for (let seed = 1; seed <= 40; seed++) {
      const s = injectFamily(fam('galaxy-sf'), [2, 2, 2, 1, 0], zTrue, { sigma: 1, seed, cont: slope });
      const r = fitSpectrum(s, { families: ['galaxy-sf'], measureLines: false });
      zs.push(r.z);
      errs.push(r.zErr);
    }
    const mean = zs.reduce((a, b) => a + b, 0) / zs.length;
    const sd = Math.sqrt(zs.reduce((a, b) => a + (b - mean) ** 2, 0) / (zs.length - 1));
    const medErr = errs.slice().sort((a, b) => a - b)[errs.length >> 1];
    // sigma_z = sqrt(2 / d2chi2/dz2) (reference sheet sec. 5); 40 draws give sd to ~11%
    expect(sd / medErr).toBeGreaterThan(0.7);
    expect(sd / medErr).toBeLessThan(1.4);
  });
});

describe('refitNear(spectrum, zCentre)', () => {
  it('keeps the best solution within +-3000 km/s of zCentre and reports a negative gap when a better one exists', () => {
    const s = injectFamily(fam('galaxy-sf'), [4, 4, 5, 2, 0], 0.7123, { sigma: 1, seed: 2, cont: slope });
    const near = refitNear(s, 0.7123);
    expect(Math.abs(velocitySeparationKms(0.7123, near.z))).toBeLessThan(100);
    const far = refitNear(s, 1.1);
    expect(Math.abs(velocitySeparationKms(1.1, far.z))).toBeLessThanOrEqual(3000);
    expect(far.chi2Gap).toBeLessThan(0);
    expect(Math.abs(velocitySeparationKms(0.7123, far.candidates[1].z))).toBeLessThan(100);
  });

  it('gives the class of the best family in the window even when a better solution lies elsewhere', () => {
    // A quasar at z = 2.3 whose C III] 1908.73 A line is named H-beta 4862.68 A
    // (wavelengths: reference sheet sec. 1): the window holds no good solution,
    // but a template still beats the continuum there, so the class is not 'unknown'.
    const zq = 2.3;
    const s = injectFamily(fam('qso'), [6, 3, 1, 2, 2, 0, 0, 0], zq, { sigma: 1, seed: 5, cont: slope, forest: true });
    const zWrong = (1908.73 * (1 + zq)) / 4862.68 - 1;
    const r = refitNear(s, zWrong);
    expect(r.status).toBe('ok');
    expect(r.chi2Gap).toBeLessThan(0);
    expect(r.class).not.toBe('unknown');
    expect(r.class).toBe(r.candidates[0].class);
  });

  it('fails cleanly outside every family range', () => {
    const s = injectFamily(fam('galaxy-sf'), [4, 4, 5, 2, 0], 0.7123, { sigma: 1, seed: 2 });
    const r = refitNear(s, 9);
    expect(r.status).toBe('failed');
    expect(r.error).toMatch(/no template family/);
  });
});
