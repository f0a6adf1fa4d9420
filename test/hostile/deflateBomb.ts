/**
 * A gzip "bomb" built bit by bit instead of by compressing hundreds of
 * megabytes: one fixed-Huffman deflate block (RFC 1951, sec. 3.2.6) holding a
 * literal zero byte followed by copies of (length 258, distance 1), 13 bits per
 * 258 output bytes. Building 520 MiB worth takes a few megabytes and tens of
 * milliseconds, where compressing the zeros with a library takes ~10 s here.
 */
import { crc32Update } from '../../src/core/io/gzip';

/** LSB-first bit packer (RFC 1951, sec. 3.1.1). */
class BitWriter {
  private readonly out: Uint8Array;
  private pos = 0;
  private bit = 0;
  constructor(capacityBytes: number) {
    this.out = new Uint8Array(capacityBytes);
  }
  /** Data elements (header fields, extra bits): least significant bit first. */
  bits(value: number, n: number): void {
    for (let i = 0; i < n; i++) this.push((value >>> i) & 1);
  }
  /** Huffman codes: most significant bit first. */
  code(code: number, n: number): void {
    for (let i = n - 1; i >= 0; i--) this.push((code >>> i) & 1);
  }
  private push(b: number): void {
    if (b) this.out[this.pos] |= 1 << this.bit;
    if (++this.bit === 8) {
      this.bit = 0;
      this.pos++;
    }
  }
  bytes(): Uint8Array {
    return this.out.slice(0, this.pos + (this.bit ? 1 : 0));
  }
}

/** Raw deflate data that inflates to exactly 1 + 258 * copies zero bytes. */
export function deflateZeros(copies: number): Uint8Array {
  const w = new BitWriter(Math.ceil((3 + 8 + 13 * copies + 7) / 8) + 2);
  w.bits(1, 1); // BFINAL
  w.bits(1, 2); // BTYPE = 01, fixed Huffman codes
  w.code(0x30, 8); // literal 0: codes 0-143 are 0x30 + value, 8 bits
  for (let i = 0; i < copies; i++) {
    w.code(0xc5, 8); // length 258 = symbol 285 = 0xC0 + 5, 8 bits, no extra bits
    w.code(0, 5); // distance 1 = distance code 0, 5 bits, no extra bits
  }
  w.code(0, 7); // end of block = symbol 256, 7 bits of zeros
  return w.bytes();
}

/**
 * CRC-32 of `n` zero bytes without touching n bytes: the per-byte update is
 * linear over GF(2), so n steps are the n-th power of a 32x32 bit matrix, found
 * by repeated squaring (the method of zlib's crc32_combine, common practice).
 * Tested against crc32Update on small n.
 */
export function crc32OfZeros(n: number): number {
  // The operator for one zero byte, as the images of the 32 basis vectors.
  const one = new Uint32Array(32);
  const zero = new Uint8Array(1);
  for (let k = 0; k < 32; k++) {
    // crc32Update starts from the register value; one byte of 0 applied to basis vector 2^k.
    one[k] = crc32Update((1 << k) >>> 0, zero);
  }
  const apply = (m: Uint32Array, v: number): number => {
    let r = 0;
    for (let k = 0; v !== 0; k++, v >>>= 1) if (v & 1) r ^= m[k];
    return r >>> 0;
  };
  const square = (m: Uint32Array): Uint32Array => m.map((col) => apply(m, col));
  let reg = 0xffffffff;
  let m: Uint32Array = one;
  for (let left = n; left > 0; left = Math.floor(left / 2)) {
    if (left % 2 === 1) reg = apply(m, reg);
    m = square(m);
  }
  return (reg ^ 0xffffffff) >>> 0;
}

/**
 * A single-member gzip file (RFC 1952) of about `megabytes` MiB of zeros. With
 * `statedSize` the trailer's ISIZE lies (an honest trailer otherwise), to test
 * the running size check as well as the trailer check.
 */
export function gzipBomb(megabytes: number, statedSize?: number): Uint8Array {
  const copies = Math.ceil((megabytes * 1024 * 1024 - 1) / 258);
  const size = 1 + 258 * copies;
  const deflate = deflateZeros(copies);
  const out = new Uint8Array(10 + deflate.length + 8);
  out.set([0x1f, 0x8b, 8, 0, 0, 0, 0, 0, 0, 0xff]); // magic, CM = deflate, no flags, no time, OS unknown
  out.set(deflate, 10);
  const view = new DataView(out.buffer);
  view.setUint32(10 + deflate.length, crc32OfZeros(size), true);
  view.setUint32(14 + deflate.length, (statedSize ?? size) >>> 0, true);
  return out;
}

/** Bytes a bomb of `megabytes` MiB inflates to. */
export function bombSize(megabytes: number): number {
  return 1 + 258 * Math.ceil((megabytes * 1024 * 1024 - 1) / 258);
}
