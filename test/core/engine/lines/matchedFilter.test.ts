import { describe, expect, it } from 'vitest';
import {
  bestFilterHit, bestFilterHitStrided, continuumValue, filterAt, fitClippedContinuum, fitContinuum, noiseScale,
} from '../../../../src/core/engine/lines/matchedFilter';
import { seededNormal } from './testKit';

const x = Float64Array.from({ length: 201 }, (_, i) => 6000 + i * 0.5);
const ones = new Float64Array(x.length).fill(1);
const quad = (v: number): number => 3 + 0.02 * (v - 6050) - 1e-4 * (v - 6050) ** 2;
const gauss = (v: number, c: number, s: number): number => Math.exp(-0.5 * ((v - c) / s) ** 2);

describe('fitContinuum / fitClippedContinuum', () => {
  it('recovers an exact quadratic and an exact line (least squares on exact data)', () => {
    const y = x.map(quad);
    const q = fitContinuum(x, y, ones, () => true, 6050, 2)!;
    expect(q.coef[0]).toBeCloseTo(3, 9);
    expect(q.coef[1]).toBeCloseTo(0.02, 11);
    expect(q.coef[2]).toBeCloseTo(-1e-4, 12);
    const l = fitContinuum(x, x.map((v) => 1 + 0.5 * (v - 6000)), ones, () => true, 6000, 1)!;
    expect(continuumValue(l, 6070)).toBeCloseTo(36, 9);
  });

  it('lowers the degree when the points cannot carry it, and gives null with no points', () => {
    const y = x.map(quad);
    const one = fitContinuum(x, y, ones, (k) => k === 7, 6050, 2)!;
    expect(one.coef).toHaveLength(1);
    expect(one.coef[0]).toBeCloseTo(y[7], 12);
    expect(fitContinuum(x, y, ones, () => false, 6050, 1)).toBeNull();
  });

  it('clipping ignores a strong spike that drags the plain fit', () => {
    const y = x.map(quad);
    y[100] += 500;
    const plain = fitContinuum(x, y, ones, () => true, 6050, 2)!;
    const clipped = fitClippedContinuum(x, y, ones, () => true, 6050, 2)!;
    expect(Math.abs(continuumValue(plain, 6050) - 3)).toBeGreaterThan(0.5);
    expect(continuumValue(clipped, 6050)).toBeCloseTo(3, 9);
  });

  it('noiseScale is 1 for honest errors and the real scatter for understated ones', () => {
    const rnd = seededNormal(3);
    const y = x.map((v) => 5 + 2 * rnd());
    const fit = fitContinuum(x, y, ones, () => true, 6050, 0)!;
    expect(noiseScale(x, y, ones.map(() => 1 / 4), () => true, fit)).toBeLessThan(1.15);
    expect(noiseScale(x, y, ones, () => true, fit)).toBeGreaterThan(1.8); // stated sigma 1, true 2
    expect(noiseScale(x, y, ones, () => true, fit)).toBeLessThan(2.2);
  });
});

describe('Gaussian matched filters', () => {
  it('filterAt returns the amplitude of a centred Gaussian and snr = a sqrt(sum w g^2), to the Gaussian table error of 1.2e-7', () => {
    const r = x.map((v) => 7 * gauss(v, x[100], 1.5));
    const h = filterAt(x, r, ones.map(() => 4), 100, 1.5);
    // the filter's Gaussian comes from a table good to 1.2e-7 (gaussTable.ts): the ratio sum(w r g) / sum(w g^2) moves by a few 1e-7
    expect(h.amplitude).toBeCloseTo(7, 5);
    let sgg = 0;
    for (const v of x) if (Math.abs(v - x[100]) <= 6) sgg += 4 * gauss(v, x[100], 1.5) ** 2;
    expect(Math.abs(h.snr / (7 * Math.sqrt(sgg)) - 1)).toBeLessThan(1e-6);
  });

  it('bestFilterHitStrided agrees with the exhaustive bestFilterHit on single lines in noise', () => {
    // 40 seeded cases: one Gaussian line (sigma 1-8 A, S/N ~ 10-40) on noise of 1; both searches over the same range and sigmas.
    const noise = seededNormal(77);
    const xs = Float64Array.from({ length: 600 }, (_, i) => 5000 + i);
    const w = new Float64Array(xs.length).fill(1);
    for (let c = 0; c < 40; c++) {
      const sig = 1 + (c % 8);
      const centre = 5200 + 5.3 * c;
      const amp = (c % 2 ? 1 : -1) * (4 + (c % 5));
      const r = xs.map((v) => amp * gauss(v, centre, sig) + noise());
      const sign = amp > 0 ? 1 : -1;
      const slow = bestFilterHit(xs, r, w, 150, 450, [sig / 2, sig, 2 * sig], sign)!;
      const fast = bestFilterHitStrided(xs, r, w, 150, 450, [sig / 2, sig, 2 * sig], sign)!;
      expect(Math.abs(fast.k - slow.k)).toBeLessThanOrEqual(1);
      expect(fast.snr / slow.snr).toBeGreaterThan(0.99);
    }
    expect(bestFilterHitStrided(x, x.map(() => 0), ones, 0, 200, [2], 1)).toBeNull();
  });

  it('bestFilterHit finds the peak and honours the sign', () => {
    const r = x.map((v) => 5 * gauss(v, x[60], 2) - 3 * gauss(v, x[140], 2));
    expect(bestFilterHit(x, r, ones, 0, 200, [1, 2, 4], 1)!.k).toBe(60);
    expect(bestFilterHit(x, r, ones, 0, 200, [1, 2, 4], -1)!.k).toBe(140);
    expect(bestFilterHit(x, r, ones, 0, 200, [2], 0)!.k).toBe(60);
    expect(bestFilterHit(x, r.map(() => 0), ones, 0, 200, [2], 1)).toBeNull();
  });

});
