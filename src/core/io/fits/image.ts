/**
 * A 1-D spectrum from an IMAGE HDU (primary or extension): flux along NAXIS1,
 * wavelength from the spectral WCS (see wcs.ts), and an optional uncertainty and
 * mask from image rows or from other IMAGE HDUs named for them.
 *
 * Shapes read: NAXIS = 1; NAXIS2 (and higher axes) = 1; and small 2-D images
 * whose rows are flux plus uncertainty (and more), as some surveys write them.
 * Row meanings come from BANDIDn (IRAF multispec) or EXTEN0 (a word per row)
 * when present; otherwise row 1 is flux and row 2 the uncertainty, whose kind
 * (inverse variance, error, variance) is judged from the data (see `guessNoiseKind`),
 * and a 5-row image whose data fit the survey layout flux, inverse variance,
 * wavelength, and-mask, or-mask is read that way (see `undescribedFiveRows`).
 * An and-mask row masks every pixel where it is non-zero.
 */
import { median } from '../../numeric/median';
import { checkPixelCount } from '../assemble';
import { SpectrumReadError } from '../../types';
import { decodeValues, type Scaling } from './decode';
import type { FitsHeader } from './header';
import type { FitsHdu } from './hdus';
import { isUncertainty, roleOf, toInverseVariance, type Role } from './names';
import { headerSaysAir, spectralAxis, type SpectralAxis } from './wcs';
import type { RawSpectrum } from './raw';

/** Images with more rows than this are frames, not 1-D spectra with companion rows. */
export const MAX_IMAGE_ROWS = 16;

function scalingOf(h: FitsHeader, bitpix: number, file: string, hdu: number): Scaling {
  const scale = h.num('BSCALE', file, hdu) ?? 1;
  const zero = h.num('BZERO', file, hdu) ?? 0;
  const s: Scaling = { scale, zero };
  if (bitpix > 0) {
    const b = h.get('BLANK');
    if (typeof b === 'number' || typeof b === 'bigint') s.blank = b;
  }
  return s;
}

/** Values of row `row` (0-based) of an image: NAXIS1 values starting at row * NAXIS1. */
export function imageRow(bytes: Uint8Array, hdu: FitsHdu, row: number, file: string): Float64Array {
  const n = hdu.axes[0];
  const width = Math.abs(hdu.bitpix) / 8;
  return decodeValues(bytes, hdu.dataOffset + row * n * width, n, hdu.bitpix, scalingOf(hdu.header, hdu.bitpix, file, hdu.index));
}

/** Pixels along NAXIS1 and the number of rows (product of the other axes), after shape checks. */
function shapeOf(hdu: FitsHdu, file: string): { n: number; rows: number } {
  const [n, ...rest] = hdu.axes;
  const where = { hdu: hdu.index, keyword: 'NAXIS' };
  if (rest.filter((a) => a > 1).length > 1) {
    throw new SpectrumReadError(file, `image of shape ${hdu.axes.join(' x ')} holds several spectra; one 1-D spectrum per file is read`, where);
  }
  const rows = rest.reduce((a, b) => a * b, 1);
  if (rows > MAX_IMAGE_ROWS) {
    throw new SpectrumReadError(
      file,
      `image of shape ${hdu.axes.join(' x ')} is a 2-D frame, not a 1-D spectrum (at most ${MAX_IMAGE_ROWS} rows of flux, uncertainty and mask are read)`,
      where,
    );
  }
  checkPixelCount(file, n, { hdu: hdu.index, keyword: 'NAXIS1' });
  return { n, rows };
}

/** Row roles and the keyword that gave them. */
export interface RowLayout {
  roles: (Role | null)[];
  source: 'BANDID' | 'EXTEN0';
}

/** Role of each row from BANDIDn or EXTEN0 keywords, or null when the header does not say. */
export function rowLayout(h: FitsHeader, rows: number): RowLayout | null {
  const bandIds: (string | undefined)[] = [];
  for (let i = 1; i <= rows; i++) bandIds.push(h.str(`BANDID${i}`));
  if (bandIds.some((b) => b !== undefined)) {
    // e.g. 'spectrum - background fit, weights variance, clean no', 'sigma - background fit, ...'
    return { roles: bandIds.map((b) => (b === undefined ? null : roleOf(b.split(/[\s,-]+/)[0] ?? ''))), source: 'BANDID' };
  }
  const exten0 = h.str('EXTEN0');
  if (exten0 !== undefined) {
    // e.g. 'Flux Inverse Subcontinuum Andmask Ormask' or 'Flux Inverse Wavelength Andmask Ormask': one word per row.
    const words = exten0.split(/\s+/).filter(Boolean);
    if (words.length >= rows) return { roles: words.slice(0, rows).map(roleOf), source: 'EXTEN0' };
  }
  return null;
}

/** Role of each row from BANDIDn or EXTEN0 keywords, or null when the header does not say. */
export function rowRoles(h: FitsHeader, rows: number): (Role | null)[] | null {
  return rowLayout(h, rows)?.roles ?? null;
}

/** True when every value is a finite whole number >= 0 (a mask row rather than data). */
function isMaskLike(values: Float64Array): boolean {
  for (let i = 0; i < values.length; i++) {
    const v = values[i];
    if (!(v >= 0) || !Number.isInteger(v)) return false;
  }
  return true;
}

/** True when the values are finite, positive and strictly increasing (a wavelength row). */
function isIncreasingPositive(values: Float64Array): boolean {
  if (!(values[0] > 0)) return false;
  for (let i = 1; i < values.length; i++) if (!(values[i] > values[i - 1]) || !Number.isFinite(values[i])) return false;
  return true;
}

/** Median of the finite values (of at most ~20000 evenly spaced samples). */
function sampledMedian(values: ArrayLike<number>, keep: (v: number) => boolean): number {
  const step = Math.max(1, Math.floor(values.length / 20000));
  const s: number[] = [];
  for (let i = 0; i < values.length; i += step) if (Number.isFinite(values[i]) && keep(values[i])) s.push(values[i]);
  return median(s);
}

/**
 * Decide whether an undescribed companion row is inverse variance, error or
 * variance: estimate the flux noise sigma from pixel-to-pixel differences
 * (1.4826 MAD of first differences / sqrt 2, common practice) and pick the
 * reading whose typical value is closest, on a log scale, to 1/sigma^2, sigma
 * or sigma^2. When the data cannot tell (no noise estimate), inverse variance,
 * the most common choice of survey pipelines, is assumed.
 */
export function guessNoiseKind(flux: Float64Array, row: Float64Array): 'ivar' | 'error' | 'variance' {
  const diffs = new Float64Array(Math.max(flux.length - 1, 0));
  for (let i = 0; i + 1 < flux.length; i++) diffs[i] = Math.abs(flux[i + 1] - flux[i]);
  const sigma = (1.4826 * sampledMedian(diffs, () => true)) / Math.SQRT2;
  const typical = sampledMedian(row, (v) => v > 0);
  if (!(sigma > 0) || !(typical > 0)) return 'ivar';
  const ls = Math.log(sigma);
  const lt = Math.log(typical);
  const score = { ivar: Math.abs(lt + 2 * ls), error: Math.abs(lt - ls), variance: Math.abs(lt - 2 * ls) };
  return (Object.keys(score) as (keyof typeof score)[]).reduce((a, b) => (score[b] < score[a] ? b : a));
}

/** True when an image HDU is a companion (uncertainty, mask or wavelength) rather than a flux image. */
export function isCompanionImage(hdu: FitsHdu): boolean {
  const r = roleOf(hdu.extname);
  return r !== null && r !== 'flux';
}

function companionRow(bytes: Uint8Array, hdu: FitsHdu, n: number, file: string, what: string): Float64Array {
  if (hdu.axes[0] !== n) {
    throw new SpectrumReadError(file, `${what} image '${hdu.extname}' has ${hdu.axes[0]} pixels but the flux has ${n}`, { hdu: hdu.index, keyword: 'NAXIS1' });
  }
  return imageRow(bytes, hdu, 0, file);
}

/** Wavelengths from a row or HDU of values; `headerAir` when the header says the wavelengths are in air (VACUUM = F ...). */
function wavelengthFromValues(values: Float64Array, role: Role, headerAir = false): { wl: Float64Array; air: boolean } {
  if (role === 'loglam') for (let i = 0; i < values.length; i++) values[i] = 10 ** values[i];
  return { wl: values, air: role === 'wave-air' || headerAir };
}

/**
 * Read the spectrum whose flux is in image HDU `hdus[index]`. Uncertainty and mask
 * come from rows of the same image or from other IMAGE HDUs named for them.
 */
export function readImage(bytes: Uint8Array, file: string, hdus: readonly FitsHdu[], index: number): RawSpectrum {
  const hdu = hdus[index];
  const h = hdu.header;
  const { n, rows } = shapeOf(hdu, file);
  const layout = rows > 1 ? rowLayout(h, rows) : null;
  const roles = layout?.roles ?? null;

  const fluxRow = roles ? Math.max(roles.indexOf('flux'), 0) : 0;
  const flux = imageRow(bytes, hdu, fluxRow, file);

  let ivar: Float64Array | null = null;
  let mask: Uint8Array | undefined;
  let wl: Float64Array | null = null;
  let air = false;
  let rule = '';
  let noiseFrom = '';

  if (rows > 1) {
    if (roles) {
      const u = roles.findIndex((r, i) => i !== fluxRow && isUncertainty(r));
      if (u >= 0) {
        ivar = toInverseVariance(imageRow(bytes, hdu, u, file), roles[u] as 'ivar' | 'variance' | 'error');
        noiseFrom = `row ${u + 1} (${roles[u]})`;
      }
      let m = roles.indexOf('mask');
      // Bit masks are used only without an uncertainty (see names.ts), except the
      // and-mask row of an EXTEN0 layout ('Flux Inverse ... Andmask Ormask'), whose
      // bits all mark pixels bad in every exposure: there a non-zero and-mask masks
      // the pixel. The or-mask (bad in some exposure) is not applied.
      if (m < 0 && (!ivar || layout?.source === 'EXTEN0')) m = roles.indexOf('bitmask');
      if (m >= 0) mask = toMask(imageRow(bytes, hdu, m, file));
      const w = roles.findIndex((r) => r === 'wave' || r === 'loglam' || r === 'wave-air');
      if (w >= 0) {
        ({ wl, air } = wavelengthFromValues(imageRow(bytes, hdu, w, file), roles[w]!, headerSaysAir(h)));
        rule = `row ${w + 1} (${roles[w]})`;
      }
    } else {
      const row = imageRow(bytes, hdu, 1, file);
      const kind = guessNoiseKind(flux, row);
      ivar = toInverseVariance(row, kind);
      noiseFrom = `row 2 (${kind}, judged from the data)`;
      if (rows === FIVE_ROW_LAYOUT) {
        const five = undescribedFiveRows(bytes, hdu, n, file, hdus, index);
        if (five) {
          mask = five.mask;
          if (five.wl) {
            ({ wl, air } = wavelengthFromValues(five.wl, 'wave', headerSaysAir(h)));
            rule = 'row 3 (wavelength, 5-row layout)';
          }
        }
      }
    }
  }

  if (!wl) {
    let axis = spectralAxis(h, n, file, hdu.index);
    if (!axis && index > 0) axis = spectralAxis(hdus[0].header, n, file, 0);
    if (axis) {
      wl = axis.wavelengthA;
      air = axis.air;
      rule = axis.rule;
    }
  }

  const others = hdus.filter((o) => o !== hdu && o.kind === 'image');
  for (const other of others) {
    const role = roleOf(other.extname);
    if (!ivar && isUncertainty(role)) {
      ivar = toInverseVariance(companionRow(bytes, other, n, file, 'uncertainty'), role);
      noiseFrom = `HDU ${other.index} '${other.extname}' (${role})`;
    } else if (!mask && role === 'mask') {
      mask = toMask(companionRow(bytes, other, n, file, 'mask'));
    } else if (!wl && (role === 'wave' || role === 'loglam' || role === 'wave-air')) {
      ({ wl, air } = wavelengthFromValues(companionRow(bytes, other, n, file, 'wavelength'), role));
      rule = `HDU ${other.index} '${other.extname}'`;
    }
  }

  if (!mask && !ivar) {
    const bits = others.find((o) => roleOf(o.extname) === 'bitmask');
    if (bits) mask = toMask(companionRow(bytes, bits, n, file, 'mask'));
  }

  if (!wl) {
    throw new SpectrumReadError(
      file,
      'no wavelength axis: the header has no spectral WCS (CTYPE1/CRVAL1/CDELT1 or CD1_1), no COEFF0/COEFF1, and no wavelength image',
      { hdu: hdu.index, keyword: 'CTYPE1' },
    );
  }
  const headers = index > 0 ? [h, hdus[0].header] : [h];
  return { format: 'fits-image', wavelengthA: wl, air, flux, ivar, mask, headers, where: { hdu: hdu.index }, wavelengthRule: rule, noiseFrom };
}

/** Rows in the survey layout flux, inverse variance, wavelength, and-mask, or-mask. */
const FIVE_ROW_LAYOUT = 5;

/**
 * A 5-row image without BANDIDn or EXTEN0 is read in the survey layout flux,
 * inverse variance, wavelength, and-mask, or-mask only when the data agree:
 * row 3 positive and strictly increasing (and within 1 % of the header's
 * wavelength axis where there is one), rows 4 and 5 whole numbers >= 0.
 * Then row 4 (the and-mask) masks pixels; otherwise rows 3-5 are ignored, as
 * for any undescribed row. Returns the mask and the row-3 wavelengths (null
 * when the header has its own axis, which is then used).
 */
function undescribedFiveRows(
  bytes: Uint8Array, hdu: FitsHdu, n: number, file: string, hdus: readonly FitsHdu[], index: number,
): { mask: Uint8Array; wl: Float64Array | null } | null {
  const andMask = imageRow(bytes, hdu, 3, file);
  if (!isMaskLike(andMask) || !isMaskLike(imageRow(bytes, hdu, 4, file))) return null;
  const wlRow = imageRow(bytes, hdu, 2, file);
  if (!isIncreasingPositive(wlRow)) return null;
  let axis: SpectralAxis | null = null;
  try {
    axis = spectralAxis(hdu.header, n, file, hdu.index) ?? (index > 0 ? spectralAxis(hdus[0].header, n, file, 0) : null);
  } catch {
    axis = null; // an unusable header axis is reported by the main path
  }
  if (axis) {
    for (let i = 0; i < n; i++) if (!(Math.abs(wlRow[i] / axis.wavelengthA[i] - 1) <= 0.01)) return null;
  }
  return { mask: toMask(andMask), wl: axis ? null : wlRow };
}

/** Non-zero (or NaN) mask values mark bad pixels. */
function toMask(values: Float64Array): Uint8Array {
  const m = new Uint8Array(values.length);
  for (let i = 0; i < values.length; i++) m[i] = values[i] === 0 ? 0 : 1;
  return m;
}
