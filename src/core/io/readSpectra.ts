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
 * one error of the file. The pools read one spectrum at a time instead
 * (readSpectrumById), so that each is its own unit of work.
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

/** A file as the readers see it: its bytes (gzip unpacked once) and its multi-object layout (null: one spectrum). */
export interface OpenedFile {
  data: Uint8Array;
  layout: MultiObjectFile | null;
}

/**
 * Unpack and sniff a file once. Throws SpectrumReadError (gzip or layout
 * problems). Empty or doubly packed gzip data keep their original bytes, so
 * readSpectrum words those cases as it always has.
 */
export function openSpectraFile(bytes: Uint8Array, file: string): OpenedFile {
  let data = bytes;
  if (isGzip(bytes)) {
    data = gunzipChecked(bytes, file, MAX_GUNZIP_BYTES);
    if (isGzip(data) || data.length === 0) return { data: bytes, layout: null };
  }
  return { data, layout: layoutOf(data, file) };
}

/** The error of a multi-object file none of whose rows is a target. */
export function noTargetsError(file: string, layout: MultiObjectFile): SpectrumReadError {
  const n = layout.dropped.length;
  const types = [...new Set(layout.dropped.map((d) => d.type))].join(', ');
  return new SpectrumReadError(file, `no target spectra: all ${n} rows are marked as sky, unused or the like (${types})`, { hdu: layout.hdu });
}

export function readSpectra(bytes: Uint8Array, file: string): ReadItem[] {
  let opened: OpenedFile;
  try {
    opened = openSpectraFile(bytes, file);
  } catch (e) {
    return [asReadError(e, file)];
  }
  const { data, layout } = opened;
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
  return out.length ? out : [noTargetsError(file, layout)];
}

/** The row number an id names (`file#n`), or null when it names no row. */
export function rowOfId(id: string): { file: string; index: number } | null {
  const m = /^(.*)#([1-9]\d{0,8})$/s.exec(id);
  return m ? { file: m[1], index: Number(m[2]) } : null;
}

/**
 * The one spectrum an id names, for callers that work spectrum by spectrum
 * (the pools, the review worker): for a multi-object file the row `#n` at
 * the end of the id (as readSpectra names it), else the file's only
 * spectrum, exactly as readSpectrum reads it. Throws SpectrumReadError only.
 */
export function readSpectrumById(bytes: Uint8Array, id: string): Spectrum {
  let opened: OpenedFile;
  try {
    opened = openSpectraFile(bytes, id);
  } catch (e) {
    throw asReadError(e, id);
  }
  return spectrumOfOpened(opened, id);
}

/** readSpectrumById on a file already opened. */
export function spectrumOfOpened({ data, layout }: OpenedFile, id: string): Spectrum {
  if (!layout) return readSpectrum(data, id);
  const at = rowOfId(id);
  const kind = layout.kind === 'image-rows' ? 'image row' : 'table row';
  if (!at) throw new SpectrumReadError(id, `the file holds ${layout.rows.length} spectra (one per ${kind}); each is read on its own as ${id}#n`, { hdu: layout.hdu });
  const row = layout.rows.find((r) => r.index === at.index);
  if (!row) {
    const dropped = layout.dropped.find((d) => d.index === at.index);
    const why = dropped ? `is marked ${dropped.type}` : `does not exist (the file has ${layout.rowCount} rows)`;
    throw new SpectrumReadError(id, `${kind} ${at.index} ${why}`, { hdu: layout.hdu });
  }
  try {
    return row.read(id);
  } catch (e) {
    throw asReadError(e, id);
  }
}

function single(bytes: Uint8Array, file: string): ReadItem {
  try {
    return readSpectrum(bytes, file);
  } catch (e) {
    return asReadError(e, file);
  }
}
