import { describe, expect, it } from 'vitest';
import { gaussOfSquare } from '../../../../src/core/engine/lines/gaussTable';

describe('gaussOfSquare', () => {
  it('matches Math.exp(-u/2) within the linear-interpolation bound step^2/32 = 1.2e-7 over [0, 16]', () => {
    // reference: the platform's Math.exp (IEEE double, general-purpose library)
    let worst = 0;
    for (let i = 0; i <= 160000; i++) {
      const u = (i / 160000) * 16;
      worst = Math.max(worst, Math.abs(gaussOfSquare(u) - Math.exp(-0.5 * u)));
    }
    expect(worst).toBeLessThan(1.2e-7);
    // and it is an interpolation, not the exact function (the test would pass vacuously otherwise)
    expect(worst).toBeGreaterThan(1e-9);
  });

  it('is exact at table nodes and falls back to Math.exp beyond u = 16', () => {
    expect(gaussOfSquare(0)).toBe(1);
    expect(gaussOfSquare(2)).toBe(Math.exp(-1));
    expect(gaussOfSquare(25)).toBe(Math.exp(-12.5));
  });
});
