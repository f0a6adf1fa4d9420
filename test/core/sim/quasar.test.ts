import { describe, it, expect } from 'vitest';
import { quasarModel } from '../../../src/core/sim/quasar';
import { createRng } from '../../../src/core/sim/prng';
import { makeGrid, DEFAULT_GRID } from '../../../src/core/sim/grid';
import { pixelEdges } from '../../../src/core/sim/profiles';
import type { ModelContext } from '../../../src/core/sim/model';

function ctx(z: number, seed: number): ModelContext {
  const wl = makeGrid(DEFAULT_GRID);
  return { wl, edges: pixelEdges(wl), z, resolutionR: 2000, rng: createRng(seed) };
}

describe('quasarModel', () => {
  it('draws broad lines of 2000-9000 km/s (+-20% per line)', () => {
    for (let k = 0; k < 10; k++) {
      const m = quasarModel(ctx(2, k));
      const broad = m.lines.filter((l) => l.fwhmKms > 1000);
      expect(broad.length).toBeGreaterThanOrEqual(13);
      for (const l of broad) {
        expect(l.fwhmKms).toBeGreaterThanOrEqual(2000 * 0.8);
        expect(l.fwhmKms).toBeLessThanOrEqual(9000 * 1.2);
      }
    }
  });

  it('blueshifts C IV by 0-2000 km/s (Richards et al. 2002) and keeps Mg II near systemic', () => {
    for (let k = 0; k < 20; k++) {
      const m = quasarModel(ctx(1.8, k));
      const civ = m.lines.find((l) => l.id === 'CIV')!;
      const mg = m.lines.find((l) => l.id === 'MgII')!;
      // 80 km/s Gaussian jitter on top of the drawn shift: allow 5 sigma (400 km/s).
      expect(civ.offsetKms).toBeLessThan(400);
      expect(civ.offsetKms).toBeGreaterThan(-2400);
      expect(Math.abs(mg.offsetKms)).toBeLessThan(400);
      expect(civ.observedA).toBeCloseTo(1549.06 * 2.8 * (1 + civ.offsetKms / 299792.458), 6);
    }
  });

  it('puts the Lyman-alpha forest blueward of Ly-alpha only', () => {
    const z = 3.5;
    const c = ctx(z, 1);
    const m = quasarModel(c);
    const lya = 1215.67 * (1 + z);
    let blue = 0;
    let nb = 0;
    for (let i = 0; i < c.wl.length; i++) {
      if (c.wl[i] > lya + 30) expect(m.forest![i]).toBe(1);
      if (c.wl[i] < lya - 30 && c.wl[i] > 1025.72 * (1 + z)) (blue += m.forest![i]), nb++;
    }
    expect(blue / nb).toBeLessThan(0.8);
  });

  it('has Mg II as a peak above the continuum at (1+z) 2798.75', () => {
    const z = 1.1;
    const c = ctx(z, 2);
    const m = quasarModel(c);
    const i = c.wl.findIndex((w) => w > 2798.75 * (1 + z));
    expect(m.flux[i] / m.continuum[i]).toBeGreaterThan(1.1);
  });
});
