import { describe, expect, it } from 'vitest';
import { padRange, robustYRange, Y_PAD_FRACTION } from '../../../src/ui/plots/robustYRange';

function flatWithNoise(n: number): Float64Array {
  // deterministic ripple in [0.9, 1.1]
  return Float64Array.from({ length: n }, (_, i) => 1 + 0.1 * Math.sin(i * 0.7));
}

describe('robustYRange(y, i0, i1)', () => {
  it('is not flattened by a one-pixel cosmic ray', () => {
    const y = flatWithNoise(2000);
    y[1000] = 1e6;
    const r = robustYRange(y, 0, y.length)!;
    expect(r[1]).toBeLessThan(2);
    expect(r[0]).toBeGreaterThan(0.5);
  });

  it('is not flattened by a two-pixel spike either', () => {
    const y = flatWithNoise(2000);
    y[700] = 5e4;
    y[701] = 4e4;
    expect(robustYRange(y, 0, y.length)![1]).toBeLessThan(2);
  });

  it('keeps the peak of a resolved emission line (9 pixels wide) inside the range', () => {
    const y = flatWithNoise(2000);
    for (let k = -4; k <= 4; k++) y[1200 + k] += 50 * Math.exp(-0.5 * (k / 2) ** 2);
    const r = robustYRange(y, 0, y.length)!;
    // the median of 5 around the peak is the 2nd-highest of {k=-2..2}: 50*exp(-1/8) + ~1
    expect(r[1]).toBeGreaterThan(45);
  });

  it('skips NaN (masked) samples and returns null when nothing is left', () => {
    const y = Float64Array.of(NaN, 2, NaN, 4, NaN);
    const r = robustYRange(y, 0, 5)!;
    expect(r[0]).toBeLessThan(2.5);
    expect(r[1]).toBeGreaterThan(3.5);
    expect(robustYRange(Float64Array.of(NaN, NaN), 0, 2)).toBeNull();
    expect(robustYRange(Float64Array.of(1, 2, 3), 2, 1)).toBeNull();
  });

  it('looks only at the requested slice', () => {
    const y = Float64Array.from({ length: 100 }, (_, i) => (i < 50 ? 1 : 1000));
    expect(robustYRange(y, 0, 40)![1]).toBeLessThan(2);
  });
});

describe('padRange(lo, hi)', () => {
  it('pads by the stated fraction and widens a flat range', () => {
    const [a, b] = padRange(0, 10);
    expect(a).toBeCloseTo(-10 * Y_PAD_FRACTION, 12);
    expect(b).toBeCloseTo(10 + 10 * Y_PAD_FRACTION, 12);
    expect(padRange(5, 5)).toEqual([4.5, 5.5]);
    expect(padRange(0, 0)).toEqual([-1, 1]);
  });
});

describe('robustYRange with few samples', () => {
  it('falls back to plain extremes when there are too few points for a median', () => {
    const y = Float64Array.of(1, 9, 2);
    const r = robustYRange(y, 0, 3)!;
    expect(r[0]).toBeLessThan(1);
    expect(r[1]).toBeGreaterThan(9);
  });
});
