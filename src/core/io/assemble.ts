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
 * so the invariants in types.ts hold for every spectrum in the program; on top
 * of them, at least one pixel must be usable (finite flux, not masked, and a
 * positive inverse variance when there is an uncertainty).
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
  const ivar = p.ivar;
  if (ivar) {
    // Negative, NaN or infinite inverse variance carries no usable information.
    for (let i = 0; i < n; i++) if (!(ivar[i] >= 0) || !Number.isFinite(ivar[i])) ivar[i] = 0;
  }
  for (let i = 0; i < n; i++) if (!Number.isFinite(flux[i])) mask[i] = 1;
  checkUsablePixels(file, flux, ivar, mask, where);
  return { file, format: p.format, wavelengthA: wl, flux, ivar, mask, meta: p.meta ?? {} };
}

/**
 * Refuse a spectrum in which no pixel can carry weight in a fit: a usable pixel
 * has a finite flux, is not masked and (when the file gave an uncertainty) has
 * a positive inverse variance. An uncertainty that is zero everywhere is the
 * file saying every pixel is bad, not that the uncertainty is unknown.
 */
function checkUsablePixels(file: string, flux: Float64Array, ivar: Float64Array | null, mask: Uint8Array, where: ReadErrorWhere): void {
  const n = flux.length;
  let weighted = 0;
  let unmasked = 0;
  let usable = 0;
  for (let i = 0; i < n; i++) {
    const w = ivar === null || ivar[i] > 0;
    const m = mask[i] === 0; // non-finite flux is already masked
    if (w) weighted++;
    if (m) unmasked++;
    if (w && m) usable++;
  }
  if (usable > 0) return;
  let why: string;
  if (ivar && weighted === 0) why = `the uncertainty gives zero weight (inverse variance 0, or an error that is 0, negative or not a number) to all ${n} pixels`;
  else if (unmasked === 0) why = `all ${n} pixels are masked as bad (or have no finite flux)`;
  else why = `every pixel with non-zero weight is masked, and every unmasked pixel has zero weight (${n} pixels)`;
  throw new SpectrumReadError(file, `no usable pixel: ${why}`, where);
}
