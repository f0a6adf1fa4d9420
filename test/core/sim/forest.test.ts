import { describe, it, expect } from 'vitest';
import { tauEff, forestTransmission, forestAmplitude, LYA_REST_A, LYMAN_LIMIT_REST_A } from '../../../src/core/sim/forest';
import { createRng } from '../../../src/core/sim/prng';
import { makeGrid, DEFAULT_GRID } from '../../../src/core/sim/grid';

describe('tauEff', () => {
  // Check values: Faucher-Giguere et al. 2008 (ApJ 688, 85) power law, as tabulated in docs/reference.md sec. 6.
  it.each([
    [2, 0.1335, 0.875],
    [2.5, 0.2444, 0.7832],
    [3, 0.4124, 0.662],
    [3.5, 0.6544, 0.5197],
    [4, 0.9891, 0.3719],
  ])('tauEff(%f) = %f, F = %f', (z, tau, f) => {
    expect(Math.abs(tauEff(z) - tau)).toBeLessThan(1e-4);
    expect(Math.abs(Math.exp(-tauEff(z)) - f)).toBeLessThan(1e-4);
  });
});

describe('forestAmplitude', () => {
  it('grows with tau_eff', () => {
    expect(forestAmplitude(0.5)).toBeGreaterThan(forestAmplitude(0.2));
    expect(forestAmplitude(2)).toBeGreaterThan(forestAmplitude(0.5));
  });
});

/** Mean simulated transmission of pixels whose Ly-alpha absorber redshift lies within zAbs +- dz. */
function meanForest(zQso: number, zAbs: number, dz: number, nReal: number, seed: number): number {
  const wl = makeGrid(DEFAULT_GRID);
  let s = 0;
  let c = 0;
  for (let k = 0; k < nReal; k++) {
    const t = forestTransmission(wl, zQso, createRng(seed + k), { resolutionR: 2000 });
    for (let i = 0; i < wl.length; i++) {
      const za = wl[i] / LYA_REST_A - 1;
      if (Math.abs(za - zAbs) <= dz) {
        s += t[i];
        c++;
      }
    }
  }
  return s / c;
}

describe('forestTransmission', () => {
  // Mean over 300 realisations and ~60 pixels each; per-pixel scatter of F is ~0.3
  // with ~3-pixel correlations, so the standard error is ~0.004: tolerance 0.015.
  // Target: exp(-tau_eff), Faucher-Giguere et al. 2008 via docs/reference.md sec. 6
  // (the mean of exp(-tau) over zAbs +- 0.03 differs from F(zAbs) by < 0.001).
  it.each([
    [2.8, 2.5, 0.7832],
    [3.4, 3, 0.662],
    [4.4, 4, 0.3719],
  ])('quasar at z=%f: mean transmission at zAbs=%f is %f', (zQso, zAbs, f) => {
    const m = meanForest(zQso, zAbs, 0.03, 300, 1000);
    expect(Math.abs(m - f)).toBeLessThan(0.015);
  });

  it('fluctuates from pixel to pixel (absorbers), not a flat exp(-tau_eff)', () => {
    const wl = makeGrid(DEFAULT_GRID);
    const t = forestTransmission(wl, 3.4, createRng(1), { resolutionR: 2000 });
    const sel = Array.from(t).filter((_, i) => Math.abs(wl[i] / LYA_REST_A - 4) < 0.1);
    const mean = sel.reduce((a, b) => a + b, 0) / sel.length;
    const sd = Math.sqrt(sel.reduce((a, b) => a + (b - mean) ** 2, 0) / sel.length);
    expect(sd).toBeGreaterThan(0.1);
  });

  it('is 1 redward of Ly-alpha and 0 below a black Lyman limit', () => {
    const wl = makeGrid(DEFAULT_GRID);
    const z = 4;
    const t = forestTransmission(wl, z, createRng(2), { resolutionR: 2000, pLymanLimitBlack: 1 });
    for (let i = 0; i < wl.length; i++) {
      if (wl[i] > LYA_REST_A * (1 + z) + 20) expect(t[i]).toBe(1);
      if (wl[i] < LYMAN_LIMIT_REST_A * (1 + z) - 20) expect(t[i]).toBe(0);
    }
  });

  it('leaves a low-redshift quasar untouched', () => {
    const wl = makeGrid(DEFAULT_GRID);
    const t = forestTransmission(wl, 1.5, createRng(3), { resolutionR: 2000 });
    expect(Array.from(t).every((v) => v === 1)).toBe(true);
  });
});
