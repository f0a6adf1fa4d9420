/**
 * Small valid spectrum files, built in memory, that the hostile corpus and the
 * fuzzers break in every way they can. Synthetic data of an invented object
 * ('HX-0007' in an invented field); sizes are kept small so that the corpus
 * can truncate them at every block boundary quickly.
 */
import { gzipSync } from 'fflate';
import { writeBinTableHdu, writeEmptyPrimaryHdu, writeFitsFile, writeImageHdu, type FitsCardInput } from '../../src/core/io/fits/write';

/** Pixels in each valid file: 1500 float64 pixels span 5 data blocks of an image. */
export const N_PIXELS = 1500;
/** First pixel wavelength, Angstrom, and step, Angstrom per pixel (invented). */
const WL0_A = 4000;
const STEP_A = 2;

export interface ValidSet {
  wavelengthA: Float64Array;
  flux: Float64Array;
  ivar: Float64Array;
}

/** A flat continuum with one Gaussian emission line and a gentle ripple (no noise: deterministic). */
export function validArrays(n = N_PIXELS): ValidSet {
  const wavelengthA = new Float64Array(n);
  const flux = new Float64Array(n);
  const ivar = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const wl = WL0_A + STEP_A * i;
    wavelengthA[i] = wl;
    flux[i] = 1 + 0.1 * Math.sin(i / 37) + 4 * Math.exp(-0.5 * ((wl - 5500) / 6) ** 2);
    ivar[i] = 25;
  }
  return { wavelengthA, flux, ivar };
}

/** Spectral WCS cards of the image file (Greisen et al. 2006 WAVE axis, linear). */
export const IMAGE_WCS: FitsCardInput[] = [
  ['CTYPE1', 'WAVE'],
  ['CUNIT1', 'Angstrom'],
  ['CRPIX1', 1],
  ['CRVAL1', WL0_A],
  ['CDELT1', STEP_A],
  ['OBJECT', 'HX-0007'],
  ['BUNIT', '1e-17 erg/s/cm2/A'],
];

/** Primary image: flux with a WCS, plus an IVAR image extension. */
export function validImageFits(n = N_PIXELS): Uint8Array {
  const { flux, ivar } = validArrays(n);
  return writeFitsFile([
    writeImageHdu({ data: flux, cards: IMAGE_WCS }),
    writeImageHdu({ data: Float32Array.from(ivar), primary: false, extname: 'IVAR' }),
  ]);
}

/** Binary table, one row per pixel: wavelength, flux, ivar, mask. */
export function validTableFits(n = N_PIXELS): Uint8Array {
  const { wavelengthA, flux, ivar } = validArrays(n);
  return writeFitsFile([
    writeEmptyPrimaryHdu([['OBJECT', 'HX-0007']]),
    writeBinTableHdu({
      columns: [
        { name: 'WAVELENGTH', format: 'D', unit: 'Angstrom', data: wavelengthA },
        { name: 'FLUX', format: 'E', data: flux },
        { name: 'IVAR', format: 'E', data: ivar },
        { name: 'MASK', format: 'J', data: new Int32Array(n) },
      ],
      nRows: n,
      extname: 'SPECTRUM',
    }),
  ]);
}

/** Binary table with one row holding arrays (repeat = pixel count). */
export function validRowOfArraysFits(n = N_PIXELS): Uint8Array {
  const { wavelengthA, flux, ivar } = validArrays(n);
  return writeFitsFile([
    writeEmptyPrimaryHdu(),
    writeBinTableHdu({
      columns: [
        { name: 'WAVE', format: `${n}D`, unit: 'Angstrom', data: wavelengthA },
        { name: 'FLUX', format: `${n}E`, data: flux },
        { name: 'ERR', format: `${n}E`, data: ivar.map((v) => 1 / Math.sqrt(v)) },
      ],
      nRows: 1,
    }),
  ]);
}

/** A comma-separated text spectrum with a header row. */
export function validCsvText(n = 200): string {
  const { wavelengthA, flux, ivar } = validArrays(n);
  const rows = ['wavelength,flux,ivar'];
  for (let i = 0; i < n; i++) rows.push(`${wavelengthA[i]},${flux[i].toFixed(5)},${ivar[i]}`);
  return rows.join('\n') + '\n';
}

export const utf8 = (s: string): Uint8Array => new TextEncoder().encode(s);

/** The valid CSV, gzipped. */
export function validGzipCsv(n = 200): Uint8Array {
  return gzipSync(utf8(validCsvText(n)));
}

/** The valid table FITS, gzipped. */
export function validGzipFits(n = 300): Uint8Array {
  return gzipSync(validTableFits(n));
}

/**
 * Multi-object files for readSpectra (invented plate 'HX-P1'): a 2-D image of
 * `rows` fibres with an IVAR image and a fibre table (one sky fibre), a
 * binary table of one object per row with array columns, and a 3-D cube of
 * flux / sigma planes named by BANDIDn.
 */
export function validMultiObjectFiles(rows = 8, n = 120): { imageRows: Uint8Array; tableRows: Uint8Array; cube: Uint8Array } {
  const { wavelengthA, flux, ivar } = validArrays(n);
  const fluxRows = new Float32Array(rows * n);
  const ivarRows = new Float32Array(rows * n);
  const waveRows = new Float64Array(rows * n);
  for (let r = 0; r < rows; r++) {
    for (let i = 0; i < n; i++) {
      fluxRows[r * n + i] = flux[i] * (1 + r / 10);
      ivarRows[r * n + i] = ivar[i];
      waveRows[r * n + i] = wavelengthA[i] + r;
    }
  }
  const ids = Array.from({ length: rows }, (_, r) => `HX-P1-${r + 1}`);
  const types = ids.map((_, r) => (r === 2 ? 'SKY' : 'TARGET'));
  const fibres = writeBinTableHdu({
    extname: 'FIBRES',
    nRows: rows,
    columns: [
      { name: 'FIBERID', format: 'J', data: Int32Array.from({ length: rows }, (_, r) => r + 1) },
      { name: 'OBJECT', format: '10A', data: ids },
      { name: 'OBJTYPE', format: '8A', data: types },
    ],
  });
  const imageRows = writeFitsFile([
    writeImageHdu({ data: fluxRows, axes: [n, rows], cards: IMAGE_WCS }),
    writeImageHdu({ data: ivarRows, axes: [n, rows], primary: false, extname: 'IVAR' }),
    fibres,
  ]);
  const tableRows = writeFitsFile([
    writeEmptyPrimaryHdu(),
    writeBinTableHdu({
      extname: 'OBJECTS',
      nRows: rows,
      columns: [
        { name: 'OBJECT', format: '10A', data: ids },
        { name: 'OBJTYPE', format: '8A', data: types },
        { name: 'WAVELENGTH', format: `${n}D`, unit: 'Angstrom', data: waveRows },
        { name: 'FLUX', format: `${n}E`, data: fluxRows },
        { name: 'IVAR', format: `${n}E`, data: ivarRows },
      ],
    }),
  ]);
  const cubeData = new Float32Array(2 * rows * n);
  cubeData.set(fluxRows);
  cubeData.set(ivarRows.map((v) => 1 / Math.sqrt(v)), rows * n);
  const cube = writeFitsFile([
    writeImageHdu({ data: cubeData, axes: [n, rows, 2], cards: [...IMAGE_WCS, ['BANDID1', 'spectrum - extracted'], ['BANDID2', 'sigma - extracted']] }),
    fibres,
  ]);
  return { imageRows, tableRows, cube };
}
