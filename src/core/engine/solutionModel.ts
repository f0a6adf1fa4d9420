/**
 * The best-fit model of one family at one redshift, on the spectrum's own
 * wavelength grid, for the plot overlay: the family's templates (with the
 * mean forest where the family carries it) plus the continuum polynomial,
 * amplitudes fitted to the data by the same weighted least squares as the
 * refinement (refine.ts), at the exact (fractional-pixel) shift of z.
 */
import type { Spectrum } from '../types';
import { fineData } from './fineData';
import { DLOG10, shiftOfZ } from './logGrid';
import { evaluateFull, makeRefineContext, modelFlux } from './refine';
import { DEFAULT_POLY_TERMS } from './fitSpectrum';
import { FORMER_FAMILY_IDS, templateFamilies } from './templates';

/**
 * Model flux per input pixel, in the input's flux unit; NaN where it is not
 * defined (outside the resampled span, unknown family, z <= -1, or too
 * little usable data). Any z is allowed, inside the family's search range
 * or not, so a reviewer can look at the model wherever they point.
 */
export function solutionModel(spectrum: Spectrum, z: number, family: string, polyTerms = DEFAULT_POLY_TERMS): Float64Array {
  const wl = spectrum.wavelengthA;
  const out = new Float64Array(wl.length).fill(NaN);
  const id = FORMER_FAMILY_IDS[family] ?? family;
  const fam = templateFamilies().find((f) => f.id === id);
  if (!fam || !Number.isFinite(z) || z <= -1) return out;
  const fd = fineData(spectrum);
  if (typeof fd === 'string') return out;
  const ctx = makeRefineContext(fd.data, polyTerms, DLOG10);
  const fit = evaluateFull(ctx, fam, shiftOfZ(z, DLOG10));
  const model = modelFlux(ctx, fam, fit);
  const { k0 } = fd.data;
  const n = model.length;
  for (let i = 0; i < wl.length; i++) {
    // Linear interpolation between log-grid pixel centres.
    const u = Math.log10(wl[i]) / DLOG10 - k0;
    if (!(u >= -0.5 && u <= n - 0.5)) continue;
    const j = Math.min(n - 2, Math.max(0, Math.floor(u)));
    const t = Math.min(1, Math.max(0, u - j));
    out[i] = fd.scale * ((1 - t) * model[j] + t * model[j + 1]);
  }
  return out;
}
