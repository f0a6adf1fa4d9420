import { describe, expect, it } from 'vitest';
import { binLogSpectrum, pixelEdgesA, resampleToLogGrid } from '../../../src/core/engine/resample';
import { DLOG10 } from '../../../src/core/engine/logGrid';
import { createRng } from '../../../src/core/sim/prng';

/** The simulator's PRNG with the short names this file uses. */
function makeRng(seed: number) {
  const r = createRng(seed);
  return { next: () => r.next(), gauss: () => r.gaussian() };
}
import type { Spectrum } from '../../../src/core/types';

function linearSpectrum(n: number, start: number, step: number, f: (l: number) => number, ivar: number | null): Spectrum {
  const wl = new Float64Array(n);
  const flux = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    wl[i] = start + i * step;
    flux[i] = f(wl[i]);
  }
  return { file: 't', format: 'test', wavelengthA: wl, flux, ivar: ivar === null ? null : new Float64Array(n).fill(ivar), mask: new Uint8Array(n), meta: {} };
}

describe('resampleToLogGrid', () => {
  it('conserves the flux integral sum f dlambda over fully covered pixels', () => {
    // flux conservation of pixel-overlap rebinning (common practice)
    const s = linearSpectrum(3000, 4000, 1.3, (l) => 1 + Math.sin(l / 37) + 5 * Math.exp(-0.5 * ((l - 5000) / 3) ** 2), 4);
    const out = resampleToLogGrid(s);
    const e = pixelEdgesA(s.wavelengthA);
    // integrate output over its interior pixels, and input over the same span
    let outInt = 0;
    const j0 = 2;
    const j1 = out.flux.length - 3;
    for (let j = j0; j <= j1; j++) {
      const lo = Math.pow(10, (out.k0 + j - 0.5) * DLOG10);
      const hi = Math.pow(10, (out.k0 + j + 0.5) * DLOG10);
      outInt += out.flux[j] * (hi - lo);
    }
    const A = Math.pow(10, (out.k0 + j0 - 0.5) * DLOG10);
    const B = Math.pow(10, (out.k0 + j1 + 0.5) * DLOG10);
    let inInt = 0;
    for (let i = 0; i < s.flux.length; i++) {
      const o = Math.min(B, e[i + 1]) - Math.max(A, e[i]);
      if (o > 0) inInt += s.flux[i] * o;
    }
    expect(outInt / inInt).toBeCloseTo(1, 12);
  });

  it('propagates variance as sum a^2 var (checked against a direct computation for one pixel)', () => {
    // var of a weighted mean: sum a_i^2 sigma_i^2 (error propagation, common practice)
    const s = linearSpectrum(400, 5000, 0.9, () => 1, 1);
    for (let i = 0; i < 400; i++) s.ivar![i] = 1 + (i % 7);
    const out = resampleToLogGrid(s);
    const j = 100;
    const lo = Math.pow(10, (out.k0 + j - 0.5) * DLOG10);
    const hi = Math.pow(10, (out.k0 + j + 0.5) * DLOG10);
    const e = pixelEdgesA(s.wavelengthA);
    let so = 0;
    let so2v = 0;
    for (let i = 0; i < 400; i++) {
      const o = Math.min(hi, e[i + 1]) - Math.max(lo, e[i]);
      if (o <= 0) continue;
      so += o;
      so2v += (o * o) / s.ivar![i];
    }
    expect(1 / out.ivar[j]).toBeCloseTo(so2v / (so * so), 12);
  });

  it('equals the slow obvious rebinning (edges by Math.pow per pixel, every input pixel tried) bit for bit, twice in a row', () => {
    // keep-the-slow-version rule: the fast path takes output edges from a per-thread table and reuses its scratch
    const rng = makeRng(3);
    const s = linearSpectrum(1500, 3700, 2.1, (l) => 1 + 0.2 * Math.sin(l / 50), 1);
    for (let i = 0; i < 1500; i++) {
      s.flux[i] += 0.1 * rng.gauss();
      s.ivar![i] = rng.next() < 0.03 ? 0 : 0.5 + rng.next();
      if (rng.next() < 0.02) s.mask[i] = 1;
    }
    const e = pixelEdgesA(s.wavelengthA);
    const slow = (sp: Spectrum) => {
      const k0 = Math.round(Math.log10(sp.wavelengthA[0]) / DLOG10);
      const k1 = Math.round(Math.log10(sp.wavelengthA[sp.wavelengthA.length - 1]) / DLOG10);
      const flux = new Float64Array(k1 - k0 + 1);
      const ivar = new Float64Array(k1 - k0 + 1);
      for (let j = 0; j < flux.length; j++) {
        const lo = Math.pow(10, (k0 + j - 0.5) * DLOG10);
        const hi = Math.pow(10, (k0 + j + 0.5) * DLOG10);
        let so = 0, sof = 0, so2v = 0;
        for (let i = 0; i < sp.flux.length; i++) {
          if (sp.mask[i] !== 0 || !(sp.ivar![i] > 0) || !Number.isFinite(sp.flux[i])) continue;
          const o = Math.min(hi, e[i + 1]) - Math.max(lo, e[i]);
          if (o <= 0) continue;
          so += o;
          sof += o * sp.flux[i];
          so2v += (o * o) / sp.ivar![i];
        }
        if (so >= 0.5 * (hi - lo) && so2v > 0) {
          flux[j] = sof / so;
          ivar[j] = (so * so) / so2v;
        }
      }
      return { k0, flux, ivar };
    };
    const ref = slow(s);
    for (let round = 0; round < 2; round++) {
      const out = resampleToLogGrid(s);
      expect(out.k0).toBe(ref.k0);
      expect(Array.from(out.flux)).toEqual(Array.from(ref.flux));
      expect(Array.from(out.ivar)).toEqual(Array.from(ref.ivar));
      // a longer spectrum in between must not leave anything behind in the scratch
      resampleToLogGrid(linearSpectrum(4000, 3600, 1.7, () => 2, 1));
    }
  });

  it('gives masked, NaN and ivar = 0 pixels zero weight', () => {
    const s = linearSpectrum(2000, 4000, 0.5, () => 2, 1);
    for (let i = 500; i < 600; i++) s.mask[i] = 1;
    s.flux[800] = NaN;
    for (let i = 1000; i < 1100; i++) s.ivar![i] = 0;
    const out = resampleToLogGrid(s);
    let zeroW = 0;
    for (let j = 0; j < out.flux.length; j++) {
      if (out.ivar[j] === 0) zeroW++;
      else expect(out.flux[j]).toBeCloseTo(2, 12);
    }
    // 2 x 50 A at ~1.0 A per log pixel near 4300-4500 A (lambda ln10 1e-4) -> ~100 empty pixels, +-1 at each edge
    expect(zeroW).toBeGreaterThanOrEqual(95);
    expect(zeroW).toBeLessThanOrEqual(105);
  });

  it('estimates the noise from the data when ivar is null, and says so', () => {
    // robust scatter of first differences / sqrt(2) estimates sigma for white noise (common practice)
    const { gauss } = makeRng(1);
    const n = 4000;
    const wl = new Float64Array(n);
    const flux = new Float64Array(n);
    for (let i = 0; i < n; i++) {
      wl[i] = Math.pow(10, 3.6 + i * DLOG10);
      flux[i] = 10 + 0.5 * gauss();
    }
    const s: Spectrum = { file: 'n', format: 'test', wavelengthA: wl, flux, ivar: null, mask: new Uint8Array(n), meta: {} };
    const out = resampleToLogGrid(s);
    expect(out.noiseEstimated).toBe(true);
    // block estimates from ~320 differences (MAD efficiency 37%): sigma within ~15% of 0.5
    for (const j of [100, 2000, 3900]) {
      expect(1 / Math.sqrt(out.ivar[j])).toBeGreaterThan(0.42);
      expect(1 / Math.sqrt(out.ivar[j])).toBeLessThan(0.58);
    }
  });

  it('binLogSpectrum combines pixel pairs on absolute indices with summed inverse variance', () => {
    const ls = { k0: 35001, dlog10: DLOG10, flux: Float64Array.from([1, 2, 3, 4, 5]), ivar: Float64Array.from([1, 1, 2, 0, 1]), noiseEstimated: false };
    const b = binLogSpectrum(ls, 2);
    // absolute 35001 is alone in bin 17500; (35002, 35003) -> bin 17501; (35004, 35005) -> 17502
    expect(b.k0).toBe(17500);
    expect(Array.from(b.ivar)).toEqual([1, 3, 1]);
    expect(b.flux[1]).toBeCloseTo((2 + 2 * 3) / 3, 14);
    expect(b.flux[2]).toBe(5);
  });
});
