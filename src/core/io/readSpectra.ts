/**
 * Every spectrum in a file: one for ordinary files, one per fibre or object
 * for multi-object FITS files (see fits/multi.ts). The pipeline's readSpectrum
 * is unchanged; this is the entry point for callers that want files with many
 * spectra split.
 *
 * Ids: a spectrum of a multi-object file has `file` = `${file}#${n}`, n the
 * 1-based row (fibre, object) number in the file, stable when rows are dropped,
 * and its object id, when the file gives one, in meta.objectId. A file with one
 * spectrum keeps its plain name, as readSpectrum gives it.
 *
 * Nothing is thrown: each item is a Spectrum or the SpectrumReadError of that
 * row (a bad row fails alone) or, when the file as a whole cannot be read, the
 * one error of the file.
 */
import { SpectrumReadError, type Spectrum } from '../types';
import { gunzipChecked, isGzip, MAX_GUNZIP_BYTES } from './gzip';
import { isFits } from './fits/readFits';
import { walkHdus } from './fits/hdus';
import { multiObjectLayout, type MultiObjectFile } from './fits/multi';
import { MAX_REASON_CHARS, readSpectrum } from './readSpectrum';

export type ReadItem = Spectrum | SpectrumReadError;

/** The id of row `index` (1-based) of a multi-object file. */
export function spectrumId(file: string, index: number): string {
  return `${file}#${index}`;
}

/** Any failure as a SpectrumReadError of `file`, with the reason clipped as readSpectrum clips it. */
function asReadError(e: unknown, file: string): SpectrumReadError {
  if (e instanceof SpectrumReadError) {
    if (e.reason.length <= MAX_REASON_CHARS) return e;
    return new SpectrumReadError(e.file, `${e.reason.slice(0, MAX_REASON_CHARS - 3)}...`, e.where);
  }
  const msg = e instanceof Error ? e.message : String(e);
  return new SpectrumReadError(file, `internal reader error: ${msg}`);
}

/** The multi-object layout of the (unpacked) bytes, or null for a one-spectrum file. */
function layoutOf(bytes: Uint8Array, file: string): MultiObjectFile | null {
  if (!isFits(bytes)) return null;
  let hdus;
  try {
    hdus = walkHdus(bytes, file);
  } catch {
    return null; // readSpectrum reports the broken file
  }
  return multiObjectLayout(bytes, file, hdus);
}

export function readSpectra(bytes: Uint8Array, file: string): ReadItem[] {
  let layout: MultiObjectFile | null;
  let data = bytes;
  try {
    if (isGzip(bytes)) {
      data = gunzipChecked(bytes, file, MAX_GUNZIP_BYTES);
      if (isGzip(data) || data.length === 0) return [single(bytes, file)]; // readSpectrum words these cases
    }
    layout = layoutOf(data, file);
  } catch (e) {
    return [asReadError(e, file)];
  }
  if (!layout) return [single(data, file)];
  const out: ReadItem[] = [];
  for (const row of layout.rows) {
    const id = spectrumId(file, row.index);
    try {
      out.push(row.read(id));
    } catch (e) {
      out.push(asReadError(e, id));
    }
  }
  if (out.length === 0) {
    const n = layout.dropped.length;
    return [new SpectrumReadError(file, `no target spectra: all ${n} rows are marked as sky, unused or the like (${[...new Set(layout.dropped.map((d) => d.type))].join(', ')})`, { hdu: layout.hdu })];
  }
  return out;
}

function single(bytes: Uint8Array, file: string): ReadItem {
  try {
    return readSpectrum(bytes, file);
  } catch (e) {
    return asReadError(e, file);
  }
}
