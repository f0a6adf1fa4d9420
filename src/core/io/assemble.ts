import { SpectrumReadError, type Spectrum, type SpectrumMeta, type ReadErrorWhere } from '../types';

/** Largest pixel count any reader accepts; checked before allocating. */
export const MAX_PIXELS = 10_000_000;

/** Throw a uniform read error unless a claimed pixel count is sane. */
export function checkPixelCount(file: string, n: number, where: ReadErrorWhere = {}): void {
  if (!Number.isFinite(n) || n < 0 || !Number.isInteger(n)) {
    throw new SpectrumReadError(file, `invalid pixel count ${n}`, where);
  }
  if (n === 0) throw new SpectrumReadError(file, 'zero-length spectrum', where);
  if (n > MAX_PIXELS) {
    throw new SpectrumReadError(file, `claims ${n} pixels, more than the limit of ${MAX_PIXELS}`, where);
  }
}

export interface SpectrumParts {
  file: string;
  format: string;
  wavelengthA: Float64Array;
  flux: Float64Array;
  ivar: Float64Array | null;
  mask?: Uint8Array;
  meta?: SpectrumMeta;
  /** Where the data came from, for error messages. */
  where?: ReadErrorWhere;
}

/**
 * Validate reader output once and build the Spectrum. Every reader ends here,
 * so the invariants in types.ts hold for every spectrum in the program.
 */
export function assembleSpectrum(p: SpectrumParts): Spectrum {
  const { file, wavelengthA: wl, flux } = p;
  const where = p.where ?? {};
  const n = wl.length;
  if (n === 0) throw new SpectrumReadError(file, 'zero-length spectrum', where);
  if (n < 2) throw new SpectrumReadError(file, 'only one pixel; a spectrum needs at least 2', where);
  if (flux.length !== n) {
    throw new SpectrumReadError(file, `wavelength has ${n} values but flux has ${flux.length}`, where);
  }
  if (p.ivar && p.ivar.length !== n) {
    throw new SpectrumReadError(file, `wavelength has ${n} values but the uncertainty has ${p.ivar.length}`, where);
  }
  if (p.mask && p.mask.length !== n) {
    throw new SpectrumReadError(file, `wavelength has ${n} values but the mask has ${p.mask.length}`, where);
  }
  for (let i = 0; i < n; i++) {
    if (!Number.isFinite(wl[i])) throw new SpectrumReadError(file, `wavelength of pixel ${i + 1} is not a finite number`, where);
    if (wl[i] <= 0) throw new SpectrumReadError(file, `wavelength of pixel ${i + 1} is ${wl[i]}, not positive`, where);
    if (i > 0 && !(wl[i] > wl[i - 1])) {
      throw new SpectrumReadError(file, `wavelength is not increasing at pixel ${i + 1} (${wl[i - 1]} then ${wl[i]})`, where);
    }
  }
  let finite = 0;
  for (let i = 0; i < n; i++) if (Number.isFinite(flux[i])) finite++;
  if (finite === 0) throw new SpectrumReadError(file, 'all flux values are NaN or infinite', where);
  const mask = p.mask ?? new Uint8Array(n);
  let ivar = p.ivar;
  if (ivar) {
    // Negative, NaN or infinite inverse variance carries no usable information.
    for (let i = 0; i < n; i++) if (!(ivar[i] >= 0) || !Number.isFinite(ivar[i])) ivar[i] = 0;
    let any = false;
    for (let i = 0; i < n && !any; i++) if (ivar[i] > 0) any = true;
    if (!any) ivar = null; // an all-zero uncertainty is no uncertainty at all
  }
  for (let i = 0; i < n; i++) if (!Number.isFinite(flux[i])) mask[i] = 1;
  return { file, format: p.format, wavelengthA: wl, flux, ivar, mask, meta: p.meta ?? {} };
}
