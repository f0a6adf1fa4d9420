import { describe, expect, it } from 'vitest';
import { estimateNoiseSigma, lowerIndex, pixelWidthA, pixelWindow } from '../../../../src/core/engine/lines/pixelWindow';
import type { Spectrum } from '../../../../src/core/types';
import { seededNormal, synthSpectrum } from './testKit';

describe('lowerIndex', () => {
  it('agrees with a linear scan (slow, obvious version)', () => {
    const wl = Float64Array.from({ length: 57 }, (_, i) => 4000 + i * i * 0.7);
    for (let v = 3990; v < 6300; v += 13.3) {
      let slow = 0;
      while (slow < wl.length && wl[slow] < v) slow++;
      expect(lowerIndex(wl, v)).toBe(slow);
    }
    expect(lowerIndex(wl, wl[10])).toBe(10);
  });
  it('pixelWidthA is the local grid step', () => {
    const wl = Float64Array.from({ length: 10 }, (_, i) => 5000 + 2 * i);
    expect(pixelWidthA(wl, 0)).toBe(2);
    expect(pixelWidthA(wl, 5)).toBe(2);
    expect(pixelWidthA(wl, 9)).toBe(2);
  });
});

describe('estimateNoiseSigma (DER_SNR, Stoehr et al. 2008)', () => {
  it('recovers white-noise sigma on a sloped continuum within 10%', () => {
    const s = synthSpectrum({ lambdaMinA: 4000, lambdaMaxA: 6000, continuum: (l) => 10 + 0.01 * (l - 4000), lines: [], noise: 0.5, seed: 2 });
    const sigma = estimateNoiseSigma(s, 0, s.flux.length);
    expect(sigma / 0.5).toBeGreaterThan(0.9);
    expect(sigma / 0.5).toBeLessThan(1.1);
  });
  it('is NaN when there are too few good pixels', () => {
    const s = synthSpectrum({ lambdaMinA: 4000, lambdaMaxA: 4002, continuum: () => 1, lines: [], noise: 0.5, seed: 2 });
    expect(estimateNoiseSigma(s, 0, s.flux.length)).toBeNaN();
  });
});

describe('pixelWindow', () => {
  const n = 100;
  const rnd = seededNormal(4);
  const base: Spectrum = {
    file: 't', format: 'test', wavelengthA: Float64Array.from({ length: n }, (_, i) => 5000 + i),
    flux: Float64Array.from({ length: n }, () => 3 + 0.2 * rnd()), ivar: new Float64Array(n).fill(25),
    mask: new Uint8Array(n), meta: {},
  };

  it('gives zero weight to masked, NaN-flux and zero-ivar pixels', () => {
    const s = { ...base, flux: Float64Array.from(base.flux), mask: Uint8Array.from(base.mask), ivar: Float64Array.from(base.ivar!) };
    s.mask[20] = 1;
    s.flux[21] = NaN;
    s.ivar[22] = 0;
    const win = pixelWindow(s, 5010, 5030);
    expect(win.start).toBe(10);
    expect(win.xA.length).toBe(21);
    expect([win.w[10], win.w[11], win.w[12]]).toEqual([0, 0, 0]);
    expect(win.w[9]).toBe(25);
    expect(win.nGood).toBe(18);
    expect(win.noiseEstimated).toBe(false);
  });

  it('estimates a uniform weight from the scatter when ivar is null', () => {
    const win = pixelWindow({ ...base, ivar: null }, 5030, 5060);
    expect(win.noiseEstimated).toBe(true);
    const sigma = 1 / Math.sqrt(win.w[0]);
    expect(sigma / 0.2).toBeGreaterThan(0.75); // true sigma 0.2, from ~100 pixels
    expect(sigma / 0.2).toBeLessThan(1.25);
    expect(win.w.every((v) => v === win.w[0])).toBe(true);
  });
});
