import { describe, it, expect } from 'vitest';
import { simulateSpectrum, type SimParams } from '../../../src/core/sim/simulateSpectrum';
import { createRng } from '../../../src/core/sim/prng';
import { SKY_LINES } from '../../../src/core/sim/sky';

const clean: Partial<SimParams> = { skyResiduals: false, badColumns: false };

describe('simulateSpectrum', () => {
  it('is deterministic for a seed', () => {
    const p: SimParams = { class: 'qso', z: 3.1, snr: 5, objectId: 'T-1' };
    const a = simulateSpectrum(p, createRng(11));
    const b = simulateSpectrum(p, createRng(11));
    expect(Array.from(a.spectrum.flux)).toEqual(Array.from(b.spectrum.flux));
    expect(Array.from(a.spectrum.ivar!)).toEqual(Array.from(b.spectrum.ivar!));
    const c = simulateSpectrum(p, createRng(12));
    expect(Array.from(c.spectrum.flux)).not.toEqual(Array.from(a.spectrum.flux));
  });

  it('returns a spectrum that meets the Spectrum invariants', () => {
    const { spectrum: s } = simulateSpectrum({ class: 'galaxy-passive', z: 0.4, snr: 8 }, createRng(1));
    const n = s.wavelengthA.length;
    expect(s.flux.length).toBe(n);
    expect(s.ivar!.length).toBe(n);
    expect(s.mask.length).toBe(n);
    for (let i = 1; i < n; i++) expect(s.wavelengthA[i]).toBeGreaterThan(s.wavelengthA[i - 1]);
    expect(s.meta.objectId).toBe('SIM-0000');
  });

  it.each([2, 10, 40])('noise alone gives chi-square ~1 per pixel with the stated ivar (snr %f)', (snr) => {
    for (const cls of ['qso', 'galaxy-sf', 'star'] as const) {
      const { spectrum: s, truth } = simulateSpectrum({ class: cls, z: cls === 'star' ? 0 : 1.2, snr, ...clean }, createRng(snr * 7 + cls.length));
      let chi2 = 0;
      const n = s.flux.length;
      for (let i = 0; i < n; i++) chi2 += (s.flux[i] - truth.noiseFree[i]) ** 2 * s.ivar![i];
      // chi2/n has sigma sqrt(2/n) = 0.022 for n = 4075: tolerance 4 sigma.
      expect(Math.abs(chi2 / n - 1)).toBeLessThan(0.09);
    }
  });

  it('median continuum / sigma equals the requested S/N', () => {
    const { spectrum: s, truth } = simulateSpectrum({ class: 'galaxy-sf', z: 0.2, snr: 7.5, ...clean }, createRng(4));
    const r = Array.from(truth.continuum, (c, i) => c * Math.sqrt(s.ivar![i])).sort((a, b) => a - b);
    // Sky lines only raise sigma on a few pixels, so the median is set by the continuum noise.
    expect(r[r.length >> 1]).toBeGreaterThan(7.5 * 0.98);
    expect(r[r.length >> 1]).toBeLessThan(7.5 * 1.02);
  });

  it('an emission line lands at (1+z) rest within a pixel', () => {
    const z = 0.3456;
    const { spectrum: s, truth } = simulateSpectrum({ class: 'galaxy-sf', z, snr: 20, noise: false, ...clean }, createRng(8));
    for (const [id, rest] of [['OIII_5008', 5008.24], ['Halpha', 6564.61], ['Hbeta', 4862.68]] as const) {
      const expected = (1 + z) * rest;
      let best = -1;
      let bestV = -Infinity;
      for (let i = 0; i < s.flux.length; i++) {
        if (Math.abs(s.wavelengthA[i] - expected) > 15) continue;
        const v = truth.noiseFree[i] - truth.continuum[i];
        if (v > bestV) {
          bestV = v;
          best = i;
        }
      }
      const width = s.wavelengthA[best + 1] - s.wavelengthA[best];
      expect(Math.abs(s.wavelengthA[best] - expected)).toBeLessThan(width);
      const line = truth.lines.find((l) => l.id === id)!;
      expect(line.observedA).toBeCloseTo(expected, 6);
    }
  });

  it('bad columns are masked with zero ivar', () => {
    const { spectrum: s } = simulateSpectrum({ class: 'star', z: 0, snr: 10 }, createRng(21));
    let bad = 0;
    for (let i = 0; i < s.mask.length; i++) {
      if (s.mask[i]) {
        bad++;
        expect(s.ivar![i]).toBe(0);
      }
    }
    expect(bad).toBeGreaterThan(0);
    expect(bad).toBeLessThanOrEqual(24);
  });

  it('sky-line residuals sit on the sky lines', () => {
    const { truth } = simulateSpectrum({ class: 'star', z: 0, snr: 10 }, createRng(5));
    const { spectrum: s } = simulateSpectrum({ class: 'star', z: 0, snr: 10 }, createRng(5));
    const i5578 = s.wavelengthA.findIndex((w) => w > 5578.89);
    expect(Math.abs(truth.skyResidual[i5578]) + Math.abs(truth.skyResidual[i5578 - 1])).toBeGreaterThan(0);
    // Far from any sky line (4500 A) there is no residual.
    const i4500 = s.wavelengthA.findIndex((w) => w > 4500);
    expect(SKY_LINES.every((l) => Math.abs(l.vacA - 4500) > 100)).toBe(true);
    expect(truth.skyResidual[i4500]).toBe(0);
  });

  it('accepts a linear grid and explicit pixel centres', () => {
    const a = simulateSpectrum({ class: 'qso', z: 2, snr: 10, grid: { kind: 'linear', startA: 3800, endA: 9000, stepA: 2 } }, createRng(1));
    expect(a.spectrum.wavelengthA.length).toBe(2601);
    const wl = Float64Array.from({ length: 100 }, (_, i) => 5000 + i);
    const b = simulateSpectrum({ class: 'star', z: 0, snr: 10, grid: wl }, createRng(1));
    expect(Array.from(b.spectrum.wavelengthA)).toEqual(Array.from(wl));
  });

  it('telluric bands dim the O2 A band', () => {
    const p: SimParams = { class: 'star', starType: 'G', z: 0, snr: 10, noise: false, ...clean };
    const a = simulateSpectrum({ ...p, telluric: true }, createRng(9));
    const i = a.spectrum.wavelengthA.findIndex((w) => w > 7640);
    expect(a.truth.noiseFree[i] / a.truth.continuum[i]).toBeLessThan(0.8);
  });
});
