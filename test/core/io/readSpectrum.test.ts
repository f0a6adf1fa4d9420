import { describe, expect, it, vi } from 'vitest';
import fc from 'fast-check';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { gzipSync } from 'fflate';
import { binaryKind, readSpectrum, tryReadSpectrum } from '../../../src/core/io/readSpectrum';
import { readTextSpectrum } from '../../../src/core/io/text';
import { writeBinTableHdu, writeFitsFile } from '../../../src/core/io/fits/write';
import { SpectrumReadError } from '../../../src/core/types';
import { REAL_SPECTRA_DIR } from '../../helpers/manifest';
import { caught } from '../../helpers/caught';

// The text reader, wrapped so one test can make it throw something unexpected.
vi.mock('../../../src/core/io/text', async (importOriginal) => {
  const original = await importOriginal<typeof import('../../../src/core/io/text')>();
  return { ...original, readTextSpectrum: vi.fn(original.readTextSpectrum) };
});

const enc = (s: string) => new TextEncoder().encode(s);
const CSV = 'wavelength,flux,ivar\n4000,1,1\n4001,2,1\n4002,3,1\n';


/** A small FITS file: a binary table with loglam, flux and ivar columns, as survey files have. */
function fitsTable(): Uint8Array {
  const loglam = [3.6, 3.6001, 3.6002, 3.6003];
  return writeFitsFile([
    writeBinTableHdu({
      columns: [
        { name: 'loglam', format: 'D', data: loglam },
        { name: 'flux', format: 'E', data: [1, 2, 3, 4] },
        { name: 'ivar', format: 'E', data: [1, 1, 1, 1] },
      ],
      nRows: loglam.length,
    }),
  ]);
}

describe('readSpectrum(bytes, file): sniffing by content', () => {
  it('reads text whatever the file is called', () => {
    const s = readSpectrum(enc(CSV), 'looks-like.fits');
    expect(s.format).toBe('text');
    expect(Array.from(s.flux)).toEqual([1, 2, 3]);
  });

  it('reads FITS whatever the file is called', () => {
    const s = readSpectrum(fitsTable(), 'table.csv');
    expect(s.format.startsWith('fits')).toBe(true);
    expect(s.wavelengthA[0]).toBeCloseTo(10 ** 3.6, 6);
    expect(Array.from(s.flux)).toEqual([1, 2, 3, 4]);
  });

  it('unpacks gzip, then sniffs again: gzipped text and gzipped FITS', () => {
    expect(readSpectrum(gzipSync(enc(CSV)), 'x.csv.gz').format).toBe('text');
    expect(readSpectrum(gzipSync(fitsTable()), 'x.fits.gz').format.startsWith('fits')).toBe(true);
  });

  it('reads a real survey CSV through the dispatcher, gzipped or not', () => {
    const bytes = new Uint8Array(readFileSync(join(REAL_SPECTRA_DIR, 'csv', 'spec-0266-51630-0168.csv')));
    const plain = readSpectrum(bytes, 'a.csv');
    const packed = readSpectrum(gzipSync(bytes), 'a.csv.gz');
    expect(plain.wavelengthA.length).toBe(3808); // MANIFEST.tsv n_pix
    expect(Array.from(packed.flux)).toEqual(Array.from(plain.flux));
  });
});

describe('readSpectrum: errors', () => {
  it('empty file', () => {
    expect(caught(() => readSpectrum(new Uint8Array(0), 'e.csv')).message).toBe('e.csv: empty file');
    expect(caught(() => readSpectrum(gzipSync(new Uint8Array(0)), 'e.gz')).reason).toBe('empty file (the gzip data holds nothing)');
  });

  it('gzip inside gzip', () => {
    expect(caught(() => readSpectrum(gzipSync(gzipSync(enc(CSV))), 'x.gz.gz')).reason).toMatch(/^gzip data inside gzip data/);
  });

  it('truncated gzip', () => {
    const gz = gzipSync(enc(CSV.repeat(50)));
    expect(caught(() => readSpectrum(gz.subarray(0, gz.length - 12), 't.gz')).reason).toMatch(/truncated or corrupt/);
  });

  it('binary data is refused with what it looks like', () => {
    const bin = new Uint8Array(1000).map((_, i) => (i * 37) % 256);
    expect(caught(() => readSpectrum(bin, 'b.dat')).message).toBe(
      'b.dat: binary data (it contains NUL bytes); expected a FITS file or a text table of columns',
    );
    expect(caught(() => readSpectrum(enc('PK\u0003\u0004rest'), 'a.zip')).reason).toMatch(/^a zip archive/);
    expect(caught(() => readSpectrum(enc('%PDF-1.7\n'), 'p.csv')).reason).toMatch(/^a PDF document/);
  });

  it('text errors come through unchanged', () => {
    expect(caught(() => readSpectrum(enc('wave,flux\n4000,x\n'), 'bad.csv')).message).toBe("bad.csv (column flux, line 2): 'x' is not a number");
  });

  it('wraps an unexpected exception from a reader into SpectrumReadError naming the file', () => {
    vi.mocked(readTextSpectrum).mockImplementationOnce(() => {
      throw new TypeError('boom');
    });
    const e = caught(() => readSpectrum(enc(CSV), 'odd.csv'));
    expect(e.message).toBe('odd.csv: internal reader error: boom');
    expect(readSpectrum(enc(CSV), 'odd.csv').format).toBe('text'); // only that one call was replaced
  });
});

describe('tryReadSpectrum(bytes, file)', () => {
  it('returns the spectrum or the error, never throws', () => {
    const good = tryReadSpectrum(enc(CSV), 'g.csv');
    expect(good.ok && good.spectrum.wavelengthA.length).toBe(3);
    const bad = tryReadSpectrum(new Uint8Array(0), 'e.csv');
    expect(bad.ok).toBe(false);
    if (!bad.ok) expect(bad.error.message).toBe('e.csv: empty file');
  });
});

describe('binaryKind(bytes)', () => {
  it('lets text through, including UTF-8 with a BOM and accented comments', () => {
    expect(binaryKind(enc('\ufeff# r\u00e9sum\u00e9\r\n4000 1\n'))).toBeNull();
  });
  it('flags UTF-16 and control-character soup', () => {
    expect(binaryKind(new Uint8Array([0xff, 0xfe, 0x34, 0x00]))).toMatch(/UTF-16/);
    expect(binaryKind(new Uint8Array(200).fill(1))).toBe('binary data (many control characters)');
  });
});

describe('readSpectrum on arbitrary input', () => {
  // Property: whatever the bytes, the outcome is a spectrum or a SpectrumReadError from a reader,
  // never an exception of another kind and never an "internal reader error" (which would be a bug).
  const check = (bytes: Uint8Array) => {
    const r = tryReadSpectrum(bytes, 'fuzz');
    if (!r.ok) {
      expect(r.error).toBeInstanceOf(SpectrumReadError);
      expect(r.error.message).not.toMatch(/internal reader error/);
    } else {
      expect(r.spectrum.wavelengthA.length).toBeGreaterThanOrEqual(2);
    }
  };
  it('random bytes', () => {
    fc.assert(fc.property(fc.uint8Array({ maxLength: 400 }), check), { numRuns: 300 });
  });
  it('random text made of the characters of spectrum tables', () => {
    const unit = fc.constantFrom('0', '1', '5', '.', '-', 'e', ',', ';', ' ', '\t', '\n', '\r', '#', '"', 'n', 'a', 'w', 'f', 'x');
    fc.assert(fc.property(fc.string({ unit, maxLength: 300 }), (t) => check(enc(t))), { numRuns: 500 });
  });
  it('random headers over valid numbers', () => {
    const name = fc.constantFrom('wave', 'loglam', 'flux', 'ivar', 'err', 'mask', 'sky', 'wavelength_air_nm', 'f_lambda', '', '"x, y"');
    fc.assert(
      fc.property(fc.array(name, { minLength: 1, maxLength: 5 }), fc.array(fc.double({ min: 0.1, max: 9000, noNaN: true }), { minLength: 1, maxLength: 30 }), (names, vals) => {
        const rows = vals.map((v, i) => names.map((_, j) => String(j === 0 ? 3 + i * 0.001 : v)).join(','));
        check(enc([names.join(','), ...rows].join('\n')));
      }),
      { numRuns: 300 },
    );
  });
});
