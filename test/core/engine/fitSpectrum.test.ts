import { describe, expect, it } from 'vitest';
import { fitSpectrum, refitNear, CURVE_MAX_POINTS, TEMPLATE_SET_ID, ENGINE_VERSION, FitWorkspace } from '../../../src/core/engine';
import { dvKms, observe } from './synth';
import type { Spectrum } from '../../../src/core/types';
import { createRng } from '../../../src/core/sim/prng';
import { GALAXY_FLOOR_KMS } from '../../../src/core/engine/errorFloor';

describe('fitSpectrum: result contract', () => {
  const s = observe('kc96_starb3', 0.2512, 12, 3);
  const r = fitSpectrum(s);
  it('fills every field, with curves of at most CURVE_MAX_POINTS points whose lowest value is 0', () => {
    expect(r.status).toBe('ok');
    expect(r.templateSet).toBe(TEMPLATE_SET_ID);
    expect(r.engineVersion).toBe(ENGINE_VERSION);
    expect(r.candidates[0].z).toBe(r.z);
    expect(r.candidates[0].deltaChi2).toBe(0);
    expect(r.curves.map((c) => c.family).sort()).toEqual(['galaxy', 'qso', 'star']);
    let lowest = Infinity;
    for (const c of r.curves) {
      expect(c.z.length).toBeLessThanOrEqual(CURVE_MAX_POINTS);
      for (const v of c.deltaChi2) lowest = Math.min(lowest, v);
    }
    expect(lowest).toBe(0);
    expect(r.score).toBeGreaterThanOrEqual(0);
    expect(r.score).toBeLessThanOrEqual(1);
    expect(r.lines.length).toBeGreaterThan(0);
    expect(r.masked?.find((m) => m.reason === 'edge')?.pixels).toBeGreaterThan(0);
  });
  it('keeps the best solution of every class among the candidates, so a star that lost is one step away', () => {
    const classes = new Set(r.candidates.map((c) => c.class));
    expect(classes).toEqual(new Set(['galaxy', 'qso', 'star']));
  });
  it('gives the same result with a fresh workspace and with a reused one', () => {
    const ws = new FitWorkspace();
    fitSpectrum(observe('pickles_uk026_g2v', 0, 20, 1), { workspace: ws });
    const again = fitSpectrum(s, { workspace: ws });
    expect(again.z).toBe(r.z);
    expect(again.candidates.map((c) => c.chi2)).toEqual(r.candidates.map((c) => c.chi2));
  });
});

describe('fitSpectrum: bad and empty data', () => {
  it('estimates the noise when ivar is null and says so', () => {
    const s = observe('kc96_elliptical', 0.3, 15, 2);
    const r = fitSpectrum({ ...s, ivar: null });
    expect(r.noiseEstimated).toBe(true);
    expect(Math.abs(r.z - 0.3) / 1.3).toBeLessThan(0.003);
  });
  it('returns status failed with a one-line error, and does not throw, when too little is usable', () => {
    const s = observe('kc96_elliptical', 0.3, 15, 2);
    const r = fitSpectrum({ ...s, mask: s.mask.map((_, i) => (i < 30 ? 0 : 1)) });
    expect(r.status).toBe('failed');
    expect(r.error).toMatch(/usable pixels/);
    expect(r.error).not.toMatch(/\n/);
  });
  it('class is unknown for pure noise on a smooth continuum', () => {
    const rng = createRng(8);
    const n = 3000;
    const wl = Float64Array.from({ length: n }, (_, i) => 4000 * 10 ** (i * 1e-4));
    const flux = Float64Array.from(wl, (w) => 5 + w / 4000 + rng.gaussian());
    const s: Spectrum = { file: 'noise.csv', format: 'test', wavelengthA: wl, flux, ivar: new Float64Array(n).fill(1), mask: new Uint8Array(n), meta: {} };
    const r = fitSpectrum(s);
    expect(r.class).toBe('unknown');
    expect(r.confidence).toBe('none');
  });
});

describe('fitSpectrum: artifacts do not move the answer', () => {
  it('a red galaxy keeps its redshift with a zero-filled end (non-zero ivar), an edge cliff and a dead arm', () => {
    const z = 0.3821;
    const clean = observe('kc96_s0', z, 10, 5);
    const flux = Float64Array.from(clean.flux);
    const n = flux.length;
    for (let i = n - 25; i < n; i++) flux[i] = 0; // dead end read as exact zeros
    for (let i = 0; i < 30; i++) flux[i] *= 4; // cliff at the blue edge
    const mid = n >> 1;
    for (let i = mid; i < mid + 400; i++) flux[i] = 1.234; // a dead arm holding one value
    const bad = { ...clean, flux };
    const r = fitSpectrum(bad);
    expect(r.class).toBe('galaxy');
    expect(Math.abs(dvKms(z, r.z))).toBeLessThan(300);
    const reasons = new Map((r.masked ?? []).map((m) => [m.reason, m.pixels]));
    expect(reasons.get('identical-run')).toBe(425);
    expect(reasons.get('roll-off')).toBeGreaterThan(0);
    expect(reasons.get('edge-step')).toBeGreaterThan(0);
  });
});

describe('fitSpectrum: z error', () => {
  it('its statistical part (the class floor taken out in quadrature) matches the scatter of z over seeded noise realisations (ratio 0.6..1.6) for a galaxy', () => {
    const zs: number[] = [];
    const errs: number[] = [];
    for (let seed = 1; seed <= 12; seed++) {
      const r = fitSpectrum(observe('kc96_starb1', 0.15, 6, 100 + seed));
      zs.push(r.z);
      errs.push(r.zErr);
    }
    const mean = zs.reduce((a, b) => a + b, 0) / zs.length;
    const sd = Math.sqrt(zs.reduce((a, b) => a + (b - mean) ** 2, 0) / (zs.length - 1));
    const medErr = [...errs].sort((a, b) => a - b)[errs.length >> 1];
    const floor = (1.15 * GALAXY_FLOOR_KMS) / 299792.458;
    const stat = Math.sqrt(medErr * medErr - floor * floor);
    expect(sd / stat).toBeGreaterThan(0.6);
    expect(sd / stat).toBeLessThan(1.6);
  });
});

describe('refitNear(spectrum, zCentre)', () => {
  // BC03 models sit on the laboratory zero point (published/README.md), so the injected z is the truth to a few km/s
  const s = observe('bc03_ssp_z0.02_chabrier_4.75gyr', 0.2205, 10, 9);
  it('keeps the best solution within +-3000 km/s of zCentre and reports a negative gap when a better one exists', () => {
    const r = refitNear(s, 0.5);
    expect(r.status).toBe('ok');
    expect(Math.abs(dvKms(0.5, r.z))).toBeLessThan(3000);
    expect(r.chi2Gap).toBeLessThan(0);
  });
  it('finds the right solution again when asked near it', () => {
    const r = refitNear(s, 0.221);
    expect(Math.abs(dvKms(0.2205, r.z))).toBeLessThan(100);
  });
  it('fails cleanly outside every family range', () => {
    const r = refitNear(s, 9);
    expect(r.status).toBe('failed');
    expect(r.error).toMatch(/no template family covers/);
  });
});
