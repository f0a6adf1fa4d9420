import { describe, expect, it } from 'vitest';
import { fitSpectrum, solutionModel } from '../../../src/core/engine';
import { observe } from './synth';

/** Root-mean-square of (model - data) sqrt(ivar) over pixels where the model is defined. */
function pull(model: Float64Array, data: Float64Array, ivar: Float64Array): number {
  let s = 0;
  let n = 0;
  for (let i = 0; i < model.length; i++) {
    if (!Number.isFinite(model[i]) || !(ivar[i] > 0)) continue;
    s += (model[i] - data[i]) ** 2 * ivar[i];
    n++;
  }
  return Math.sqrt(s / n);
}

describe('solutionModel(spectrum, z, family)', () => {
  const z = 0.3112;
  const s = observe('kc96_elliptical', z, 20, 4);
  it('follows the data at the fitted redshift (residual near the noise) and worse at a wrong one', () => {
    const r = fitSpectrum(s);
    const good = pull(solutionModel(s, r.z, 'galaxy'), s.flux, s.ivar!);
    const bad = pull(solutionModel(s, r.z + 0.02, 'galaxy'), s.flux, s.ivar!);
    expect(good).toBeLessThan(2);
    expect(bad).toBeGreaterThan(1.3 * good);
  });
  it('maps results of earlier template sets to today\'s families, and is NaN for an unknown family', () => {
    expect(solutionModel(s, z, 'galaxy-passive').some(Number.isFinite)).toBe(true);
    expect(solutionModel(s, z, 'no-such-family').every(Number.isNaN)).toBe(true);
    const empty = { ...s, mask: s.mask.map((_, i) => (i < 20 ? 0 : 1)) };
    expect(solutionModel(empty, z, 'galaxy').every(Number.isNaN)).toBe(true);
  });
});
