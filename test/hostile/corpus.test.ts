/**
 * Every hostile-corpus entry through readSpectrum: the outcome is a Spectrum or
 * a SpectrumReadError whose message starts with the file name, never anything
 * else, and never an "internal reader error" (which readSpectrum reports for an
 * unexpected exception inside a reader: a bug). Entries that must fail say
 * what the message has to name. Limits: see README.md in this folder.
 */
import { describe, expect, it } from 'vitest';
import { MAX_REASON_CHARS, readSpectrum } from '../../src/core/io/readSpectrum';
import { gunzipChecked, MAX_GUNZIP_BYTES } from '../../src/core/io/gzip';
import { MAX_PIXELS } from '../../src/core/io/assemble';
import { MAX_LINE_CHARS, MAX_TEXT_BYTES } from '../../src/core/io/text';
import { MAX_HEADER_BLOCKS } from '../../src/core/io/fits/header';
import { SpectrumReadError, type Spectrum } from '../../src/core/types';
import { hostileCorpus, type HostileEntry } from './corpus';
import { bombSize, crc32OfZeros, deflateZeros, gzipBomb } from './deflateBomb';
import { crc32Update } from '../../src/core/io/gzip';
import { checkSpectrumInvariants } from './invariants';

type Outcome = { spectrum: Spectrum } | { error: SpectrumReadError };

/** Run one entry; anything but a Spectrum or a SpectrumReadError fails the test. */
function run(entry: HostileEntry): Outcome {
  try {
    return { spectrum: readSpectrum(entry.bytes(), entry.name) };
  } catch (e) {
    if (!(e instanceof SpectrumReadError)) throw new Error(`${entry.name}: threw ${String(e)} instead of a SpectrumReadError`);
    return { error: e };
  }
}

const corpus = hostileCorpus();
console.log(`hostile corpus: ${corpus.length} inputs`);

describe('hostile corpus through readSpectrum(bytes, name)', () => {
  it('has a few hundred entries with unique names', () => {
    expect(corpus.length).toBeGreaterThan(400);
    expect(new Set(corpus.map((e) => e.name)).size).toBe(corpus.length);
  });

  it.each(corpus.map((e) => [e.name, e] as const))('%s', (_name, entry) => {
    const out = run(entry);
    if ('error' in out) {
      const { error } = out;
      expect(error.file).toBe(entry.name);
      expect(error.message.startsWith(entry.name)).toBe(true);
      expect(error.reason).not.toMatch(/internal reader error/);
      expect(error.reason.length).toBeGreaterThan(5);
      expect(error.reason.length).toBeLessThanOrEqual(MAX_REASON_CHARS);
      if (entry.outcome === 'spectrum') throw new Error(`expected a spectrum, got: ${error.message}`);
      if (entry.says) expect(error.message).toMatch(entry.says);
    } else {
      expect(entry.outcome, `${entry.name} was read as a spectrum`).not.toBe('error');
      expect(out.spectrum.file).toBe(entry.name);
      expect(checkSpectrumInvariants(out.spectrum)).toEqual([]);
    }
  });
});

describe('limits (README.md) are what the readers enforce', () => {
  it('states the limits that the README quotes', () => {
    // The README in this folder quotes these numbers; a change here must change it too.
    expect(MAX_PIXELS).toBe(10_000_000);
    expect(MAX_GUNZIP_BYTES).toBe(512 * 1024 * 1024);
    expect(MAX_TEXT_BYTES).toBe(256 * 1024 * 1024);
    expect(MAX_LINE_CHARS).toBe(65_536);
    expect(MAX_HEADER_BLOCKS).toBe(1000);
  });

  it('the running size check stops a bomb whose trailer lies (small limit, same code path)', () => {
    const bomb = gzipBomb(16, 1000); // 16 MiB of zeros, trailer claims 1000 bytes
    let error: unknown;
    try {
      gunzipChecked(bomb, 'liar.gz', 4 * 1024 * 1024);
    } catch (e) {
      error = e;
    }
    expect(error).toBeInstanceOf(SpectrumReadError);
    expect((error as SpectrumReadError).message).toBe(`liar.gz: gzip data expands to more than the limit of ${4 * 1024 * 1024} bytes`);
  });
});

describe('deflateBomb helpers', () => {
  it('crc32OfZeros agrees with the byte-by-byte CRC (the slow obvious version)', () => {
    for (const n of [0, 1, 2, 3, 255, 256, 1000, 65_537]) {
      expect(crc32OfZeros(n)).toBe((crc32Update(0xffffffff, new Uint8Array(n)) ^ 0xffffffff) >>> 0);
    }
  });

  it('a small hand-built bomb inflates to exactly the zeros it promises, with a valid trailer', () => {
    const bomb = gzipBomb(1);
    const out = gunzipChecked(bomb, 'small.gz');
    expect(out.length).toBe(bombSize(1));
    expect(out.every((b) => b === 0)).toBe(true);
    // 13 bits per 258 bytes: the ratio RFC 1951's fixed codes allow for this pattern.
    expect(deflateZeros(1000).length).toBe(Math.ceil((3 + 8 + 13 * 1000 + 7) / 8));
  });
});
