/**
 * Walk the header-data units of a FITS file and check every declared size
 * against the bytes present before anything is allocated.
 * FITS Standard 4.0 (IAU FITS Working Group, 2016), sec. 3-4 and 7.
 */
import { SpectrumReadError } from '../../types';
import { blockAligned, readHeader, type FitsHeader } from './header';

export type HduKind = 'image' | 'bintable' | 'ascii-table' | 'empty' | 'other';

export interface FitsHdu {
  /** 0 = primary HDU. */
  index: number;
  kind: HduKind;
  header: FitsHeader;
  /** Byte offset of the first data byte. */
  dataOffset: number;
  /** Declared data size in bytes, without block padding. */
  dataBytes: number;
  bitpix: number;
  /** NAXIS1, NAXIS2, ... */
  axes: number[];
  /** EXTNAME, trimmed ('' when absent). */
  extname: string;
}

export const VALID_BITPIX = new Set([8, 16, 32, 64, -32, -64]);

function startsWithAscii(bytes: Uint8Array, offset: number, s: string): boolean {
  if (offset + s.length > bytes.length) return false;
  for (let i = 0; i < s.length; i++) if (bytes[offset + i] !== s.charCodeAt(i)) return false;
  return true;
}

/** True when the bytes begin like a FITS file (`SIMPLE  =`). */
export function startsLikeFits(bytes: Uint8Array): boolean {
  return startsWithAscii(bytes, 0, 'SIMPLE  =');
}

function readHdu(bytes: Uint8Array, offset: number, index: number, file: string): FitsHdu {
  const { header, dataOffset } = readHeader(bytes, offset, file, index);
  const first = header.cards[0];
  if (index === 0) {
    if (first?.key !== 'SIMPLE') throw new SpectrumReadError(file, 'the first card is not SIMPLE', { hdu: 0, keyword: 'SIMPLE' });
    if (first.value !== true) {
      throw new SpectrumReadError(file, 'SIMPLE is not T: the file says it does not conform to the FITS standard', { hdu: 0, keyword: 'SIMPLE' });
    }
  } else if (first?.key !== 'XTENSION') {
    throw new SpectrumReadError(file, 'an extension header must start with XTENSION', { hdu: index, keyword: 'XTENSION' });
  }
  const bitpix = header.int('BITPIX', file, index)!;
  if (!VALID_BITPIX.has(bitpix)) {
    throw new SpectrumReadError(file, `unsupported BITPIX ${bitpix} (FITS allows 8, 16, 32, 64, -32, -64)`, { hdu: index, keyword: 'BITPIX' });
  }
  const naxis = header.int('NAXIS', file, index)!;
  if (naxis < 0 || naxis > 999) throw new SpectrumReadError(file, `NAXIS = ${naxis} is outside 0..999`, { hdu: index, keyword: 'NAXIS' });
  const axes: number[] = [];
  for (let i = 1; i <= naxis; i++) {
    const n = header.int(`NAXIS${i}`, file, index)!;
    if (n < 0) throw new SpectrumReadError(file, `NAXIS${i} = ${n} is negative`, { hdu: index, keyword: `NAXIS${i}` });
    axes.push(n);
  }
  const pcount = index === 0 ? 0 : (header.int('PCOUNT', file, index, false) ?? 0);
  const gcount = index === 0 ? 1 : (header.int('GCOUNT', file, index, false) ?? 1);
  if (pcount < 0) throw new SpectrumReadError(file, `PCOUNT = ${pcount} is negative`, { hdu: index, keyword: 'PCOUNT' });
  if (gcount < 0) throw new SpectrumReadError(file, `GCOUNT = ${gcount} is negative`, { hdu: index, keyword: 'GCOUNT' });
  // Float arithmetic cannot overflow into a small number here; absurd sizes stay absurd.
  // A zero axis makes the product 0 even when the others overflow to Infinity (0 * Infinity would be NaN).
  const nValues = naxis === 0 || axes.includes(0) ? 0 : axes.reduce((a, b) => a * b, 1);
  const dataBytes = (Math.abs(bitpix) / 8) * gcount * (pcount + nValues);
  const available = bytes.length - dataOffset;
  if (dataBytes > available) {
    let keyword = 'NAXIS';
    let largest = -1;
    axes.forEach((n, i) => {
      if (n > largest) {
        largest = n;
        keyword = `NAXIS${i + 1}`;
      }
    });
    const shape = axes.map((n, i) => `NAXIS${i + 1}=${n}`).join(', ');
    throw new SpectrumReadError(
      file,
      `declared data size ${dataBytes} bytes (BITPIX=${bitpix}, ${shape}${pcount ? `, PCOUNT=${pcount}` : ''}) is larger than the ${Math.max(available, 0)} bytes left in the file (truncated or corrupt)`,
      { hdu: index, keyword },
    );
  }
  let kind: HduKind;
  if (index === 0) kind = dataBytes > 0 ? 'image' : 'empty';
  else {
    const x = header.str('XTENSION')?.toUpperCase();
    kind = x === 'IMAGE' ? 'image' : x === 'BINTABLE' || x === 'A3DTABLE' ? 'bintable' : x === 'TABLE' ? 'ascii-table' : 'other';
    if (kind === 'image' && nValues === 0) kind = 'empty';
  }
  // An image's pixels must lie inside its declared data: PCOUNT/GCOUNT other than 0/1
  // (meaningless for images) must not let the readers run past the bytes checked above.
  const imageBytes = (Math.abs(bitpix) / 8) * nValues;
  if (kind === 'image' && imageBytes > dataBytes) {
    throw new SpectrumReadError(file, `image of ${nValues} values needs ${imageBytes} bytes but PCOUNT/GCOUNT declare ${dataBytes}`, { hdu: index, keyword: 'GCOUNT' });
  }
  return { index, kind, header, dataOffset, dataBytes, bitpix, axes, extname: header.str('EXTNAME') ?? '' };
}

/**
 * All HDUs of a file, in order. Throws SpectrumReadError for an empty file, a file
 * that does not start with SIMPLE, a truncated or END-less header, an unsupported
 * BITPIX, or data declared larger than the file. Bytes after the last complete HDU
 * that do not start a new extension are ignored, as the standard allows.
 */
export function walkHdus(bytes: Uint8Array, file: string): FitsHdu[] {
  if (bytes.length === 0) throw new SpectrumReadError(file, 'empty file (0 bytes)');
  if (!startsLikeFits(bytes)) throw new SpectrumReadError(file, "not a FITS file: it does not start with 'SIMPLE  ='", { hdu: 0, keyword: 'SIMPLE' });
  const hdus: FitsHdu[] = [];
  let offset = 0;
  for (;;) {
    const hdu = readHdu(bytes, offset, hdus.length, file);
    hdus.push(hdu);
    offset = hdu.dataOffset + blockAligned(hdu.dataBytes);
    // A following extension that is cut short is an error (readHeader says so); other trailing bytes are ignored.
    if (offset >= bytes.length || !startsWithAscii(bytes, offset, 'XTENSION')) break;
  }
  return hdus;
}
