import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { SpectrumReadError } from '../../../src/core/types';
import { isFits, readFits } from '../../../src/core/io/fits/readFits';
import { walkHdus } from '../../../src/core/io/fits/hdus';
import { fitsCard, fitsHeaderBytes, writeBinTableHdu, writeFitsFile, writeImageHdu, type FitsCardInput } from '../../../src/core/io/fits/write';
import { caught as readError } from '../../helpers/caught';

const WCS: FitsCardInput[] = [['CTYPE1', 'WAVE'], ['CUNIT1', 'Angstrom'], ['CRPIX1', 1], ['CRVAL1', 4000], ['CDELT1', 1]];
const good = () => writeFitsFile([writeImageHdu({ data: new Float32Array([1, 2, 3, 4]), cards: WCS })]);


/** A primary header from raw cards (no data written). */
function primaryOnly(cards: string[], extraBytes = 0): Uint8Array {
  const h = fitsHeaderBytes(cards);
  const out = new Uint8Array(h.length + extraBytes);
  out.set(h);
  return out;
}

describe('isFits(bytes)', () => {
  it("is true for bytes starting with 'SIMPLE  =' and false otherwise", () => {
    expect(isFits(good())).toBe(true);
    expect(isFits(new Uint8Array([0x53, 0x49]))).toBe(false);
    expect(isFits(new Uint8Array(0))).toBe(false);
    expect(isFits(Uint8Array.from('wavelength,flux\n', (c) => c.charCodeAt(0)))).toBe(false);
  });
});

describe('readFits(bytes, file)', () => {
  it('reads a minimal image spectrum', () => {
    const s = readFits(good(), 'ok.fits');
    expect(s.file).toBe('ok.fits');
    expect(s.format).toBe('fits-image');
    expect(Array.from(s.wavelengthA)).toEqual([4000, 4001, 4002, 4003]);
    expect(s.wavelengthA).toBeInstanceOf(Float64Array);
    expect(s.flux).toBeInstanceOf(Float64Array);
  });

  it('walks past HDUs with trailing bytes after the last HDU', () => {
    const f = good();
    const padded = new Uint8Array(f.length + 100);
    padded.set(f);
    expect(walkHdus(padded, 'x')).toHaveLength(1);
    expect(readFits(padded, 'pad.fits').flux.length).toBe(4);
  });

  it('error: empty file', () => {
    expect(readError(() => readFits(new Uint8Array(0), 'empty.fits')).message).toBe('empty.fits: empty file (0 bytes)');
  });

  it('error: not a FITS file', () => {
    const e = readError(() => readFits(Uint8Array.from('hello', (c) => c.charCodeAt(0)), 'hello.fits'));
    expect(e.message).toBe("hello.fits (HDU 0, keyword SIMPLE): not a FITS file: it does not start with 'SIMPLE  ='");
  });

  it('error: missing END card', () => {
    const bytes = fitsHeaderBytes([fitsCard('SIMPLE', true), fitsCard('BITPIX', 8), fitsCard('NAXIS', 0)], false);
    const e = readError(() => readFits(bytes, 'noend.fits'));
    expect(e.message).toBe('noend.fits (HDU 0, keyword END): no END card: the header runs to the end of the file after 36 cards');
  });

  it('error: truncated header (file shorter than one block)', () => {
    const e = readError(() => readFits(good().slice(0, 500), 'tiny.fits'));
    expect(e.message).toBe('tiny.fits (HDU 0): truncated header: only 500 bytes where a 2880-byte header block should start');
  });

  it('error: truncated data', () => {
    const big = writeFitsFile([writeImageHdu({ data: new Float64Array(1000).fill(1), cards: WCS })]);
    const e = readError(() => readFits(big.slice(0, 2880 + 4000), 'cut.fits'));
    expect(e.message).toBe(
      'cut.fits (HDU 0, keyword NAXIS1): declared data size 8000 bytes (BITPIX=-64, NAXIS1=1000) is larger than the 4000 bytes left in the file (truncated or corrupt)',
    );
  });

  it('error: declared size larger than the file in an extension', () => {
    const tab = writeBinTableHdu({ columns: [{ name: 'wave', format: 'E', data: [1, 2] }, { name: 'flux', format: 'E', data: [1, 2] }], nRows: 2 });
    const file = writeFitsFile([tab]);
    // Claim 5000 rows: NAXIS2 card is the 5th card of the extension header.
    const at = 2880 + 4 * 80;
    const card = fitsCard('NAXIS2', 5000);
    for (let i = 0; i < 80; i++) file[at + i] = card.charCodeAt(i);
    const e = readError(() => readFits(file, 'ext.fits'));
    expect(e.message).toBe(
      'ext.fits (HDU 1, keyword NAXIS2): declared data size 40000 bytes (BITPIX=8, NAXIS1=8, NAXIS2=5000) is larger than the 2880 bytes left in the file (truncated or corrupt)',
    );
  });

  it('error: a truncated extension header after a good primary', () => {
    const f = writeFitsFile([writeImageHdu({ data: new Float32Array([1, 2]), cards: WCS }), writeImageHdu({ data: new Float32Array([1, 2]), primary: false, extname: 'IVAR' })]);
    const e = readError(() => readFits(f.slice(0, 5760 + 1000), 'ext.fits'));
    expect(e.message).toBe('ext.fits (HDU 1): truncated header: only 1000 bytes where a 2880-byte header block should start');
  });

  it('error: unsupported BITPIX', () => {
    const e = readError(() => readFits(primaryOnly([fitsCard('SIMPLE', true), fitsCard('BITPIX', 12), fitsCard('NAXIS', 1), fitsCard('NAXIS1', 4)], 2880), 'b12.fits'));
    expect(e.message).toBe('b12.fits (HDU 0, keyword BITPIX): unsupported BITPIX 12 (FITS allows 8, 16, 32, 64, -32, -64)');
  });

  it('error: absurd NAXIS1 = 2^31 is refused before allocating', () => {
    const e = readError(() => readFits(primaryOnly([fitsCard('SIMPLE', true), fitsCard('BITPIX', -32), fitsCard('NAXIS', 1), fitsCard('NAXIS1', 2 ** 31)], 2880), 'huge.fits'));
    expect(e.message).toBe(
      'huge.fits (HDU 0, keyword NAXIS1): declared data size 8589934592 bytes (BITPIX=-32, NAXIS1=2147483648) is larger than the 2880 bytes left in the file (truncated or corrupt)',
    );
  });

  it('error: missing NAXIS1', () => {
    const e = readError(() => readFits(primaryOnly([fitsCard('SIMPLE', true), fitsCard('BITPIX', -32), fitsCard('NAXIS', 1)]), 'nonaxis.fits'));
    expect(e.message).toBe('nonaxis.fits (HDU 0, keyword NAXIS1): required keyword NAXIS1 is missing');
  });

  it('error: SIMPLE = F', () => {
    const e = readError(() => readFits(primaryOnly([fitsCard('SIMPLE', false), fitsCard('BITPIX', 8), fitsCard('NAXIS', 0)]), 'f.fits'));
    expect(e.message).toBe('f.fits (HDU 0, keyword SIMPLE): SIMPLE is not T: the file says it does not conform to the FITS standard');
  });

  it('error: no data anywhere', () => {
    const e = readError(() => readFits(primaryOnly([fitsCard('SIMPLE', true), fitsCard('BITPIX', 8), fitsCard('NAXIS', 0)]), 'nodata.fits'));
    expect(e.message).toBe('nodata.fits: no spectrum: none of the 1 HDU(s) holds image data or a binary table');
  });

  it('error: only one pixel (from assembleSpectrum)', () => {
    const e = readError(() => readFits(writeFitsFile([writeImageHdu({ data: new Float32Array([1]), cards: WCS })]), 'one.fits'));
    expect(e.message).toBe('one.fits (HDU 0): only one pixel; a spectrum needs at least 2');
  });

  it('error: all flux NaN (from assembleSpectrum)', () => {
    const e = readError(() => readFits(writeFitsFile([writeImageHdu({ data: new Float32Array([NaN, NaN]), cards: WCS })]), 'nan.fits'));
    expect(e.message).toBe('nan.fits (HDU 0): all flux values are NaN or infinite');
  });

  it('never throws anything but SpectrumReadError on damaged bytes (every single-byte corruption of the header)', () => {
    const f = good();
    for (let i = 0; i < 2880; i += 7) {
      const bad = f.slice();
      bad[i] = 0x30 + (i % 10);
      try {
        readFits(bad, 'damaged.fits');
      } catch (e) {
        expect(e).toBeInstanceOf(SpectrumReadError);
      }
    }
  });

  it('property: truncated or byte-damaged table and image files give a Spectrum or a SpectrumReadError, nothing else', () => {
    const table = writeFitsFile([
      writeBinTableHdu({
        columns: [
          { name: 'loglam', format: 'E', data: [3.58, 3.5801, 3.5802] },
          { name: 'flux', format: 'E', data: [1, 2, 3] },
          { name: 'ivar', format: 'E', data: [1, 1, 1] },
          { name: 'and_mask', format: 'J', data: [0, 1, 0] },
        ],
        nRows: 3,
      }),
    ]);
    const image = writeFitsFile([
      writeImageHdu({ data: new Float32Array(8).fill(1), axes: [4, 2], cards: [['CTYPE1', 'LINEAR'], ['CRVAL1', 3.58], ['CD1_1', 1e-4], ['DC-FLAG', 1]] }),
      writeImageHdu({ data: new Int16Array(4), primary: false, extname: 'MASK' }),
    ]);
    fc.assert(
      fc.property(
        fc.constantFrom(table, image),
        fc.array(fc.tuple(fc.nat(), fc.integer({ min: 0, max: 255 })), { maxLength: 6 }),
        fc.option(fc.nat(), { nil: undefined }),
        (base, edits, cut) => {
          const bytes = base.slice(0, cut === undefined ? base.length : cut % (base.length + 1));
          for (const [at, v] of edits) if (bytes.length) bytes[at % bytes.length] = v;
          try {
            readFits(bytes, 'fuzz.fits');
          } catch (e) {
            if (!(e instanceof SpectrumReadError)) throw e;
          }
        },
      ),
      { numRuns: 400, seed: 20240601 },
    );
  });
});
