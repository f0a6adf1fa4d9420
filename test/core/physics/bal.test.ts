import { describe, expect, it } from 'vitest';
import { balIndices, measureBal, outflowKms, restOfOutflow } from '../../../src/core/physics/bal';
import { restData } from '../../../src/core/physics/restData';
import type { Spectrum } from '../../../src/core/types';

/** Normalised flux on 10 km/s pixels from 0 to 30,000 km/s: 0.5 inside [from, to), 1 elsewhere. */
function trough(from: number, to: number) {
  const v: number[] = [];
  const f: number[] = [];
  for (let c = 5; c < 30000; c += 10) {
    v.push(c);
    f.push(c > from && c < to ? 0.5 : 1);
  }
  return { v, f };
}

describe('balIndices(v, f) on constructed troughs (Weymann et al. 1991; Trump et al. 2006)', () => {
  it('a flat trough 0.5 deep from 5,000 to 15,000 km/s: BI = (1 - 0.5/0.9) x (10,000 - 2,000), AI = 0.5 x 10,000', () => {
    const { v, f } = trough(5000, 15000);
    const r = balIndices(v, f);
    // By hand: (1 - 0.5/0.9) = 0.444444...; x 8,000 km/s = 3,555.56 km/s. AI: 0.5 x 10,000 = 5,000 km/s.
    expect(r.biKms).toBeCloseTo(3555.556, 2);
    expect(r.aiKms).toBeCloseTo(5000, 6);
    expect(r.troughs).toHaveLength(1);
    expect(r.troughs[0]).toMatchObject({ vFromKms: 5000, vToKms: 15000, inBi: true });
    expect(r.troughs[0].depth).toBeCloseTo(0.5, 12);
  });
  it('a trough starting below 3,000 km/s counts for BI only from 3,000 + 2,000 km/s', () => {
    const { v, f } = trough(1000, 9000);
    // By hand: BI = 0.444444 x (9,000 - 5,000) = 1,777.78; AI = 0.5 x 8,000 = 4,000.
    expect(balIndices(v, f).biKms).toBeCloseTo(1777.778, 2);
    expect(balIndices(v, f).aiKms).toBeCloseTo(4000, 6);
  });
  it('a 1,500 km/s trough has AI but no BI; an 800 km/s one has neither', () => {
    expect(balIndices(...Object.values(trough(6000, 7500)) as [number[], number[]])).toMatchObject({ biKms: 0, aiKms: 750 });
    const narrow = balIndices(...Object.values(trough(6000, 6800)) as [number[], number[]]);
    expect(narrow).toMatchObject({ biKms: 0, aiKms: 0, troughs: [] });
  });
  it('outflowKms and restOfOutflow invert each other (relativistic Doppler)', () => {
    const l = restOfOutflow(20000, 1549.06);
    expect(outflowKms(l, 1549.06)).toBeCloseTo(20000, 6);
    expect(l).toBeLessThan(1549.06);
  });
});

describe('measureBal(spectrum) on a constructed power-law quasar with a flat trough', () => {
  it('finds the hand-computed BI within 2 % (pixel edges and the 3-pixel smoothing blur the trough ends)', () => {
    const z = 2.4;
    const n = 5000;
    const wl = new Float64Array(n);
    const flux = new Float64Array(n);
    for (let i = 0; i < n; i++) {
      wl[i] = 3600 * 10 ** (i * 1e-4);
      const rest = wl[i] / (1 + z);
      const v = outflowKms(rest, 1549.06);
      flux[i] = 10 * (rest / 1700) ** -1.5 * (v > 5000 && v < 15000 ? 0.5 : 1);
    }
    const s: Spectrum = { file: 't', format: 'test', wavelengthA: wl, flux, ivar: new Float64Array(n).fill(1e6), mask: new Uint8Array(n), meta: {} };
    const r = measureBal(restData(s, z));
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect(r.continuum.alpha).toBeCloseTo(-1.5, 2);
    expect(r.biKms).toBeGreaterThan(3555.556 * 0.98);
    expect(r.biKms).toBeLessThan(3555.556 * 1.02);
    expect(r.aiKms).toBeGreaterThan(5000 * 0.98);
    expect(r.aiKms).toBeLessThan(5000 * 1.02);
  });
  it('refuses a spectrum that does not reach the C IV absorption range, saying so', () => {
    const n = 100;
    const s: Spectrum = { file: 't', format: 'test', wavelengthA: Float64Array.from({ length: n }, (_, i) => 6000 + i), flux: new Float64Array(n).fill(1), ivar: new Float64Array(n).fill(1), mask: new Uint8Array(n), meta: {} };
    const r = measureBal(restData(s, 0.5));
    expect(r).toEqual({ ok: false, reason: expect.stringContaining('not covered') });
  });
});
