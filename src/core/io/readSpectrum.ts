/**
 * The one entry point from file bytes to a Spectrum. The format is sniffed from
 * the content, never from the file name: gzip (1f 8b) is unpacked and sniffed
 * again, FITS ('SIMPLE  =') goes to the FITS reader, anything else that looks
 * like text goes to the text reader, and recognisably binary data is refused.
 * Callers only ever see SpectrumReadError: anything else a reader throws is a
 * bug, reported as "internal reader error" with the file name.
 */
import { SpectrumReadError, type Spectrum } from '../types';
import { gunzipChecked, isGzip, MAX_GUNZIP_BYTES } from './gzip';
import { isFits, readFits } from './fits/readFits';
import { readTextSpectrum } from './text';

/** Longest reason shown, characters: a header value quoted in a message can be megabytes long. */
export const MAX_REASON_CHARS = 500;

export type ReadOutcome = { ok: true; spectrum: Spectrum } | { ok: false; error: SpectrumReadError };

export function readSpectrum(bytes: Uint8Array, file: string): Spectrum {
  try {
    return sniffAndRead(bytes, file, false);
  } catch (e) {
    if (e instanceof SpectrumReadError) {
      if (e.reason.length <= MAX_REASON_CHARS) throw e;
      throw new SpectrumReadError(file, `${e.reason.slice(0, MAX_REASON_CHARS - 3)}...`, e.where);
    }
    const msg = e instanceof Error ? e.message : String(e);
    throw new SpectrumReadError(file, `internal reader error: ${msg}`);
  }
}

/** readSpectrum that returns its failure instead of throwing it. */
export function tryReadSpectrum(bytes: Uint8Array, file: string): ReadOutcome {
  try {
    return { ok: true, spectrum: readSpectrum(bytes, file) };
  } catch (e) {
    return { ok: false, error: e as SpectrumReadError }; // readSpectrum throws nothing else
  }
}

function sniffAndRead(bytes: Uint8Array, file: string, unpacked: boolean): Spectrum {
  if (bytes.length === 0) throw new SpectrumReadError(file, unpacked ? 'empty file (the gzip data holds nothing)' : 'empty file');
  if (isGzip(bytes)) {
    if (unpacked) throw new SpectrumReadError(file, 'gzip data inside gzip data; unpack the outer layer first');
    return sniffAndRead(gunzipChecked(bytes, file, MAX_GUNZIP_BYTES), file, true);
  }
  if (isFits(bytes)) return readFits(bytes, file);
  const binary = binaryKind(bytes);
  if (binary) throw new SpectrumReadError(file, `${binary}; expected a FITS file or a text table of columns`);
  return readTextSpectrum(bytes, file);
}

/** Well-known signatures of formats that are not spectra we read, by their first bytes. */
const SIGNATURES: { bytes: number[]; what: string }[] = [
  { bytes: [0x50, 0x4b, 0x03, 0x04], what: 'a zip archive (unpack it first)' },
  { bytes: [0x42, 0x5a, 0x68], what: 'bzip2-compressed data (unpack it first, or use gzip)' },
  { bytes: [0xfd, 0x37, 0x7a, 0x58, 0x5a, 0x00], what: 'xz-compressed data (unpack it first, or use gzip)' },
  { bytes: [0x89, 0x48, 0x44, 0x46, 0x0d, 0x0a, 0x1a, 0x0a], what: 'HDF5 data, which is not supported' },
  { bytes: [0x25, 0x50, 0x44, 0x46, 0x2d], what: 'a PDF document' },
  { bytes: [0x89, 0x50, 0x4e, 0x47], what: 'a PNG image' },
  { bytes: [0xff, 0xd8, 0xff], what: 'a JPEG image' },
  { bytes: [0xff, 0xfe], what: 'UTF-16 text (save it as UTF-8)' },
  { bytes: [0xfe, 0xff], what: 'UTF-16 text (save it as UTF-8)' },
];

/** Bytes examined when deciding whether data is text. */
const SNIFF_BYTES = 8192;

/**
 * Why the bytes are not text, or null when they may be. Text has no NUL bytes
 * and few control characters (tab, LF, CR and form feed excepted).
 */
export function binaryKind(bytes: Uint8Array): string | null {
  for (const s of SIGNATURES) {
    if (bytes.length >= s.bytes.length && s.bytes.every((b, i) => bytes[i] === b)) return s.what;
  }
  const n = Math.min(bytes.length, SNIFF_BYTES);
  let control = 0;
  for (let i = 0; i < n; i++) {
    const b = bytes[i];
    if (b === 0) return 'binary data (it contains NUL bytes)';
    if (b < 32 && b !== 9 && b !== 10 && b !== 13 && b !== 12) control++;
  }
  if (control > n / 100) return 'binary data (many control characters)';
  return null;
}
