/**
 * Test helpers for the engine: a seeded PRNG and synthetic spectra made
 * directly on the log grid from the engine's own template vectors (injection
 * tests), so that a known redshift can be put in and looked for.
 */
import type { Spectrum } from '../../../src/core/types';
import { DLOG10 } from '../../../src/core/engine/logGrid';
import type { TemplateFamily } from '../../../src/core/engine/templates';
import { valueAt } from '../../../src/core/engine/restArray';
import { forestDepth, forestTransmission } from '../../../src/core/engine/forest';

/** mulberry32 (a small public-domain PRNG, common practice) with Gaussian draws by Box-Muller. */
export function makeRng(seed: number) {
  let a = seed >>> 0;
  const next = () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
  const gauss = () => Math.sqrt(-2 * Math.log(1 - next())) * Math.cos(2 * Math.PI * next());
  return { next, gauss };
}

/**
 * A spectrum on the log grid from kStart (absolute) with n pixels: continuum
 * `cont` (a function of observed wavelength) plus sum_j amp_j * vector_j of a
 * family at redshift z, with Gaussian noise sigma. Fractional shifts are made
 * by linear interpolation of the fine rest vectors.
 */
export function injectFamily(
  family: TemplateFamily,
  amps: number[],
  z: number,
  opts: { kStart?: number; n?: number; sigma: number; seed: number; cont?: (lamA: number) => number; forest?: boolean },
): Spectrum {
  const kStart = opts.kStart ?? Math.round(Math.log10(3600) / DLOG10);
  const n = opts.n ?? 4600;
  const rng = makeRng(opts.seed);
  const shift = Math.log10(1 + z) / DLOG10;
  const wl = new Float64Array(n);
  const flux = new Float64Array(n);
  const ivar = new Float64Array(n).fill(1 / (opts.sigma * opts.sigma));
  for (let i = 0; i < n; i++) {
    const k = kStart + i;
    wl[i] = Math.pow(10, k * DLOG10);
    let f = opts.cont ? opts.cont(wl[i]) : 1;
    if (opts.forest) {
      // mean forest on the continuum blueward of Ly-alpha, black below the Lyman limit
      const rest = wl[i] / (1 + z);
      if (rest < 911.75) f = 0;
      else if (rest < 1215.67) f *= forestTransmission(wl[i]);
    }
    const kr = k - shift;
    const k0 = Math.floor(kr);
    const t = kr - k0;
    family.vectors.forEach((v, j) => {
      if (!amps[j]) return;
      for (const p of v.pieces) {
        const val = (1 - t) * valueAt(p.rest, k0) + t * valueAt(p.rest, k0 + 1);
        const mod = p.modulation === 'forestDepth' ? forestDepth(wl[i]) : p.modulation === 'forestTransmission' ? forestTransmission(wl[i]) : 1;
        f += amps[j] * val * mod;
      }
    });
    flux[i] = f + opts.sigma * rng.gauss();
  }
  return { file: `inject-${family.id}-${z}`, format: 'test', wavelengthA: wl, flux, ivar, mask: new Uint8Array(n), meta: {} };
}
