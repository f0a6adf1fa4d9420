/**
 * FITS layouts of the demo set, written with the project's FITS writer
 * (io/fits/write.ts). Pure: returns bytes.
 */
import { gzipSync } from 'fflate';
import type { Spectrum } from '../types';
import { writeBinTableHdu, writeEmptyPrimaryHdu, writeFitsFile, writeImageHdu, type FitsCardInput } from '../io/fits/write';

export interface FitsFacts {
  objectId: string;
  raDeg: number;
  decDeg: number;
  dateObs: string;
  exposureS: number;
  fluxUnit: string;
}

export type FitsLayout =
  | 'fits-wave-linear'
  | 'fits-wave-cd'
  | 'fits-wave-log'
  | 'fits-dcflag-log10'
  | 'fits-awav'
  | 'fits-bitpix-64'
  | 'fits-bitpix-16'
  | 'fits-table-loglam'
  | 'fits-table-wave'
  | 'fits-table-arrays'
  | 'fits-gz';

/** How the pixel grid of a FITS image is described (values chosen by the sample plan). */
export type FitsAxis =
  | { kind: 'linear'; startA: number; stepA: number }
  | { kind: 'cd'; crpix: number; crvalA: number; cdA: number }
  | { kind: 'log'; startA: number; dLog10: number }
  | { kind: 'dcflag'; startA: number; dLog10: number }
  | { kind: 'awav'; startAirA: number; stepA: number };

function metaCards(f: FitsFacts): FitsCardInput[] {
  return [
    ['OBJECT', f.objectId, 'invented object id'],
    ['RA', f.raDeg, '[deg] invented position'],
    ['DEC', f.decDeg, '[deg] invented position'],
    ['DATE-OBS', f.dateObs, 'invented date'],
    ['EXPTIME', f.exposureS, '[s]'],
    ['BUNIT', f.fluxUnit],
    ['COMMENT', 'Synthetic spectrum from the Shiftmark simulator: not a real observation.'],
  ];
}

function axisCards(a: FitsAxis): FitsCardInput[] {
  switch (a.kind) {
    case 'linear':
      return [['CTYPE1', 'WAVE'], ['CUNIT1', 'Angstrom'], ['CRPIX1', 1], ['CRVAL1', a.startA], ['CDELT1', a.stepA]];
    case 'cd':
      return [['CTYPE1', 'WAVE'], ['CUNIT1', 'Angstrom'], ['CRPIX1', a.crpix], ['CRVAL1', a.crvalA], ['CD1_1', a.cdA]];
    case 'log':
      // Greisen et al. 2006 (Paper III) -LOG: lambda = CRVAL exp(CDELT (p - CRPIX) / CRVAL);
      // a grid uniform in log10 needs CDELT = CRVAL ln(10) dlog10 (docs/reference.md sec. 8).
      return [['CTYPE1', 'WAVE-LOG'], ['CUNIT1', 'Angstrom'], ['CRPIX1', 1], ['CRVAL1', a.startA], ['CDELT1', a.startA * Math.LN10 * a.dLog10]];
    case 'dcflag':
      // Legacy convention (not FITS standard): CRVAL1/CDELT1 in log10(lambda) when DC-FLAG = 1.
      return [['CTYPE1', 'LINEAR'], ['CRPIX1', 1], ['CRVAL1', Math.log10(a.startA)], ['CDELT1', a.dLog10], ['DC-FLAG', 1]];
    case 'awav':
      return [['CTYPE1', 'AWAV'], ['CUNIT1', 'Angstrom'], ['CRPIX1', 1], ['CRVAL1', a.startAirA], ['CDELT1', a.stepA]];
  }
}

function errorOf(ivar: Float64Array): Float32Array {
  return Float32Array.from(ivar, (v) => (v > 0 ? 1 / Math.sqrt(v) : 0));
}

/** Flux as BITPIX 16 with BSCALE/BZERO spanning the data range (quantisation ~1/65000 of the range). */
function int16Scaling(flux: Float64Array): { bscale: number; bzero: number } {
  let lo = Infinity;
  let hi = -Infinity;
  for (const v of flux) {
    if (v < lo) lo = v;
    if (v > hi) hi = v;
  }
  const bzero = Number(((lo + hi) / 2).toPrecision(8));
  const bscale = Number(((hi - lo) / 65000 || 1).toPrecision(8));
  return { bscale, bzero };
}

/** Bytes of one FITS image layout: flux in the primary HDU, uncertainty in a named extension. */
export function writeFitsImageLayout(layout: FitsLayout, s: Spectrum, f: FitsFacts, axis: FitsAxis): Uint8Array {
  const ivar = s.ivar ?? new Float64Array(s.flux.length);
  const cards = [...axisCards(axis), ...metaCards(f)];
  const hdus: Uint8Array[] = [];
  if (layout === 'fits-bitpix-64') {
    hdus.push(writeImageHdu({ data: Float64Array.from(s.flux), bitpix: -64, cards }));
    hdus.push(writeImageHdu({ data: Float64Array.from(ivar), bitpix: -64, primary: false, extname: 'IVAR' }));
  } else if (layout === 'fits-bitpix-16') {
    const { bscale, bzero } = int16Scaling(s.flux);
    hdus.push(writeImageHdu({ data: Array.from(s.flux), bitpix: 16, bscale, bzero, cards }));
    hdus.push(writeImageHdu({ data: Float32Array.from(ivar), primary: false, extname: 'IVAR' }));
  } else if (layout === 'fits-wave-cd') {
    // The uncertainty as 1-sigma errors in an extension found by its EXTNAME.
    hdus.push(writeImageHdu({ data: Float32Array.from(s.flux), cards }));
    hdus.push(writeImageHdu({ data: errorOf(ivar), primary: false, extname: 'ERROR' }));
  } else {
    hdus.push(writeImageHdu({ data: Float32Array.from(s.flux), cards }));
    hdus.push(writeImageHdu({ data: Float32Array.from(ivar), primary: false, extname: 'IVAR' }));
  }
  const bytes = writeFitsFile(hdus);
  return layout === 'fits-gz' ? gzipSync(bytes, { level: 9, mtime: 0 }) : bytes;
}

/** Bytes of one FITS binary-table layout (empty primary HDU with the metadata, then the table). */
export function writeFitsTableLayout(layout: 'fits-table-loglam' | 'fits-table-wave' | 'fits-table-arrays', s: Spectrum, f: FitsFacts): Uint8Array {
  const n = s.flux.length;
  const ivar = s.ivar ?? new Float64Array(n);
  const primary = writeEmptyPrimaryHdu(metaCards(f));
  let table: Uint8Array;
  if (layout === 'fits-table-loglam') {
    table = writeBinTableHdu({
      nRows: n,
      extname: 'SPECTRUM',
      columns: [
        { name: 'loglam', format: 'D', unit: 'log10(Angstrom)', data: Float64Array.from(s.wavelengthA, (w) => Math.log10(w)) },
        { name: 'flux', format: 'E', unit: f.fluxUnit, data: Float32Array.from(s.flux) },
        { name: 'ivar', format: 'E', data: Float32Array.from(ivar) },
      ],
    });
  } else if (layout === 'fits-table-wave') {
    table = writeBinTableHdu({
      nRows: n,
      extname: 'SPECTRUM',
      columns: [
        { name: 'WAVELENGTH', format: 'D', unit: 'Angstrom', data: Float64Array.from(s.wavelengthA) },
        { name: 'FLUX', format: 'E', unit: f.fluxUnit, data: Float32Array.from(s.flux) },
        { name: 'ERROR', format: 'E', unit: f.fluxUnit, data: errorOf(ivar) },
        { name: 'MASK', format: 'B', data: Uint8Array.from(s.mask) },
      ],
    });
  } else {
    table = writeBinTableHdu({
      nRows: 1,
      extname: 'SPECTRUM',
      columns: [
        { name: 'WAVE', format: `${n}D`, unit: 'Angstrom', data: Float64Array.from(s.wavelengthA) },
        { name: 'FLUX', format: `${n}E`, unit: f.fluxUnit, data: Float32Array.from(s.flux) },
        { name: 'IVAR', format: `${n}E`, data: Float32Array.from(ivar) },
      ],
    });
  }
  return writeFitsFile([primary, table]);
}

