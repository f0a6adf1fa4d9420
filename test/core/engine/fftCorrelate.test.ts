import { describe, expect, it } from 'vitest';
import { CorrelationPlan, correlateDirect } from '../../../src/core/engine/fftCorrelate';

function rand(seed: number) {
  return () => {
    seed = (seed * 16807) % 2147483647;
    return seed / 2147483647 - 0.5;
  };
}

describe('CorrelationPlan', () => {
  it('correlatePair equals the direct circular correlation for two pairs at once', () => {
    const L = 256;
    const r = rand(7);
    const x1 = Float64Array.from({ length: 100 }, r);
    const y1 = Float64Array.from({ length: L }, r);
    const x2 = Float64Array.from({ length: 150 }, r);
    const y2 = Float64Array.from({ length: L }, r);
    const plan = new CorrelationPlan(L);
    const [X1, X2] = plan.forwardPair(x1, x2);
    const [Y1, Y2] = plan.forwardPair(y1, y2);
    const c1 = new Float64Array(L);
    const c2 = new Float64Array(L);
    plan.correlatePair(X1, Y1, c1, X2, Y2, c2);
    const d1 = correlateDirect(x1, y1, L);
    const d2 = correlateDirect(x2, y2, L);
    let maxAbs = 0;
    for (let m = 0; m < L; m++) maxAbs = Math.max(maxAbs, Math.abs(d1[m]), Math.abs(d2[m]));
    for (let m = 0; m < L; m++) {
      // correlation theorem; double-precision FFT round-off ~1e-13 relative
      expect(Math.abs(c1[m] - d1[m])).toBeLessThan(1e-11 * maxAbs);
      expect(Math.abs(c2[m] - d2[m])).toBeLessThan(1e-11 * maxAbs);
    }
  });

  it('correlatePairRun writes c((mFrom + i) mod L) of correlatePair, wrapping past L, for one pair and for two', () => {
    const L = 128;
    const r = rand(11);
    const x1 = Float64Array.from({ length: 40 }, r);
    const y1 = Float64Array.from({ length: L }, r);
    const x2 = Float64Array.from({ length: 60 }, r);
    const y2 = Float64Array.from({ length: L }, r);
    const plan = new CorrelationPlan(L);
    const [X1, X2] = plan.forwardPair(x1, x2);
    const [Y1, Y2] = plan.forwardPair(y1, y2);
    const c1 = new Float64Array(L);
    const c2 = new Float64Array(L);
    plan.correlatePair(X1, Y1, c1, X2, Y2, c2);
    const a = new Float64Array(30);
    const b = new Float64Array(30);
    // lags 110 .. 139 wrap past L = 128 to 0 .. 11; a negative start counts from the end
    plan.correlatePairRun(X1, Y1, a, 110, 30, X2, Y2, b);
    for (let i = 0; i < 30; i++) {
      expect(a[i]).toBe(c1[(110 + i) % L]);
      expect(b[i]).toBe(c2[(110 + i) % L]);
    }
    const single = new Float64Array(30);
    plan.correlatePairRun(X1, Y1, single, -18, 30);
    // one pair: the same lags to round-off (the second slot of the transform is empty)
    for (let i = 0; i < 30; i++) expect(Math.abs(single[i] - c1[(L - 18 + i) % L])).toBeLessThan(1e-12 * (1 + Math.abs(c1[(L - 18 + i) % L])));
  });

  it('rejects sizes that are not powers of two', () => {
    expect(() => new CorrelationPlan(100)).toThrow(/power of two/);
  });
});
