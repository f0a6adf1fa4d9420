import { describe, expect, it } from 'vitest';
import { solutionModel } from '../../../src/core/engine';
import { templateFamilies } from '../../../src/core/engine/templates';
import { injectFamily } from './synth';

const fam = (id: string) => templateFamilies().find((f) => f.id === id)!;
const slope = (lam: number) => 2 + lam / 8000;

/** Root-mean-square of model - data over pixels where the model is defined. */
function rms(model: Float64Array, data: Float64Array): number {
  let s = 0;
  let n = 0;
  for (let i = 0; i < model.length; i++) {
    if (!Number.isFinite(model[i])) continue;
    s += (model[i] - data[i]) ** 2;
    n++;
  }
  return Math.sqrt(s / n);
}

describe('solutionModel(spectrum, z, family)', () => {
  it('reproduces a noise-free injection of the family at its own (fractional-pixel) redshift', () => {
    // Flat continuum (the polynomial holds it exactly) and noise of 1e-6: data and model differ by the noise only.
    const s = injectFamily(fam('galaxy-sf'), [4, 4, 5, 2, 0], 0.71234, { sigma: 1e-6, seed: 1 });
    const m = solutionModel(s, 0.71234, 'galaxy-sf');
    expect(m.length).toBe(s.flux.length);
    let peak = 0;
    for (const f of s.flux) peak = Math.max(peak, Math.abs(f));
    // Both sides interpolate the rest vectors linearly between whole shifts: agreement to the 1e-6 noise.
    expect(rms(m, s.flux) / peak).toBeLessThan(3e-6);
  });

  it('reproduces a quasar injection with the mean forest on the continuum', () => {
    const z = 2.81;
    // Ly-alpha, C IV and C III] groups (Mg II would lie beyond the red end at this z, where the engine drops a line whose centre is outside).
    const s = injectFamily(fam('qso'), [6, 3, 1, 2, 0, 0, 0, 0], z, { sigma: 1e-6, seed: 1, forest: true });
    const m = solutionModel(s, z, 'qso');
    let peak = 0;
    for (const f of s.flux) peak = Math.max(peak, Math.abs(f));
    // The engine ties the mean forest to its polynomial continuum, as the injection does to its flat one.
    expect(rms(m, s.flux) / peak).toBeLessThan(3e-6);
  });

  it('fits worse at a wrong redshift; NaN for an unknown family or too little data; defined across masked pixels', () => {
    const s = injectFamily(fam('galaxy-sf'), [4, 4, 5, 2, 0], 0.3, { sigma: 0.05, seed: 4, cont: slope });
    const good = rms(solutionModel(s, 0.3, 'galaxy-sf'), s.flux);
    const bad = rms(solutionModel(s, 0.31, 'galaxy-sf'), s.flux);
    // at the right z the residual is the injected noise (0.05)
    expect(good).toBeLessThan(0.06);
    expect(bad).toBeGreaterThan(2 * good);
    expect(solutionModel(s, 0.3, 'no-such-family').every(Number.isNaN)).toBe(true);
    const masked = { ...s, mask: s.mask.map((_, i) => (i >= 100 && i < 200 ? 1 : 0)) };
    const m = solutionModel(masked, 0.3, 'galaxy-sf');
    expect(Number.isFinite(m[150])).toBe(true);
    const empty = { ...s, mask: s.mask.map((_, i) => (i < 20 ? 0 : 1)) };
    expect(solutionModel(empty, 0.3, 'galaxy-sf').every(Number.isNaN)).toBe(true);
  });
});
