/**
 * The best-fit model of one family at one redshift, on the spectrum's own
 * wavelength grid, for the plot overlay: the family's full model plus the
 * continuum polynomial, fitted to the prepared fine-grid data by the same
 * least squares as the candidates (model.ts) at the nearest fine-grid shift.
 */
import type { Spectrum } from '../types';
import { DLOG10, shiftOfZ } from './logGrid';
import { evaluateAt, modelOnData } from './model';
import { DEFAULT_POLY_TERMS, engineFamilies } from './fitSpectrum';
import { prepareData } from './prepare';
import { weightedData } from './scanData';

/** Family ids of earlier template sets, for results saved before them: the family that replaced each. */
export const FORMER_FAMILY_IDS: Readonly<Record<string, string>> = {
  'star-A': 'star', 'star-G': 'star', 'star-M': 'star', 'galaxy-sf': 'galaxy', 'galaxy-passive': 'galaxy',
};

/**
 * Model flux per input pixel, in the input's flux unit; NaN where it is not
 * defined (outside the resampled span, unknown family, z <= -1, or too
 * little usable data). Any z is allowed, so a reviewer can look at the model
 * wherever they point.
 */
export function solutionModel(spectrum: Spectrum, z: number, family: string, polyTerms = DEFAULT_POLY_TERMS): Float64Array {
  const wl = spectrum.wavelengthA;
  const out = new Float64Array(wl.length).fill(NaN);
  const id = FORMER_FAMILY_IDS[family] ?? family;
  const fam = engineFamilies().find((f) => f.id === id);
  if (!fam || !Number.isFinite(z) || z <= -1) return out;
  const prep = prepareData(spectrum);
  if (typeof prep === 'string') return out;
  const data = weightedData(prep.fine, 1, polyTerms, false);
  const fit = evaluateAt(data, fam.vectors, fam.kStart, fam.nonNegative, Math.round(shiftOfZ(z, DLOG10)), fam.polynomialFromA);
  const model = modelOnData(data, fam.vectors, fam.kStart, fit);
  const n = model.length;
  for (let i = 0; i < wl.length; i++) {
    // Linear interpolation between log-grid pixel centres.
    const u = Math.log10(wl[i]) / DLOG10 - data.d0;
    if (!(u >= -0.5 && u <= n - 0.5)) continue;
    const j = Math.min(n - 2, Math.max(0, Math.floor(u)));
    const t = Math.min(1, Math.max(0, u - j));
    out[i] = prep.scale * ((1 - t) * model[j] + t * model[j + 1]);
  }
  return out;
}
