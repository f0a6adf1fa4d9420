import { describe, it, expect } from 'vitest';
import { fileKey, fnv1a32 } from '../../../src/ui/persist/fileKey';

describe('fileKey', () => {
  it('fnv1a32 matches the published test vectors', () => {
    // FNV-1a 32-bit vectors from the FNV reference test suite (draft-eastlake-fnv): "" -> 811c9dc5, "a" -> e40c292c, "foobar" -> bf9cf968.
    const enc = new TextEncoder();
    expect(fnv1a32(enc.encode('')).toString(16)).toBe('811c9dc5');
    expect(fnv1a32(enc.encode('a')).toString(16)).toBe('e40c292c');
    expect(fnv1a32(enc.encode('foobar')).toString(16)).toBe('bf9cf968');
  });

  it('same path and bytes give the same key; different content differs', () => {
    const a = new Uint8Array([1, 2, 3]);
    expect(fileKey('x.fits', a)).toBe(fileKey('x.fits', new Uint8Array([1, 2, 3])));
    expect(fileKey('x.fits', a)).not.toBe(fileKey('x.fits', new Uint8Array([1, 2, 4])));
    expect(fileKey('x.fits', a)).not.toBe(fileKey('y.fits', a));
  });
});
