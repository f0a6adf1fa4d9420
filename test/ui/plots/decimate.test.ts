import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { columnOf, decimateMinMax, lowerBound, smoothBoxcar, upperBound } from '../../../src/ui/plots/decimate';

/** The slow obvious version: for each column, scan every sample and keep those inside its x interval. */
function bruteForceColumns(x: Float64Array, y: Float64Array, x0: number, x1: number, n: number) {
  const w = (x1 - x0) / n;
  const rows: { count: number; min: number; max: number; first: number; last: number }[] = [];
  for (let c = 0; c < n; c++) {
    const lo = x0 + c * w;
    const hi = c === n - 1 ? x1 : x0 + (c + 1) * w;
    const inside: number[] = [];
    for (let i = 0; i < x.length; i++) {
      const inCol = x[i] >= lo && (c === n - 1 ? x[i] <= hi : x[i] < hi);
      if (inCol && Number.isFinite(y[i])) inside.push(y[i]);
    }
    rows.push({
      count: inside.length,
      min: inside.length ? Math.min(...inside) : NaN,
      max: inside.length ? Math.max(...inside) : NaN,
      first: inside.length ? inside[0] : NaN,
      last: inside.length ? inside[inside.length - 1] : NaN,
    });
  }
  return rows;
}

/** Small deterministic generator (Park & Miller 1988 minimal standard LCG) so failures reproduce. */
function lcg(seed: number): () => number {
  let s = seed;
  return () => (s = (s * 16807) % 2147483647) / 2147483647;
}

describe('decimateMinMax(x, y, x0, x1, nColumns)', () => {
  it('equals a brute-force per-column scan on random data with gaps (property)', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 1, max: 400 }),
        fc.integer({ min: 1, max: 60 }),
        fc.integer({ min: 1, max: 1_000_000 }),
        (nPts, nCols, seed) => {
          const r = lcg(seed);
          const x = new Float64Array(nPts);
          let acc = 3600 + r() * 10;
          for (let i = 0; i < nPts; i++) x[i] = acc += 0.1 + r() * 2; // strictly increasing, Angstrom
          const y = x.map(() => (r() < 0.1 ? NaN : r() * 200 - 50));
          const x0 = x[0] - 5 + r() * (x[nPts - 1] - x[0]) * 0.5;
          const x1 = x0 + 1 + r() * (x[nPts - 1] - x[0]);
          const got = decimateMinMax(x, y, x0, x1, nCols);
          const want = bruteForceColumns(x, y, x0, x1, nCols);
          for (let c = 0; c < nCols; c++) {
            expect(got.count[c]).toBe(want[c].count);
            expect(got.min[c]).toBe(want[c].min);
            expect(got.max[c]).toBe(want[c].max);
            expect(got.first[c]).toBe(want[c].first);
            expect(got.last[c]).toBe(want[c].last);
          }
        },
      ),
      { numRuns: 150 },
    );
  });

  it('keeps a one-sample spike (a cosmic ray) in its column max', () => {
    const n = 20_000;
    const x = Float64Array.from({ length: n }, (_, i) => 3800 + i * 0.3);
    const y = new Float64Array(n).fill(1);
    y[12_345] = 500;
    const cols = decimateMinMax(x, y, x[0], x[n - 1], 800);
    expect(Math.max(...cols.max)).toBe(500);
    expect(cols.max[columnOf(x[12_345], x[0], x[n - 1], 800)]).toBe(500);
    // every sample lands in exactly one column
    expect(cols.count.reduce((a, b) => a + b, 0)).toBe(n);
  });

  it('ignores samples outside [x0, x1] and returns empty columns for a bad range', () => {
    const x = Float64Array.of(1, 2, 3, 4, 5);
    const y = Float64Array.of(10, 20, 30, 40, 50);
    const cols = decimateMinMax(x, y, 2, 4, 2);
    expect(Array.from(cols.count)).toEqual([1, 2]);
    expect(cols.min[1]).toBe(30);
    expect(cols.max[1]).toBe(40);
    const bad = decimateMinMax(x, y, 4, 2, 3);
    expect(Array.from(bad.count)).toEqual([0, 0, 0]);
    expect(Number.isNaN(bad.min[0])).toBe(true);
  });
});

describe('lowerBound / upperBound', () => {
  it('agree with a linear search', () => {
    const x = Float64Array.of(1, 2, 2, 2, 5, 9);
    for (const v of [0, 1, 2, 3, 5, 9, 10]) {
      expect(lowerBound(x, v)).toBe(x.findIndex((e) => e >= v) === -1 ? x.length : x.findIndex((e) => e >= v));
      expect(upperBound(x, v)).toBe(x.findIndex((e) => e > v) === -1 ? x.length : x.findIndex((e) => e > v));
    }
  });
});

describe('smoothBoxcar(y, ivar, width, mask)', () => {
  it('smoothing of a constant is the constant, and ivar adds up over the window', () => {
    const y = new Float64Array(50).fill(7.5);
    const ivar = new Float64Array(50).fill(4);
    const s = smoothBoxcar(y, ivar, 5);
    for (const v of s.y) expect(v).toBeCloseTo(7.5, 12);
    // interior window of 5 samples of ivar 4 -> 20 (1/sigma^2 of a mean adds, common practice)
    expect(s.ivar![25]).toBeCloseTo(20, 12);
    // edge window is truncated to 3 samples
    expect(s.ivar![0]).toBeCloseTo(12, 12);
  });

  it('weights by inverse variance: a noisy sample barely moves the mean', () => {
    const y = Float64Array.of(0, 0, 100, 0, 0);
    const ivar = Float64Array.of(1, 1, 1e-6, 1, 1);
    const s = smoothBoxcar(y, ivar, 5);
    // hand computation: 100e-6 / (4 + 1e-6)
    expect(s.y[2]).toBeCloseTo(100e-6 / (4 + 1e-6), 12);
  });

  it('ignores NaN, masked and zero-ivar samples; a window with none left is NaN', () => {
    const y = Float64Array.of(1, NaN, 1000, 3, 2000, 5, 7);
    const ivar = Float64Array.of(1, 1, 1, 1, 0, 1, 1);
    const mask = Uint8Array.of(0, 0, 1, 0, 0, 0, 0);
    const s = smoothBoxcar(y, ivar, 3, mask);
    expect(s.y[2]).toBeCloseTo(3, 12); // neighbours NaN and 3 -> only 3 counts
    expect(s.y[4]).toBeCloseTo(4, 12); // 3 and 5, the zero-ivar 2000 is ignored
    const lonely = smoothBoxcar(Float64Array.of(NaN, NaN, 1), null, 1);
    expect(Number.isNaN(lonely.y[0])).toBe(true);
    expect(lonely.ivar).toBeNull();
  });

  it('with width 1 and no ivar returns the samples unchanged', () => {
    const y = Float64Array.of(3, -1, 4, 1, -5);
    expect(Array.from(smoothBoxcar(y, null, 1).y)).toEqual(Array.from(y));
  });

  it('an even width uses the next odd window (width 4 -> 5 samples)', () => {
    const y = Float64Array.of(0, 0, 5, 0, 0, 0, 0);
    const s = smoothBoxcar(y, null, 4);
    expect(s.y[0]).toBeCloseTo(5 / 3, 12); // window 0..2
    expect(s.y[4]).toBeCloseTo(1, 12); // window 2..6 -> 5/5
  });
});
