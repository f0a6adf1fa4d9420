/**
 * SHA-256 of a file's bytes as 64 lowercase hex digits (FIPS 180-4), through
 * the Web Crypto API, which browsers and Node 20 both carry as the global
 * `crypto.subtle`. Core's compiler settings have neither DOM nor Node types,
 * so the one call used is declared here.
 */
interface SubtleDigest {
  digest(algorithm: 'SHA-256', data: Uint8Array): Promise<ArrayBuffer>;
}

function subtle(): SubtleDigest {
  const c = (globalThis as unknown as { crypto?: { subtle?: SubtleDigest } }).crypto;
  if (!c?.subtle) throw new Error('this environment has no Web Crypto (crypto.subtle): content hashes cannot be computed');
  return c.subtle;
}

export function toHex(buffer: ArrayBuffer): string {
  const bytes = new Uint8Array(buffer);
  let out = '';
  for (let i = 0; i < bytes.length; i++) out += bytes[i].toString(16).padStart(2, '0');
  return out;
}

/** SHA-256 of the bytes, hex. */
export async function contentHash(bytes: Uint8Array): Promise<string> {
  return toHex(await subtle().digest('SHA-256', bytes));
}

/** UTF-8 bytes of a text (core has no TextEncoder type; the encoding is written out). */
export function utf8(text: string): Uint8Array {
  const out: number[] = [];
  for (const ch of text) {
    const c = ch.codePointAt(0)!;
    if (c < 0x80) out.push(c);
    else if (c < 0x800) out.push(0xc0 | (c >> 6), 0x80 | (c & 63));
    else if (c < 0x10000) out.push(0xe0 | (c >> 12), 0x80 | ((c >> 6) & 63), 0x80 | (c & 63));
    else out.push(0xf0 | (c >> 18), 0x80 | ((c >> 12) & 63), 0x80 | ((c >> 6) & 63), 0x80 | (c & 63));
  }
  return Uint8Array.from(out);
}

/** SHA-256 of a text (UTF-8), hex. */
export function textHash(text: string): Promise<string> {
  return contentHash(utf8(text));
}

export function isContentHash(v: unknown): v is string {
  return typeof v === 'string' && /^[0-9a-f]{64}$/.test(v);
}
