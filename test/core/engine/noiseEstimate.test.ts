import { describe, expect, it } from 'vitest';
import { estimateIvar } from '../../../src/core/engine/noiseEstimate';
import { createRng } from '../../../src/core/sim/prng';

/** Gaussian white noise of the given sigma per pixel on a sloped continuum with one strong line. */
function noisy(sigmaOf: (i: number) => number, n: number, seed: number): Float64Array {
  const rng = createRng(seed);
  return Float64Array.from({ length: n }, (_, i) => 10 + 0.002 * i + 30 * Math.exp(-0.5 * ((i - 700) / 3) ** 2) + sigmaOf(i) * rng.gaussian());
}

describe('estimateIvar (no uncertainty in the file)', () => {
  it('recovers a known white-noise sigma within 10 % despite a continuum slope and a line', () => {
    // For white noise, first differences have sigma * sqrt(2); 1.4826 MAD is the Gaussian sigma (common practice).
    const n = 2000;
    const ivar = estimateIvar(noisy(() => 0.5, n, 3), new Uint8Array(n).fill(1));
    const sig = Array.from(ivar, (v) => 1 / Math.sqrt(v));
    const mid = sig.slice(100, 1900).sort((a, b) => a - b)[900];
    expect(mid).toBeGreaterThan(0.45);
    expect(mid).toBeLessThan(0.55);
  });

  it('follows a step in the noise from block to block', () => {
    const n = 2000;
    const ivar = estimateIvar(noisy((i) => (i < 1000 ? 0.2 : 1.0), n, 5), new Uint8Array(n).fill(1));
    expect(1 / Math.sqrt(ivar[300])).toBeLessThan(0.26);
    expect(1 / Math.sqrt(ivar[1700])).toBeGreaterThan(0.85);
  });

  it('gives masked pixels zero weight, and constant data a small positive floor', () => {
    const n = 500;
    const good = new Uint8Array(n).fill(1);
    good[10] = 0;
    const ivar = estimateIvar(noisy(() => 1, n, 7), good);
    expect(ivar[10]).toBe(0);
    expect(ivar[11]).toBeGreaterThan(0);
    const flat = estimateIvar(new Float64Array(n).fill(4), new Uint8Array(n).fill(1));
    // sigma = 1e-3 of the flux level (the documented fallback): 1 / (0.004)^2
    expect(flat[0]).toBeCloseTo(1 / 0.004 ** 2, 6);
  });
});
