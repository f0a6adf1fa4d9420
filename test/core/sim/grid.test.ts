import { describe, it, expect } from 'vitest';
import { makeGrid, DEFAULT_GRID, pixelWidthA } from '../../../src/core/sim/grid';

describe('makeGrid', () => {
  it('default grid: 3600-9200 A in log10 steps of 1e-4', () => {
    const g = makeGrid(DEFAULT_GRID);
    // floor(log10(9200/3600) / 1e-4) + 1 = 4075 (closed form).
    expect(g.length).toBe(4075);
    expect(g[0]).toBeCloseTo(3600, 9);
    expect(g[g.length - 1]).toBeLessThanOrEqual(9200);
    for (const i of [0, 1000, 4073]) expect(Math.log10(g[i + 1] / g[i])).toBeCloseTo(1e-4, 12);
  });

  it('linear grid: constant step', () => {
    const g = makeGrid({ kind: 'linear', startA: 3800, endA: 9000, stepA: 2 });
    expect(g.length).toBe(2601);
    expect(g[2600]).toBe(9000);
    expect(pixelWidthA(g, 100)).toBeCloseTo(2, 12);
  });
});
