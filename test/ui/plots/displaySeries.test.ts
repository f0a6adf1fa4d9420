import { describe, expect, it } from 'vitest';
import { buildDisplaySeries } from '../../../src/ui/plots/displaySeries';

describe('buildDisplaySeries(wavelengthA, flux, ivar, mask, smoothingPx)', () => {
  const w = Float64Array.from({ length: 6 }, (_, i) => 4000 + i);
  it('blanks masked pixels and builds a 1-sigma band from ivar', () => {
    const s = buildDisplaySeries(w, Float64Array.of(1, 2, 3, 4, 5, 6), new Float64Array(6).fill(4), Uint8Array.of(0, 0, 1, 0, 0, 0), 1);
    expect(Number.isNaN(s.flux[2])).toBe(true);
    // sigma = 1/sqrt(ivar) = 0.5
    expect(s.bandLow![0]).toBeCloseTo(0.5, 12);
    expect(s.bandHigh![5]).toBeCloseTo(6.5, 12);
  });
  it('smoothing narrows the band by sqrt(window) for equal ivar', () => {
    const s = buildDisplaySeries(w, new Float64Array(6).fill(1), new Float64Array(6).fill(1), new Uint8Array(6), 3);
    // mean of 3 samples of sigma 1 has sigma 1/sqrt(3) (common practice)
    expect(s.bandHigh![2] - s.flux[2]).toBeCloseTo(1 / Math.sqrt(3), 12);
  });
  it('an all-zero or missing ivar gives no band', () => {
    expect(buildDisplaySeries(w, new Float64Array(6), new Float64Array(6), new Uint8Array(6), 1).bandLow).toBeNull();
    expect(buildDisplaySeries(w, new Float64Array(6), null, new Uint8Array(6), 1).bandHigh).toBeNull();
  });
});
