/**
 * Big-endian FITS array values to Float64Array.
 * physical = BZERO + BSCALE * stored (FITS 4.0, sec. 5.3); integer pixels equal
 * to BLANK become NaN. BITPIX 64 is read as BigInt64 and converted to Number
 * (exact up to 2^53).
 */

export interface Scaling {
  scale: number;
  zero: number;
  /** Integer BITPIX only: stored value meaning "no data". */
  blank?: number | bigint;
}

/**
 * Read `count` values of type `bitpix` starting at byte `offset`, `strideBytes`
 * apart (the value width for images; the row length for table columns).
 * The caller has checked that the bytes exist.
 */
export function decodeValues(
  bytes: Uint8Array,
  offset: number,
  count: number,
  bitpix: number,
  scaling: Scaling = { scale: 1, zero: 0 },
  strideBytes = Math.abs(bitpix) / 8,
): Float64Array {
  const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  const out = new Float64Array(count);
  const { scale, zero } = scaling;
  const blank = scaling.blank;
  const blankNum = blank === undefined ? undefined : Number(blank);
  // A BLANK/TNULL that is not an integer (1.5, 1E400) can equal no stored integer: ignore it.
  const blankBig = typeof blank === 'bigint' ? blank : blankNum !== undefined && Number.isInteger(blankNum) ? BigInt(blankNum) : undefined;
  let p = offset;
  switch (bitpix) {
    case -32:
      for (let i = 0; i < count; i++, p += strideBytes) out[i] = zero + scale * view.getFloat32(p, false);
      break;
    case -64:
      for (let i = 0; i < count; i++, p += strideBytes) out[i] = zero + scale * view.getFloat64(p, false);
      break;
    case 8:
      for (let i = 0; i < count; i++, p += strideBytes) {
        const v = view.getUint8(p);
        out[i] = v === blankNum ? NaN : zero + scale * v;
      }
      break;
    case 16:
      for (let i = 0; i < count; i++, p += strideBytes) {
        const v = view.getInt16(p, false);
        out[i] = v === blankNum ? NaN : zero + scale * v;
      }
      break;
    case 32:
      for (let i = 0; i < count; i++, p += strideBytes) {
        const v = view.getInt32(p, false);
        out[i] = v === blankNum ? NaN : zero + scale * v;
      }
      break;
    case 64:
      for (let i = 0; i < count; i++, p += strideBytes) {
        const v = view.getBigInt64(p, false);
        out[i] = v === blankBig ? NaN : zero + scale * Number(v);
      }
      break;
    default:
      throw new RangeError(`decodeValues: unsupported BITPIX ${bitpix}`);
  }
  return out;
}
