import { describe, it, expect } from 'vitest';
import { noiseShape, noiseSigma, telluricTransmission, badColumns, median } from '../../../src/core/sim/noise';
import { makeGrid, DEFAULT_GRID } from '../../../src/core/sim/grid';
import { pixelEdges } from '../../../src/core/sim/profiles';
import { createRng } from '../../../src/core/sim/prng';

describe('noise', () => {
  const wl = makeGrid(DEFAULT_GRID);
  const e = pixelEdges(wl);

  it('noiseShape is higher at the blue end than in the middle', () => {
    expect(noiseShape(3600)).toBeGreaterThan(noiseShape(5500));
    expect(noiseShape(9200)).toBeGreaterThan(noiseShape(5500));
  });

  it('noiseSigma: median continuum/sigma away from sky lines is the S/N; sky lines raise sigma', () => {
    const cont = new Float64Array(wl.length).fill(5);
    const { sigma } = noiseSigma(wl, e, cont, 12, 2000);
    const r = Array.from(cont, (c, i) => c / sigma[i]);
    expect(Math.abs(median(r) / 12 - 1)).toBeLessThan(0.02);
    const i = wl.findIndex((w) => w > 5578.89);
    const j = wl.findIndex((w) => w > 5500);
    expect(sigma[i - 1] + sigma[i]).toBeGreaterThan(4 * sigma[j]);
  });

  it('telluricTransmission dims the bands and nothing else', () => {
    const t = telluricTransmission(wl, 1);
    expect(t[wl.findIndex((w) => w > 7640)]).toBeLessThan(0.5);
    expect(t[wl.findIndex((w) => w > 5000)]).toBeCloseTo(1, 6);
  });

  it('badColumns marks 1 to 24 pixels', () => {
    for (let s = 0; s < 20; s++) {
      const m = badColumns(1000, createRng(s));
      const k = m.reduce((a, b) => a + b, 0);
      expect(k).toBeGreaterThanOrEqual(1);
      expect(k).toBeLessThanOrEqual(24);
    }
  });

  it('median of an even-length array is the mean of the middle two', () => {
    expect(median([4, 1, 3, 2])).toBe(2.5);
    expect(median([NaN, 1])).toBe(1);
  });
});
