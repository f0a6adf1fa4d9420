import { describe, it, expect } from 'vitest';
import { starFormingModel, passiveModel, d4000Of, planckShape } from '../../../src/core/sim/galaxy';
import { createRng } from '../../../src/core/sim/prng';
import { makeGrid, DEFAULT_GRID } from '../../../src/core/sim/grid';
import { pixelEdges } from '../../../src/core/sim/profiles';
import type { ModelContext } from '../../../src/core/sim/model';

function ctx(z: number, seed: number): ModelContext {
  const wl = makeGrid(DEFAULT_GRID);
  return { wl, edges: pixelEdges(wl), z, resolutionR: 2000, rng: createRng(seed) };
}

describe('d4000Of', () => {
  it('is 1 for a flat f_nu and (4150/3850)^2 = 1.162 for a flat f_lambda', () => {
    // f_nu = const -> f_lambda ~ lambda^-2 -> D4000 = 1 (definition, Bruzual 1983).
    expect(d4000Of((l) => 1 / (l * l))).toBeCloseTo(1, 9);
    // flat f_lambda: ratio of mean lambda^2 over the two windows (closed form ~ (4150/3850)^2).
    expect(d4000Of(() => 1)).toBeCloseTo(1.1622, 3);
  });
});

describe('passiveModel', () => {
  it('has D4000 between 1.4 and 2.2, measured on its own continuum', () => {
    for (let k = 0; k < 20; k++) {
      const c = ctx(0.3, k);
      const m = passiveModel(c);
      const rest = Array.from(c.wl, (w) => w / 1.3);
      let red = 0;
      let nr = 0;
      let blue = 0;
      let nb = 0;
      for (let i = 0; i < rest.length; i++) {
        const fnu = m.continuum[i] * rest[i] ** 2;
        if (rest[i] >= 4050 && rest[i] <= 4250) (red += fnu), nr++;
        if (rest[i] >= 3750 && rest[i] <= 3950) (blue += fnu), nb++;
      }
      const d = red / nr / (blue / nb);
      expect(d).toBeGreaterThan(1.38);
      expect(d).toBeLessThan(2.25);
      // Pixel sampling (log grid) versus the 1 A rest sampling used to set it: within 2%.
      expect(Math.abs(d / m.facts.d4000 - 1)).toBeLessThan(0.02);
    }
  });

  it('puts Ca II K in absorption at (1+z) 3934.78', () => {
    const c = ctx(0.25, 3);
    const m = passiveModel(c);
    const i = c.wl.findIndex((w) => w > 3934.78 * 1.25);
    expect(m.flux[i] / m.continuum[i]).toBeLessThan(0.85);
  });
});

describe('starFormingModel', () => {
  it('has narrow lines of 50-300 km/s and the fixed [O III] and [N II] doublet ratios', () => {
    const m = starFormingModel(ctx(0.1, 4));
    const byId = Object.fromEntries(m.lines.map((l) => [l.id, l]));
    expect(byId.Halpha.fwhmKms).toBeGreaterThanOrEqual(50);
    expect(byId.Halpha.fwhmKms).toBeLessThanOrEqual(300);
    const o3 = byId.OIII_5008.ewRestA / byId.OIII_4960.ewRestA;
    // 5008/4960 flux ratio 2.98 (Storey & Zeippen 2000); the EW ratio differs by the continuum slope over 48 A (< 3%).
    expect(Math.abs(o3 / 2.98 - 1)).toBeLessThan(0.03);
  });

  it('is bluer than a passive galaxy', () => {
    const sf = starFormingModel(ctx(0.1, 5));
    const pa = passiveModel(ctx(0.1, 5));
    const n = sf.continuum.length;
    expect(sf.continuum[100] / sf.continuum[n - 100]).toBeGreaterThan(pa.continuum[100] / pa.continuum[n - 100]);
  });
});

describe('planckShape', () => {
  it('peaks where Wien says (lambda_max T = 2.8978e7 A K, CODATA)', () => {
    let best = 0;
    let bestV = 0;
    for (let l = 3000; l < 6000; l += 1) {
      const v = planckShape(l, 6000);
      if (v > bestV) (bestV = v), (best = l);
    }
    expect(Math.abs(best - 2.8978e7 / 6000)).toBeLessThan(2);
  });
});
