import { describe, expect, it } from 'vitest';
import { SpectrumReadError } from '../../../src/core/types';
import { readFits } from '../../../src/core/io/fits/readFits';
import { fitsCard, fitsHeaderBytes, writeBinTableHdu, writeFitsFile, writeImageHdu, type BinTableColumn } from '../../../src/core/io/fits/write';
import { caught as readError } from '../../helpers/caught';


const WAVE = [4000, 4001, 4002, 4003];
const FLUX = [1, 2, 3, 4];

/** One row per pixel. */
function perPixel(columns: BinTableColumn[], extname?: string): Uint8Array {
  return writeFitsFile([writeBinTableHdu({ columns, nRows: columns[0].data.length, extname })]);
}

/** A table HDU made by hand from header cards and raw data bytes, for malformed layouts. */
function handTable(cards: string[], dataBytes: number): Uint8Array {
  const primary = fitsHeaderBytes([fitsCard('SIMPLE', true), fitsCard('BITPIX', 8), fitsCard('NAXIS', 0)]);
  const header = fitsHeaderBytes([fitsCard('XTENSION', 'BINTABLE'), fitsCard('BITPIX', 8), fitsCard('NAXIS', 2), ...cards]);
  const out = new Uint8Array(primary.length + header.length + Math.ceil(dataBytes / 2880) * 2880);
  out.set(primary);
  out.set(header, primary.length);
  return out;
}

describe('binary table layouts (FITS 4.0 sec. 7.3)', () => {
  it('one row per pixel with E columns; ivar column', () => {
    const s = readFits(
      perPixel([
        { name: 'wavelength', format: 'D', unit: 'Angstrom', data: WAVE },
        { name: 'flux', format: 'E', data: FLUX },
        { name: 'ivar', format: 'E', data: [1, 1, 0, 2] },
      ]),
      't.fits',
    );
    expect(s.format).toBe('fits-table');
    expect(Array.from(s.wavelengthA)).toEqual(WAVE);
    expect(Array.from(s.flux)).toEqual(FLUX);
    expect(Array.from(s.ivar!)).toEqual([1, 1, 0, 2]);
  });

  it('one row of arrays (repeat counts)', () => {
    const file = writeFitsFile([
      writeBinTableHdu({
        columns: [
          { name: 'WAVE', format: '4D', data: WAVE },
          { name: 'FLUX', format: '4E', data: FLUX },
          { name: 'ERR', format: '4E', data: [0.5, 0.5, 0.25, 1] },
        ],
        nRows: 1,
      }),
    ]);
    const s = readFits(file, 'arr.fits');
    expect(Array.from(s.wavelengthA)).toEqual(WAVE);
    expect(Array.from(s.ivar!)).toEqual([4, 4, 16, 1]);
  });

  it('loglam column is log10 of the wavelength in Angstrom', () => {
    const s = readFits(perPixel([{ name: 'flux', format: 'E', data: [1, 2] }, { name: 'loglam', format: 'D', data: [3.5797835966, 3.5798835966] }]), 'l.fits');
    // 10^3.5797835966 = 3800.000000 and 10^3.5798835966 = 3800.875083 (reference.md sec. 9, S2 legacy).
    expect(s.wavelengthA[0]).toBeCloseTo(3800, 5);
    expect(s.wavelengthA[1]).toBeCloseTo(3800.875083, 5);
  });

  it("column names match case-insensitively, with '_' and spaces ignored", () => {
    const s = readFits(
      perPixel([
        { name: 'LAMBDA', format: 'E', data: WAVE },
        { name: 'Flux', format: 'E', data: FLUX },
        { name: 'Inverse_Variance', format: 'E', data: [2, 2, 2, 2] },
        { name: 'and_mask', format: 'J', data: [0, 0, 0, 0] },
      ]),
      'c.fits',
    );
    expect(s.ivar![0]).toBe(2);
  });

  it("'wavelength_air' marks air wavelengths, converted to vacuum (Morton 2000)", () => {
    const s = readFits(perPixel([{ name: 'wavelength_air', format: 'D', data: [6562.8, 6563.8] }, { name: 'flux', format: 'E', data: [1, 1] }]), 'air.fits');
    // H-alpha 6562.80 air -> 6564.613 vacuum (reference.md sec. 2, Morton 2000 [C]).
    expect(s.wavelengthA[0]).toBeCloseTo(6564.613, 3);
    expect(s.meta.convertedFromAir).toBe(true);
  });

  it("'AWAV' column and VACUUM = F header both mean air", () => {
    const a = readFits(perPixel([{ name: 'AWAV', format: 'D', data: [5006.84, 5007] }, { name: 'flux', format: 'E', data: [1, 1] }]), 'a.fits');
    expect(a.wavelengthA[0]).toBeCloseTo(5008.237, 3);
    const b = readFits(
      writeFitsFile([
        writeBinTableHdu({
          columns: [{ name: 'wave', format: 'D', data: [5006.84, 5007] }, { name: 'flux', format: 'E', data: [1, 1] }],
          nRows: 2,
          cards: [['VACUUM', false]],
        }),
      ]),
      'b.fits',
    );
    expect(b.wavelengthA[0]).toBeCloseTo(5008.237, 3);
  });

  it('TUNIT nm and um scale to Angstrom; no unit and values near 1 um mean micrometres', () => {
    const nm = readFits(perPixel([{ name: 'wave', format: 'D', unit: 'nm', data: [400, 401] }, { name: 'flux', format: 'E', data: [1, 1] }]), 'nm.fits');
    expect(Array.from(nm.wavelengthA)).toEqual([4000, 4010]);
    const um = readFits(perPixel([{ name: 'wave', format: 'D', unit: 'micron', data: [1.5, 1.6] }, { name: 'flux', format: 'E', data: [1, 1] }]), 'um.fits');
    expect(um.wavelengthA[1]).toBeCloseTo(16000, 8);
    const none = readFits(perPixel([{ name: 'wave', format: 'D', data: [1.5, 1.6] }, { name: 'flux', format: 'E', data: [1, 1] }]), 'none.fits');
    expect(none.wavelengthA[1]).toBeCloseTo(16000, 8);
  });

  it('TFORM I, J, K, B with TSCAL/TZERO and TNULL; L, A and X columns are skipped', () => {
    const s = readFits(
      perPixel([
        { name: 'good', format: 'L', data: [true, false, true] },
        { name: 'label', format: '3A', data: ['a', 'b', 'c'] },
        { name: 'wave', format: 'J', data: [4000, 4001, 4002] },
        { name: 'flux', format: 'I', data: [10, NaN, 30], tscal: 0.5, tzero: 1, tnull: -32768 },
        { name: 'ivar', format: 'K', data: [1, 2, 3] },
        { name: 'mask', format: 'B', data: [0, 0, 1] },
      ]),
      'ints.fits',
    );
    expect(s.flux[0]).toBe(10);
    expect(s.flux[1]).toBeNaN();
    expect(s.flux[2]).toBe(30);
    expect(Array.from(s.ivar!)).toEqual([1, 2, 3]);
    expect(Array.from(s.mask)).toEqual([0, 1, 1]); // pixel 2 from NaN flux, pixel 3 from the mask
  });

  it('picks the first table that has wavelength and flux columns', () => {
    const other = writeBinTableHdu({ columns: [{ name: 'Z', format: 'E', data: [0.5] }], nRows: 1, extname: 'INFO' });
    const spec = writeBinTableHdu({ columns: [{ name: 'wave', format: 'E', data: [1e4, 1.1e4] }, { name: 'flux', format: 'E', data: [1, 2] }], nRows: 2 });
    const s = readFits(writeFitsFile([other, spec]), 'two.fits');
    expect(Array.from(s.wavelengthA)).toEqual([1e4, 1.1e4]);
  });

  it('metadata: flux unit from TUNIT of the flux column', () => {
    const s = readFits(perPixel([{ name: 'wave', format: 'E', data: WAVE }, { name: 'flux', format: 'E', unit: '1e-17 erg/s/cm2/A', data: FLUX }]), 'u.fits');
    expect(s.meta.fluxUnit).toBe('1e-17 erg/s/cm2/A');
  });
});

describe('binary table errors', () => {
  it('error: no flux column', () => {
    const e = readError(() => readFits(perPixel([{ name: 'wave', format: 'E', data: WAVE }, { name: 'counts_sky', format: 'E', data: FLUX }]), 'nf.fits'));
    expect(e.message).toBe('nf.fits (HDU 1): no flux column (columns: wave, counts_sky)');
  });

  it('error: no wavelength column', () => {
    const e = readError(() => readFits(perPixel([{ name: 'pixel', format: 'J', data: [1, 2] }, { name: 'flux', format: 'E', data: [1, 2] }]), 'nw.fits'));
    expect(e.message).toBe('nw.fits (HDU 1): no wavelength column (columns: pixel, flux)');
  });

  it('error: a string column named flux does not count as flux', () => {
    const e = readError(() => readFits(perPixel([{ name: 'wave', format: 'E', data: [1e4, 2e4] }, { name: 'flux', format: '4A', data: ['a', 'b'] }]), 'sf.fits'));
    expect(e.reason).toMatch(/^no flux column/);
  });

  it('error: NAXIS1 differs from the sum of the column widths', () => {
    const file = handTable(
      [fitsCard('NAXIS1', 12), fitsCard('NAXIS2', 2), fitsCard('PCOUNT', 0), fitsCard('GCOUNT', 1), fitsCard('TFIELDS', 2), fitsCard('TTYPE1', 'wave'), fitsCard('TFORM1', 'E'), fitsCard('TTYPE2', 'flux'), fitsCard('TFORM2', 'E')],
      24,
    );
    const e = readError(() => readFits(file, 'w.fits'));
    expect(e.message).toBe('w.fits (HDU 1, keyword NAXIS1): NAXIS1 = 12 bytes per row, but the columns (TFORM1..TFORM2) add up to 8');
  });

  it('error: absurd TFORM repeat count', () => {
    const file = handTable(
      [fitsCard('NAXIS1', 8), fitsCard('NAXIS2', 1), fitsCard('TFIELDS', 2), fitsCard('TTYPE1', 'wave'), fitsCard('TFORM1', '2147483648E'), fitsCard('TTYPE2', 'flux'), fitsCard('TFORM2', 'E')],
      8,
    );
    const e = readError(() => readFits(file, 'r.fits'));
    expect(e.message).toBe("r.fits (HDU 1, keyword TFORM1): TFORM1 = '2147483648E' claims 2147483648 elements, more than a 8-byte row can hold");
  });

  it('error: unknown TFORM letter', () => {
    const file = handTable([fitsCard('NAXIS1', 4), fitsCard('NAXIS2', 1), fitsCard('TFIELDS', 1), fitsCard('TTYPE1', 'wave'), fitsCard('TFORM1', '1Z')], 4);
    const e = readError(() => readFits(file, 'z.fits'));
    expect(e.message).toBe("z.fits (HDU 1, keyword TFORM1): TFORM1 = '1Z' is not a binary-table format");
  });

  it('error: several spectra (rows of arrays)', () => {
    const file = writeFitsFile([writeBinTableHdu({ columns: [{ name: 'wave', format: '2E', data: [1e4, 2e4, 1e4, 2e4] }, { name: 'flux', format: '2E', data: [1, 2, 3, 4] }], nRows: 2 })]);
    const e = readError(() => readFits(file, 'multi.fits'));
    expect(e.message).toBe('multi.fits (HDU 1, keyword NAXIS2): table has 2 rows of 2-element arrays: several spectra in one table; one spectrum per file is read');
  });

  it('error: flux array length differs from wavelength array length', () => {
    const file = writeFitsFile([writeBinTableHdu({ columns: [{ name: 'wave', format: '3E', data: [1e4, 2e4, 3e4] }, { name: 'flux', format: '2E', data: [1, 2] }], nRows: 1 })]);
    const e = readError(() => readFits(file, 'len.fits'));
    expect(e.message).toBe("len.fits (HDU 1, keyword TFORM2, column flux): column 'flux' has 2 values per row but 'wave' has 3");
  });

  it('error: unknown wavelength unit', () => {
    const e = readError(() => readFits(perPixel([{ name: 'wave', format: 'E', unit: 'pixel', data: [1, 2] }, { name: 'flux', format: 'E', data: [1, 2] }]), 'px.fits'));
    expect(e.message).toBe("px.fits (HDU 1, keyword TUNIT1, column wave): unknown wavelength unit 'pixel'");
  });

  it('error: a table whose rows claim 2^31 pixels is refused before allocating', () => {
    // NAXIS2 = 2^31 rows of 8 bytes: the declared size exceeds the file by far.
    const file = handTable([fitsCard('NAXIS1', 8), fitsCard('NAXIS2', 2 ** 31), fitsCard('TFIELDS', 2), fitsCard('TTYPE1', 'wave'), fitsCard('TFORM1', 'E'), fitsCard('TTYPE2', 'flux'), fitsCard('TFORM2', 'E')], 8);
    const e = readError(() => readFits(file, 'big.fits'));
    expect(e.where).toEqual({ hdu: 1, keyword: 'NAXIS2' });
    expect(e.reason).toMatch(/^declared data size 17179869184 bytes/);
  });

  it('an image HDU alongside is ignored when only the table has a wavelength', () => {
    const img = writeImageHdu({ data: new Float32Array([5, 6]) }); // no WCS
    const tab = writeBinTableHdu({ columns: [{ name: 'wave', format: 'E', data: [1e4, 2e4] }, { name: 'flux', format: 'E', data: [1, 2] }], nRows: 2 });
    const s = readFits(writeFitsFile([img, tab]), 'mix.fits');
    expect(s.format).toBe('fits-table');
  });

  it('wavelength in an E column keeps float32 precision (3800.875 stays within 1e-3 A)', () => {
    const s = readFits(perPixel([{ name: 'wave', format: 'E', data: [3800, 3800.875083] }, { name: 'flux', format: 'E', data: [1, 1] }]), 'p.fits');
    expect(Math.abs(s.wavelengthA[1] - 3800.875083)).toBeLessThan(1e-3);
  });
});
