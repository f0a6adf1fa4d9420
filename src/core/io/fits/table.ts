/**
 * A 1-D spectrum from a BINTABLE extension (FITS 4.0, sec. 7.3): columns found
 * by name (see names.ts), either one row per pixel or one row holding arrays.
 * TFORMn codes B, I, J, K, E, D are read (with TSCALn/TZEROn and TNULLn); other
 * columns (L, X, A, C, M, P, Q) are skipped. Every size is checked before any
 * array is allocated.
 */
import { checkPixelCount } from '../assemble';
import { SpectrumReadError } from '../../types';
import { decodeValues } from './decode';
import type { FitsHdu } from './hdus';
import { isUncertainty, roleOf, toInverseVariance, type Role } from './names';
import type { RawSpectrum } from './raw';
import { guessUnitToAngstrom, headerSaysAir, unitToAngstrom } from './wcs';

export interface TableColumn {
  /** 1-based column number (the n of TTYPEn). */
  number: number;
  name: string;
  role: Role | null;
  type: string;
  repeat: number;
  /** Bytes per row. */
  width: number;
  /** Byte offset within the row. */
  offset: number;
  unit: string;
  scale: number;
  zero: number;
  tnull?: number | bigint;
}

/** Bytes per element of each TFORM type letter (X is bits, handled separately). */
const TYPE_BYTES: Record<string, number> = { L: 1, B: 1, I: 2, J: 4, K: 8, A: 1, E: 4, D: 8, C: 8, M: 16, P: 8, Q: 16 };
/** Storage type of the numeric letters, as BITPIX. */
export const NUMERIC_BITPIX: Record<string, number> = { B: 8, I: 16, J: 32, K: 64, E: -32, D: -64 };

/** Parse TFIELDS and every TFORMn/TTYPEn/TUNITn/TSCALn/TZEROn/TNULLn; check the row width. */
export function tableColumns(hdu: FitsHdu, file: string): TableColumn[] {
  const h = hdu.header;
  const at = (keyword: string) => ({ hdu: hdu.index, keyword });
  if (hdu.axes.length !== 2) throw new SpectrumReadError(file, `a binary table needs NAXIS = 2, not ${hdu.axes.length}`, at('NAXIS'));
  if (hdu.bitpix !== 8) throw new SpectrumReadError(file, `a binary table needs BITPIX = 8, not ${hdu.bitpix}`, at('BITPIX'));
  const rowBytes = hdu.axes[0];
  const tfields = h.int('TFIELDS', file, hdu.index)!;
  if (tfields < 0 || tfields > 999) throw new SpectrumReadError(file, `TFIELDS = ${tfields} is outside 0..999`, at('TFIELDS'));
  const cols: TableColumn[] = [];
  let offset = 0;
  for (let k = 1; k <= tfields; k++) {
    const tform = h.str(`TFORM${k}`);
    if (tform === undefined) throw new SpectrumReadError(file, `TFORM${k} is missing`, at(`TFORM${k}`));
    const m = /^(\d*)([A-Za-z])/.exec(tform);
    const type = m ? m[2].toUpperCase() : '';
    if (!m || !(type in TYPE_BYTES || type === 'X')) {
      throw new SpectrumReadError(file, `TFORM${k} = '${tform}' is not a binary-table format`, at(`TFORM${k}`));
    }
    const repeat = m[1] === '' ? 1 : Number(m[1]);
    if (!Number.isSafeInteger(repeat) || repeat > rowBytes * 8) {
      throw new SpectrumReadError(file, `TFORM${k} = '${tform}' claims ${m[1]} elements, more than a ${rowBytes}-byte row can hold`, at(`TFORM${k}`));
    }
    const width = type === 'X' ? Math.ceil(repeat / 8) : repeat * TYPE_BYTES[type];
    const name = h.str(`TTYPE${k}`) ?? '';
    const col: TableColumn = {
      number: k,
      name,
      role: roleOf(name),
      type,
      repeat,
      width,
      offset,
      unit: h.str(`TUNIT${k}`) ?? '',
      scale: h.num(`TSCAL${k}`, file, hdu.index) ?? 1,
      zero: h.num(`TZERO${k}`, file, hdu.index) ?? 0,
    };
    const tnull = h.get(`TNULL${k}`);
    if (typeof tnull === 'number' || typeof tnull === 'bigint') col.tnull = tnull;
    cols.push(col);
    offset += width;
  }
  if (offset !== rowBytes) {
    throw new SpectrumReadError(file, `NAXIS1 = ${rowBytes} bytes per row, but the columns (TFORM1..TFORM${tfields}) add up to ${offset}`, at('NAXIS1'));
  }
  return cols;
}

export interface SpectrumColumns {
  wave: TableColumn;
  flux: TableColumn;
  noise?: TableColumn;
  mask?: TableColumn;
}

export const isNumeric = (c: TableColumn): boolean => c.type in NUMERIC_BITPIX && c.repeat > 0;

/** The wavelength, flux, uncertainty and mask columns, or what is missing. */
export function findSpectrumColumns(cols: readonly TableColumn[]): SpectrumColumns | { missing: 'wavelength' | 'flux' } {
  const num = cols.filter(isNumeric);
  const wave = num.find((c) => c.role === 'wave' || c.role === 'loglam' || c.role === 'wave-air');
  const flux = num.find((c) => c.role === 'flux');
  if (!wave) return { missing: 'wavelength' };
  if (!flux) return { missing: 'flux' };
  const noise = num.find((c) => isUncertainty(c.role));
  const mask = num.find((c) => c.role === 'mask') ?? (noise ? undefined : num.find((c) => c.role === 'bitmask'));
  return { wave, flux, noise, mask };
}

/** Values of one column: one per row (repeat 1) or the array in the single row. */
function columnValues(bytes: Uint8Array, hdu: FitsHdu, col: TableColumn, perRow: boolean, n: number): Float64Array {
  const bitpix = NUMERIC_BITPIX[col.type];
  const scaling = { scale: col.scale, zero: col.zero, ...(col.tnull !== undefined ? { blank: col.tnull } : {}) };
  const start = hdu.dataOffset + col.offset;
  const stride = perRow ? hdu.axes[0] : Math.abs(bitpix) / 8;
  return decodeValues(bytes, start, n, bitpix, scaling, stride);
}

/**
 * In place: a wavelength column's values to Angstrom (10^x for log10 columns;
 * TUNITn, or a unit judged from the size of the values). Returns the rule, for
 * messages. Throws for an unknown TUNITn.
 */
export function columnWavelengthsToAngstrom(wl: Float64Array, wave: TableColumn, file: string, hdu: number): string {
  const n = wl.length;
  if (wave.role === 'loglam') {
    for (let i = 0; i < n; i++) wl[i] = 10 ** wl[i];
    return `column '${wave.name}' (log10 Angstrom)`;
  }
  let factor: number;
  let source: string;
  if (wave.unit !== '') {
    const f = unitToAngstrom(wave.unit);
    if (f === undefined) throw new SpectrumReadError(file, `unknown wavelength unit '${wave.unit}'`, { hdu, keyword: `TUNIT${wave.number}`, column: wave.name });
    factor = f;
    source = `TUNIT${wave.number}`;
  } else {
    let max = 0;
    for (let i = 0; i < n; i++) if (Math.abs(wl[i]) > max) max = Math.abs(wl[i]);
    ({ factor, source } = guessUnitToAngstrom(max));
  }
  if (factor !== 1) for (let i = 0; i < n; i++) wl[i] *= factor;
  return `column '${wave.name}' (${source})`;
}

/** Read the spectrum in binary table `hdus[index]`. */
export function readTable(bytes: Uint8Array, file: string, hdus: readonly FitsHdu[], index: number): RawSpectrum {
  const hdu = hdus[index];
  const h = hdu.header;
  const cols = tableColumns(hdu, file);
  const found = findSpectrumColumns(cols);
  if ('missing' in found) {
    // A column with the right name but a format we do not read (P/Q descriptors, strings, 0 elements) deserves a word.
    const roles: (Role | null)[] = found.missing === 'flux' ? ['flux'] : ['wave', 'loglam', 'wave-air'];
    const unread = cols.find((c) => roles.includes(c.role) && !isNumeric(c));
    const why = unread
      ? `; '${unread.name}' has TFORM${unread.number} = '${h.str(`TFORM${unread.number}`)}', a format not read here: only numeric B, I, J, K, E or D columns with at least one element are`
      : '';
    throw new SpectrumReadError(file, `no ${found.missing} column (columns: ${cols.map((c) => c.name).join(', ') || 'none'}${why})`, { hdu: hdu.index });
  }
  if (hdu.axes[1] === 0) throw new SpectrumReadError(file, 'the table has no rows (NAXIS2 = 0)', { hdu: hdu.index, keyword: 'NAXIS2' });
  const { wave, flux, noise, mask } = found;
  const nRows = hdu.axes[1];
  const colWhere = (c: TableColumn) => ({ hdu: hdu.index, keyword: `TFORM${c.number}`, column: c.name });

  let perRow: boolean;
  let n: number;
  if (wave.repeat === 1 && flux.repeat === 1) {
    perRow = true;
    n = nRows;
    checkPixelCount(file, n, { hdu: hdu.index, keyword: 'NAXIS2' });
  } else if (nRows === 1) {
    perRow = false;
    n = wave.repeat;
    checkPixelCount(file, n, colWhere(wave));
  } else {
    throw new SpectrumReadError(
      file,
      `table has ${nRows} rows of ${Math.max(wave.repeat, flux.repeat)}-element arrays: several spectra in one table; one spectrum per file is read`,
      { hdu: hdu.index, keyword: 'NAXIS2' },
    );
  }
  for (const c of [flux, noise, mask]) {
    if (c && c.repeat !== wave.repeat) {
      throw new SpectrumReadError(file, `column '${c.name}' has ${c.repeat} values per row but '${wave.name}' has ${wave.repeat}`, colWhere(c));
    }
  }

  const wl = columnValues(bytes, hdu, wave, perRow, n);
  const rule = columnWavelengthsToAngstrom(wl, wave, file, hdu.index);
  // Vacuum unless the column name or a header keyword (VACUUM = F, AIRORVAC = 'air') says air.
  const air = wave.role === 'wave-air' || headerSaysAir(h) || (index > 0 && headerSaysAir(hdus[0].header));

  const fluxValues = columnValues(bytes, hdu, flux, perRow, n);
  let ivar: Float64Array | null = null;
  let noiseFrom = '';
  if (noise) {
    ivar = toInverseVariance(columnValues(bytes, hdu, noise, perRow, n), noise.role as 'ivar' | 'variance' | 'error');
    noiseFrom = `column '${noise.name}' (${noise.role})`;
  }
  let maskValues: Uint8Array | undefined;
  if (mask) {
    const v = columnValues(bytes, hdu, mask, perRow, n);
    maskValues = new Uint8Array(n);
    for (let i = 0; i < n; i++) maskValues[i] = v[i] === 0 ? 0 : 1;
  }
  return {
    format: 'fits-table',
    wavelengthA: wl,
    air,
    flux: fluxValues,
    ivar,
    mask: maskValues,
    headers: index > 0 ? [h, hdus[0].header] : [h],
    fluxUnit: flux.unit || undefined,
    where: { hdu: hdu.index },
    wavelengthRule: rule,
    noiseFrom,
  };
}
