import { Gunzip } from 'fflate';
import { SpectrumReadError } from '../types';

/** Hard limit on the size of any decompressed file, bytes (512 MiB). */
export const MAX_GUNZIP_BYTES = 512 * 1024 * 1024;

/** Largest expansion deflate can achieve, about 1032:1 (a 258-byte match per
 * 2-bit code, RFC 1951 sec. 3.2.5; the figure is common practice). */
const MAX_DEFLATE_RATIO = 1032;

/** Compressed bytes fed to the inflater per step: one step yields at most
 * ~17 MB before the running size check runs. */
const STEP_BYTES = 16 * 1024;

/** True when the bytes start with the gzip magic number 1f 8b (RFC 1952, sec. 2.3.1). */
export function isGzip(bytes: Uint8Array): boolean {
  return bytes.length >= 2 && bytes[0] === 0x1f && bytes[1] === 0x8b;
}

/**
 * Decompress a gzip file without trusting it: the trailer's ISIZE is checked
 * against `maxBytes` before inflating, the running output size is checked while
 * inflating (ISIZE is only the size modulo 2^32 and can lie), and for a
 * single-member file the CRC-32 and ISIZE of the trailer are compared with the
 * output afterwards, which catches truncated and corrupt files (RFC 1952, sec. 2.3.1).
 * Every failure is a SpectrumReadError naming the file.
 */
export function gunzipChecked(bytes: Uint8Array, file: string, maxBytes: number = MAX_GUNZIP_BYTES): Uint8Array {
  if (!isGzip(bytes)) throw new SpectrumReadError(file, 'not gzip data (no 1f 8b magic number)');
  // 10-byte header + at least 2 bytes of deflate data + 8-byte trailer.
  if (bytes.length < 20) throw new SpectrumReadError(file, `gzip data is truncated (only ${bytes.length} bytes)`);
  const n = bytes.length;
  const trailerCrc = (bytes[n - 8] | (bytes[n - 7] << 8) | (bytes[n - 6] << 16) | (bytes[n - 5] << 24)) >>> 0;
  const trailerSize = (bytes[n - 4] | (bytes[n - 3] << 8) | (bytes[n - 2] << 16) | (bytes[n - 1] << 24)) >>> 0;
  // A trailer size beyond the deflate ratio limit cannot be true: the file is
  // truncated or corrupt, and the CRC check below will say so.
  const plausible = trailerSize <= MAX_DEFLATE_RATIO * n;
  if (plausible && trailerSize > maxBytes) {
    throw new SpectrumReadError(file, `gzip trailer states ${trailerSize} bytes uncompressed, more than the limit of ${maxBytes} bytes`);
  }

  const chunks: Uint8Array[] = [];
  let total = 0;
  let crc = 0xffffffff;
  let members = 1;
  let overLimit = false;
  const inflater = new Gunzip((chunk) => {
    total += chunk.length;
    if (total > maxBytes) {
      overLimit = true;
      return;
    }
    chunks.push(chunk);
    crc = crc32Update(crc, chunk);
  });
  inflater.onmember = () => {
    members++;
  };
  try {
    for (let at = 0; at < n && !overLimit; at += STEP_BYTES) {
      const end = Math.min(n, at + STEP_BYTES);
      inflater.push(bytes.subarray(at, end), end === n);
    }
  } catch (e) {
    throw new SpectrumReadError(file, `gzip data is truncated or corrupt (${e instanceof Error ? e.message : String(e)})`);
  }
  if (overLimit) {
    throw new SpectrumReadError(file, `gzip data expands to more than the limit of ${maxBytes} bytes`);
  }
  if (members === 1) {
    if ((total >>> 0) !== trailerSize || ((crc ^ 0xffffffff) >>> 0) !== trailerCrc) {
      throw new SpectrumReadError(file, 'gzip data is truncated or corrupt (size or CRC-32 does not match the trailer)');
    }
  }
  const out = new Uint8Array(total);
  let pos = 0;
  for (const c of chunks) {
    out.set(c, pos);
    pos += c.length;
  }
  return out;
}

let crcTable: Uint32Array | null = null;

/** CRC-32 table, polynomial 0xEDB88320 (ISO 3309 / ITU-T V.42, as used by gzip, RFC 1952 sec. 8). */
function table(): Uint32Array {
  if (crcTable) return crcTable;
  crcTable = new Uint32Array(256);
  for (let i = 0; i < 256; i++) {
    let c = i;
    for (let k = 0; k < 8; k++) c = c & 1 ? 0xedb88320 ^ (c >>> 1) : c >>> 1;
    crcTable[i] = c >>> 0;
  }
  return crcTable;
}

/** Feed bytes into a running CRC-32 (start with 0xffffffff, finish with ^ 0xffffffff). */
export function crc32Update(crc: number, data: Uint8Array): number {
  const t = table();
  let c = crc;
  for (let i = 0; i < data.length; i++) c = t[(c ^ data[i]) & 0xff] ^ (c >>> 8);
  return c >>> 0;
}
