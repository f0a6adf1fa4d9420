import { describe, it, expect } from 'vitest';
import { starModel } from '../../../src/core/sim/star';
import { createRng } from '../../../src/core/sim/prng';
import { makeGrid, DEFAULT_GRID } from '../../../src/core/sim/grid';
import { pixelEdges } from '../../../src/core/sim/profiles';
import type { ModelContext } from '../../../src/core/sim/model';

function ctx(seed: number): ModelContext {
  const wl = makeGrid(DEFAULT_GRID);
  return { wl, edges: pixelEdges(wl), z: 0, resolutionR: 2000, rng: createRng(seed) };
}

function depthAt(c: ModelContext, m: { flux: Float64Array; continuum: Float64Array }, a: number): number {
  const i = c.wl.findIndex((w) => w > a);
  return 1 - Math.min(m.flux[i] / m.continuum[i], m.flux[i - 1] / m.continuum[i - 1]);
}

/** Equivalent width (A) measured on the model over +-half A: sum of (1 - f/c) d lambda. */
function ewAround(c: ModelContext, m: { flux: Float64Array; continuum: Float64Array }, a: number, half: number): number {
  let s = 0;
  for (let i = 1; i < c.wl.length; i++) if (Math.abs(c.wl[i] - a) < half) s += (1 - m.flux[i] / m.continuum[i]) * (c.wl[i] - c.wl[i - 1]);
  return s;
}

describe('starModel', () => {
  it('A type: deep Balmer lines, weak Ca II K', () => {
    const c = ctx(1);
    const m = starModel(c, 'A');
    expect(depthAt(c, m, 4862.68)).toBeGreaterThan(0.3);
    expect(depthAt(c, m, 4102.89)).toBeGreaterThan(0.3);
    expect(m.subtype).toBe('A');
  });

  it('G type: Ca II K stronger than H-beta, neither saturated', () => {
    for (let s = 0; s < 10; s++) {
      const c = ctx(2 + s);
      const m = starModel(c, 'G');
      expect(ewAround(c, m, 3934.78, 12)).toBeGreaterThan(ewAround(c, m, 4862.68, 12));
      expect(depthAt(c, m, 4862.68)).toBeLessThan(0.9);
    }
  });

  it('M type: red continuum with band depressions', () => {
    const c = ctx(3);
    const m = starModel(c, 'M');
    const n = c.wl.length;
    expect(m.continuum[n - 1]).toBeGreaterThan(m.continuum[0]);
    // Just redward of the TiO head at 7054 A (air) the flux is depressed.
    expect(depthAt(c, m, 7060)).toBeGreaterThan(0.1);
  });

  it('continua are hotter for A than for M (blue/red ratio)', () => {
    const a = starModel(ctx(4), 'A');
    const mm = starModel(ctx(4), 'M');
    const n = a.continuum.length;
    expect(a.continuum[10] / a.continuum[n - 10]).toBeGreaterThan(mm.continuum[10] / mm.continuum[n - 10]);
  });
});
