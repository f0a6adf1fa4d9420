import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { measureQuasar } from '../../../src/core/physics/measure';
import { quasarQuantities } from '../../../src/core/physics/quantities';
import { troughMaskRangesA, physicsModelAt } from '../../../src/core/physics/draw';
import { maskRanges } from '../../../src/core/physics/maskRanges';
import { createRng } from '../../../src/core/sim/prng';
import { fitSpectrum, refitNear } from '../../../src/core/engine';
import { readSpectrum } from '../../../src/core/io/readSpectrum';
import { C_KMS } from '../../../src/core/constants';
import type { Spectrum } from '../../../src/core/types';

const FLAT_70_03 = { h0: 70, omegaM: 0.3, omegaK: 0, omegaR: 0 };
/** astropy 5.2.1 FlatLambdaCDM(70, 0.3, Tcmb0=0).luminosity_distance(1) (docs/reference.md sec. 4, case A). */
const DL_Z1_MPC = 6607.66;
const MPC_CM = 3.085677581491367e24;

/**
 * A simulated quasar at z = 1 (invented, seeded): power law f_lambda ~ lambda^-1.5 with
 * lambda L5100 = 1e45 erg/s, broad Mg II (FWHM 4000 km/s) and H-beta (FWHM 5000 km/s)
 * single Gaussians, on a BOSS-like log grid, noise at S/N ~ 25 per pixel.
 */
function simulatedQuasar(seed: number): Spectrum {
  const z = 1;
  const a5100 = 1e45 / (4 * Math.PI * (DL_Z1_MPC * MPC_CM) ** 2 * (1 + z) * 5100) / 1e-17; // file units at 5100 A rest
  const n = 4600;
  const rng = createRng(seed);
  const wl = new Float64Array(n);
  const flux = new Float64Array(n);
  const ivar = new Float64Array(n);
  const g = (rest: number, centre: number, fwhm: number) => Math.exp(-0.5 * ((C_KMS * Math.log(rest / centre)) / (fwhm / 2.3548200450309493)) ** 2);
  for (let i = 0; i < n; i++) {
    wl[i] = 3600 * 10 ** (i * 1e-4);
    const rest = wl[i] / (1 + z);
    const cont = a5100 * (rest / 5100) ** -1.5;
    const model = cont + 1.0 * a5100 * 1.8 * g(rest, 2798.75, 4000) + 0.8 * a5100 * g(rest, 4862.68, 5000);
    const sigma = cont / 25;
    flux[i] = model + sigma * rng.gaussian();
    ivar[i] = 1 / (sigma * sigma);
  }
  return { file: 'sim', format: 'test', wavelengthA: wl, flux, ivar, mask: new Uint8Array(n), meta: { fluxUnit: '1e-17 erg/s/cm2/A' } };
}

describe('measureQuasar on simulated quasars (injected widths and luminosity)', () => {
  const seeds = [11, 12, 13];
  const runs = seeds.map((s) => measureQuasar(simulatedQuasar(s), 1));
  it('recovers the injected Mg II and H-beta FWHM within 4 %', () => {
    for (const m of runs) {
      const mg = m.lines.find((l) => l.id === 'MgII')!;
      const hb = m.lines.find((l) => l.id === 'Hbeta')!;
      expect(mg.ok).toBe(true);
      expect(hb.ok).toBe(true);
      expect(Math.abs(mg.fwhmKms! / 4000 - 1)).toBeLessThan(0.04);
      expect(Math.abs(hb.fwhmKms! / 5000 - 1)).toBeLessThan(0.04);
      expect(mg.fwhmErrKms!).toBeGreaterThan(0);
      // A single Gaussian: dispersion = FWHM / 2.3548 (exact for a Gaussian).
      expect(Math.abs(hb.sigmaKms! / (5000 / 2.35482) - 1)).toBeLessThan(0.06);
    }
  });
  it('recovers the injected lambda L5100 = 1e45 erg/s within 0.02 dex, with a positive error', () => {
    for (const m of runs) {
      const L = quasarQuantities(m, FLAT_70_03).logLambdaL[5100] as { value: number; err: number };
      expect(Math.abs(L.value - 45)).toBeLessThan(0.02);
      expect(L.err).toBeGreaterThan(0);
    }
  });
  it('the errors are honest: the spread of the three FWHMs is within 3x the quoted error', () => {
    const f = runs.map((m) => m.lines.find((l) => l.id === 'Hbeta')!.fwhmKms!);
    const mean = f.reduce((a, b) => a + b) / f.length;
    const err = runs[0].lines.find((l) => l.id === 'Hbeta')!.fwhmErrKms!;
    for (const x of f) expect(Math.abs(x - mean)).toBeLessThan(3 * err);
  });
  it('gives the same numbers for the same spectrum (deterministic: no random draws unless asked, and those seeded)', () => {
    expect(measureQuasar(simulatedQuasar(11), 1)).toEqual(runs[0]);
  });
  it('draws the fitted lines on the observed grid, NaN outside their ranges', () => {
    const s = simulatedQuasar(11);
    const model = physicsModelAt(runs[0], s.wavelengthA);
    const at = (obs: number) => model[s.wavelengthA.findIndex((w) => w >= obs)];
    expect(Number.isNaN(at(4000))).toBe(true);
    expect(at(2798.75 * 2)).toBeGreaterThan(0);
  });
});

describe('real files (test/data/real-spectra): SDSS calibrated, CSV without a unit', () => {
  it('a CSV copy states no unit: no luminosity, the reason given, but widths still measured', () => {
    const name = 'spec-3655-55240-0436';
    const s = readSpectrum(new Uint8Array(readFileSync(`test/data/real-spectra/csv/${name}.csv`)), `${name}.csv`);
    const m = measureQuasar(s, 0.876162, { draws: 2 });
    expect(m.fluxScale).toEqual({ ok: false, reason: expect.stringContaining('no flux unit') });
    const q = quasarQuantities(m, FLAT_70_03);
    expect(q.logLambdaL[3000]).toEqual({ reason: expect.stringContaining('no flux unit') });
    expect(m.lines.find((l) => l.id === 'MgII')!.ok).toBe(true);
  });
});

describe('masking the troughs of the broad-absorption quasar spec-3655-55240-0110 (catalogue z 2.3935)', () => {
  // Not tuned on: a record of what masking does. Survey catalogue z 2.3935 (MANIFEST.tsv).
  const name = 'spec-3655-55240-0110';
  const s = readSpectrum(new Uint8Array(readFileSync(`test/data/real-spectra/fits/${name}.fits`)), name);
  const m = measureQuasar(s, 2.3935, { draws: 2 });
  it('finds C IV troughs there, counted by BI', () => {
    expect(m.absorption.ok).toBe(true);
    expect(m.absorption.biKms!).toBeGreaterThan(0);
    expect(m.absorption.troughs.some((t) => t.inBi)).toBe(true);
  });
  it('a whole-range fit with those troughs masked moves from the survey-pipeline-like failure toward the catalogue z', () => {
    const masked = maskRanges(s, troughMaskRangesA(m));
    const dz = (r: { z: number }) => Math.abs(r.z - 2.3935) / 3.3935;
    const plain = fitSpectrum(s);
    const withMask = fitSpectrum(masked);
    const nearMasked = refitNear(masked, 2.3935);
    console.log(`spec-3655-55240-0110: full fit ${plain.z.toFixed(4)} plain, ${withMask.z.toFixed(4)} with troughs masked; refit near 2.3935 with them masked ${nearMasked.z.toFixed(4)}`);
    expect(dz(plain)).toBeGreaterThan(0.1); // the known failure (README: broad absorption is the weak spot)
    expect(dz(withMask)).toBeLessThan(dz(plain));
    expect(dz(nearMasked)).toBeLessThan(0.01);
  });
});
