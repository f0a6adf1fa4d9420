/**
 * Read one 1-D spectrum from FITS bytes: walk the HDUs, take the first image
 * with a wavelength axis or the first binary table with wavelength and flux
 * columns, convert air wavelengths to vacuum (Morton 2000, see airVacuum.ts),
 * and validate through assembleSpectrum. Every failure is a SpectrumReadError
 * naming the file, and where known the HDU and keyword.
 */
import { assembleSpectrum } from '../assemble';
import { airToVacuumInPlace } from '../airVacuum';
import { SpectrumReadError, type Spectrum } from '../../types';
import { startsLikeFits, walkHdus, type FitsHdu } from './hdus';
import { isCompanionImage, readImage } from './image';
import { metaFromHeaders } from './meta';
import type { RawSpectrum } from './raw';
import { findSpectrumColumns, readTable, tableColumns } from './table';

/** True when the bytes start like a FITS file ('SIMPLE  ='). */
export function isFits(bytes: Uint8Array): boolean {
  return startsLikeFits(bytes);
}

/** Pick the HDU holding the spectrum and read it. */
function readRaw(bytes: Uint8Array, file: string, hdus: readonly FitsHdu[]): RawSpectrum {
  let firstError: SpectrumReadError | undefined;
  for (const hdu of hdus) {
    if (hdu.kind === 'image' && !isCompanionImage(hdu)) {
      try {
        return readImage(bytes, file, hdus, hdu.index);
      } catch (e) {
        // An image without wavelengths may sit beside a table that has them: keep looking.
        if (!(e instanceof SpectrumReadError) || !/^no wavelength axis/.test(e.reason)) throw e;
        firstError ??= e;
      }
    } else if (hdu.kind === 'bintable') {
      const found = findSpectrumColumns(tableColumns(hdu, file));
      if (!('missing' in found)) return readTable(bytes, file, hdus, hdu.index);
      if (!firstError) {
        try {
          readTable(bytes, file, hdus, hdu.index); // throws the 'no ... column' error for this table
        } catch (e) {
          if (!(e instanceof SpectrumReadError)) throw e;
          firstError = e;
        }
      }
    }
  }
  if (firstError) throw firstError;
  if (hdus.some((h) => h.kind === 'ascii-table')) {
    throw new SpectrumReadError(file, "no spectrum: ASCII tables (XTENSION = 'TABLE') are not read; binary tables and images are", {
      hdu: hdus.find((h) => h.kind === 'ascii-table')!.index,
      keyword: 'XTENSION',
    });
  }
  throw new SpectrumReadError(file, `no spectrum: none of the ${hdus.length} HDU(s) holds image data or a binary table`);
}

function reverse<T extends { length: number; [i: number]: number }>(a: T): void {
  for (let i = 0, j = a.length - 1; i < j; i++, j--) {
    const t = a[i];
    a[i] = a[j];
    a[j] = t;
  }
}

/**
 * Read a 1-D spectrum from the bytes of a FITS file. `file` is used in messages
 * and stored in the Spectrum. Gzip is not handled here.
 */
export function readFits(bytes: Uint8Array, file: string): Spectrum {
  const hdus = walkHdus(bytes, file);
  const raw = readRaw(bytes, file, hdus);
  const { wavelengthA: wl, flux } = raw;
  if (raw.air) airToVacuumInPlace(wl);
  // Some files run from red to blue; the Spectrum contract wants increasing wavelength.
  if (wl.length > 1 && wl[0] > wl[wl.length - 1]) {
    reverse(wl);
    reverse(flux);
    if (raw.ivar) reverse(raw.ivar);
    if (raw.mask) reverse(raw.mask);
  }
  const meta = metaFromHeaders(raw.headers, raw.fluxUnit);
  if (raw.air) meta.convertedFromAir = true;
  return assembleSpectrum({ file, format: raw.format, wavelengthA: wl, flux, ivar: raw.ivar, mask: raw.mask, meta, where: raw.where });
}
