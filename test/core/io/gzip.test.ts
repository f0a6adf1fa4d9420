import { describe, expect, it } from 'vitest';
import { gzipSync } from 'fflate';
import { crc32Update, gunzipChecked, isGzip } from '../../../src/core/io/gzip';
import { SpectrumReadError } from '../../../src/core/types';
import { caught } from '../../helpers/caught';

const enc = (s: string) => new TextEncoder().encode(s);


describe('crc32Update', () => {
  it('gives the standard check value CBF43926 for "123456789"', () => {
    // Check value of CRC-32/ISO-HDLC: common practice (the "check" of the CRC catalogue).
    expect((crc32Update(0xffffffff, enc('123456789')) ^ 0xffffffff) >>> 0).toBe(0xcbf43926);
  });
});

describe('gunzipChecked(bytes, file, maxBytes)', () => {
  const text = 'wavelength,flux\n' + Array.from({ length: 2000 }, (_, i) => `${4000 + i},${i % 7}`).join('\n');
  const gz = gzipSync(enc(text));

  it('recognises the gzip magic number', () => {
    expect(isGzip(gz)).toBe(true);
    expect(isGzip(enc('SIMPLE  ='))).toBe(false);
  });

  it('round-trips data compressed by fflate', () => {
    expect(new TextDecoder().decode(gunzipChecked(gz, 'a.csv.gz'))).toBe(text);
  });

  it('reads a two-member gzip file as the concatenation of its members', () => {
    const two = new Uint8Array([...gzipSync(enc('abc')), ...gzipSync(enc('def'))]);
    expect(new TextDecoder().decode(gunzipChecked(two, 'two.gz'))).toBe('abcdef');
  });

  it('rejects a file whose trailer claims more than the limit, before inflating', () => {
    const e = caught(() => gunzipChecked(gz, 'a.csv.gz', 1000));
    expect(e.message).toMatch(/^a\.csv\.gz: gzip trailer states \d+ bytes uncompressed, more than the limit of 1000 bytes/);
  });

  it('stops a zip bomb whose trailer lies about its size', () => {
    const bomb = gzipSync(new Uint8Array(4_000_000)); // 4 MB of zeros
    const forged = bomb.slice();
    const n = forged.length;
    forged[n - 4] = 10; // ISIZE = 10 bytes: a lie
    forged[n - 3] = forged[n - 2] = forged[n - 1] = 0;
    const e = caught(() => gunzipChecked(forged, 'bomb.gz', 1_000_000));
    expect(e.reason).toBe('gzip data expands to more than the limit of 1000000 bytes');
  });

  it('reports truncated data', () => {
    const e = caught(() => gunzipChecked(gz.subarray(0, gz.length - 30), 't.gz'));
    expect(e.reason).toMatch(/truncated or corrupt/);
    expect(caught(() => gunzipChecked(gz.subarray(0, 12), 't.gz')).reason).toMatch(/truncated/);
  });

  it('reports corrupt data (one flipped byte in the trailer CRC)', () => {
    const bad = gz.slice();
    bad[bad.length - 8] ^= 0xff;
    expect(caught(() => gunzipChecked(bad, 'c.gz')).reason).toMatch(/CRC-32/);
  });

  it('reports garbage after a gzip header as corrupt', () => {
    const bad = gz.slice();
    for (let i = 10; i < 40; i++) bad[i] = 0xff;
    expect(caught(() => gunzipChecked(bad, 'g.gz')).reason).toMatch(/corrupt/);
  });
});
