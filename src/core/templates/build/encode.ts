/**
 * Template vectors are stored as 16-bit integers scaled to each vector's
 * largest |value| (relative precision 3e-5, far below any template's own
 * error), base64-encoded so the generated module is plain text that every
 * bundler and Node load alike.
 */
const ALPHABET = 'ABCDEFGHIJKLMNOPQRSTUVWXYZabcdefghijklmnopqrstuvwxyz0123456789+/';

export interface EncodedVector {
  scale: number;
  data: string;
}

export function encodeVector(v: Float64Array): EncodedVector {
  let m = 0;
  for (const x of v) m = Math.max(m, Math.abs(x));
  const scale = m > 0 ? m / 32767 : 1;
  const bytes = new Uint8Array(v.length * 2);
  for (let i = 0; i < v.length; i++) {
    const q = Math.round(v[i] / scale) & 0xffff;
    bytes[2 * i] = q & 0xff;
    bytes[2 * i + 1] = q >> 8;
  }
  return { scale, data: toBase64(bytes) };
}

export function decodeVector(e: EncodedVector, length: number): Float64Array {
  const bytes = fromBase64(e.data);
  if (bytes.length !== 2 * length) throw new Error(`template vector holds ${bytes.length / 2} values, expected ${length}`);
  const out = new Float64Array(length);
  for (let i = 0; i < length; i++) {
    let q = bytes[2 * i] | (bytes[2 * i + 1] << 8);
    if (q >= 0x8000) q -= 0x10000;
    out[i] = q * e.scale;
  }
  return out;
}

function toBase64(bytes: Uint8Array): string {
  let s = '';
  for (let i = 0; i < bytes.length; i += 3) {
    const a = bytes[i];
    const b = i + 1 < bytes.length ? bytes[i + 1] : 0;
    const c = i + 2 < bytes.length ? bytes[i + 2] : 0;
    const n = (a << 16) | (b << 8) | c;
    s += ALPHABET[(n >> 18) & 63] + ALPHABET[(n >> 12) & 63];
    s += i + 1 < bytes.length ? ALPHABET[(n >> 6) & 63] : '=';
    s += i + 2 < bytes.length ? ALPHABET[n & 63] : '=';
  }
  return s;
}

function fromBase64(s: string): Uint8Array {
  const lookup = new Int16Array(128).fill(-1);
  for (let i = 0; i < ALPHABET.length; i++) lookup[ALPHABET.charCodeAt(i)] = i;
  const pad = s.endsWith('==') ? 2 : s.endsWith('=') ? 1 : 0;
  const out = new Uint8Array((s.length / 4) * 3 - pad);
  let o = 0;
  for (let i = 0; i < s.length; i += 4) {
    const n = (lookup[s.charCodeAt(i)] << 18) | (lookup[s.charCodeAt(i + 1)] << 12) | ((lookup[s.charCodeAt(i + 2)] & 63) << 6) | (lookup[s.charCodeAt(i + 3)] & 63);
    if (o < out.length) out[o++] = (n >> 16) & 255;
    if (o < out.length) out[o++] = (n >> 8) & 255;
    if (o < out.length) out[o++] = n & 255;
  }
  return out;
}
