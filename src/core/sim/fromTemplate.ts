/**
 * A simulated observation of a tabulated rest-frame spectrum (a published
 * template held out of the engine's families): redshifted, sampled on one of
 * a few survey-like pixel layouts, given a smooth flux-calibration error,
 * noise with a blue and red rise, sky-line residuals, and for one layout a
 * zero-filled dead end with a roll-off. What the engine never saw, as far as
 * a simulation can: the spectrum itself comes from real objects.
 */
import type { Spectrum } from '../types';
import type { Rng } from './prng';
import { noiseShape } from './noise';
import { SKY_LINES } from './sky';
import { interpLinear } from '../numeric/interpolate';

export type HeldOutLayout = 'log-3800-9200' | 'log-3600-10300' | 'linear-3700-9100-dead-end' | 'linear-4000-8800';
export const HELD_OUT_LAYOUTS: readonly HeldOutLayout[] = ['log-3800-9200', 'log-3600-10300', 'linear-3700-9100-dead-end', 'linear-4000-8800'];

export interface TemplateObservation {
  restWavelengthA: Float64Array;
  restFlux: Float64Array;
  z: number;
  /** Median continuum S/N per pixel. */
  snr: number;
  layout: HeldOutLayout;
  file: string;
}

function grid(layout: HeldOutLayout): Float64Array {
  const out: number[] = [];
  if (layout.startsWith('log')) {
    const [a, b] = layout === 'log-3800-9200' ? [3800, 9200] : [3600, 10300];
    for (let k = Math.ceil(Math.log10(a) / 1e-4); k * 1e-4 <= Math.log10(b); k++) out.push(10 ** (k * 1e-4));
  } else {
    const [a, b, d] = layout === 'linear-4000-8800' ? [4000, 8800, 2] : [3700, 9100, 1.3];
    for (let w = a; w <= b; w += d) out.push(w);
  }
  return Float64Array.from(out);
}

export function observeTemplate(o: TemplateObservation, rng: Rng): Spectrum {
  const all = grid(o.layout);
  // keep the pixels the template covers
  const keep: number[] = [];
  for (let i = 0; i < all.length; i++) if (Number.isFinite(interpLinear(o.restWavelengthA, o.restFlux, all[i] / (1 + o.z)))) keep.push(i);
  const wl = Float64Array.from(keep, (i) => all[i]);
  const n = wl.length;
  const flux = new Float64Array(n);
  // smooth flux-calibration error: 1 + a1 x + a2 x^2, |a| ~ 5 % (common size of survey fluxing errors, from memory)
  const a1 = 0.05 * rng.gaussian();
  const a2 = 0.05 * rng.gaussian();
  for (let i = 0; i < n; i++) {
    const x = (2 * i) / Math.max(1, n - 1) - 1;
    flux[i] = interpLinear(o.restWavelengthA, o.restFlux, wl[i] / (1 + o.z)) * (1 + a1 * x + a2 * x * x);
  }
  const sorted = Float64Array.from(flux).map(Math.abs).sort();
  const level = sorted[n >> 1] || 1;
  const sigma = Float64Array.from(wl, (w) => (level / o.snr) * noiseShape(w));
  const ivar = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    flux[i] += sigma[i] * rng.gaussian();
    ivar[i] = 1 / (sigma[i] * sigma[i]);
  }
  // sky-line residuals: imperfect subtraction, a few sigma at the strong lines
  for (const l of SKY_LINES) {
    if (l.strength < 0.3) continue;
    const amp = 3 * l.strength * rng.gaussian();
    for (let i = 0; i < n; i++) {
      const d = (wl[i] - l.vacA) / 1.5;
      if (Math.abs(d) < 4) flux[i] += amp * sigma[i] * Math.exp(-0.5 * d * d);
    }
  }
  const mask = new Uint8Array(n);
  if (o.layout === 'linear-3700-9100-dead-end') {
    // the last 20 pixels read exactly 0 with a non-zero ivar, after a 50-pixel roll-off into negative flux
    for (let i = Math.max(0, n - 70); i < n - 20; i++) flux[i] *= (n - 20 - i) / 50 - 0.1;
    for (let i = Math.max(0, n - 20); i < n; i++) flux[i] = 0;
  }
  return { file: o.file, format: 'simulated', wavelengthA: wl, flux, ivar, mask, meta: {} };
}
