import { describe, expect, it } from 'vitest';
import { assembleSpectrum } from '../../../src/core/io/assemble';
import { readSpectrum } from '../../../src/core/io/readSpectrum';
import { writeFitsFile, writeImageHdu } from '../../../src/core/io/fits/write';
import { caught } from '../../helpers/caught';

const enc = (s: string) => new TextEncoder().encode(s);
const rows = (n: number, f: (i: number) => string) => Array.from({ length: n }, (_, i) => f(i)).join('\n') + '\n';
const parts = (ivar: number[] | null, mask?: number[], flux?: number[]) => ({
  file: 'obj-0042.dat',
  format: 'test',
  wavelengthA: Float64Array.of(5000, 5001, 5002, 5003),
  flux: Float64Array.from(flux ?? [1, 2, 3, 4]),
  ivar: ivar ? Float64Array.from(ivar) : null,
  mask: mask ? Uint8Array.from(mask) : undefined,
});

describe('assembleSpectrum: a spectrum needs at least one usable pixel', () => {
  it('refuses a CSV whose inverse-variance column is 0 everywhere, naming the file (issue 11: it was fitted and graded high)', () => {
    const csv = 'wavelength,flux,ivar\n' + rows(200, (i) => `${4000 + 2 * i},${1 + Math.sin(i / 9)},0`);
    const e = caught(() => readSpectrum(enc(csv), 'night2/obj-0042.csv'));
    expect(e.file).toBe('night2/obj-0042.csv');
    expect(e.message.startsWith('night2/obj-0042.csv: ')).toBe(true);
    expect(e.reason).toMatch(/^no usable pixel: the uncertainty gives zero weight .* to all 200 pixels$/);
  });

  it('refuses the same for a FITS image whose IVAR extension is all zero', () => {
    const n = 64;
    const flux = Float32Array.from({ length: n }, (_, i) => 1 + i / n);
    const bytes = writeFitsFile([
      writeImageHdu({ data: flux, cards: [['CTYPE1', 'WAVE'], ['CUNIT1', 'Angstrom'], ['CRPIX1', 1], ['CRVAL1', 4000], ['CDELT1', 2]] }),
      writeImageHdu({ data: new Float32Array(n), primary: false, extname: 'IVAR' }),
    ]);
    expect(caught(() => readSpectrum(bytes, 'obj-7.fits')).reason).toMatch(/^no usable pixel/);
  });

  it('refuses an error column that is 0 everywhere (an error of 0 carries no information)', () => {
    expect(caught(() => readSpectrum(enc(rows(10, (i) => `${4000 + i} 1 0`)), 'e.txt')).reason).toMatch(/^no usable pixel/);
  });

  it('refuses a spectrum in which every pixel is masked, or has no finite flux', () => {
    expect(caught(() => assembleSpectrum(parts([1, 1, 1, 1], [1, 1, 2, 1]))).reason).toMatch(/^no usable pixel: all 4 pixels are masked/);
    expect(caught(() => assembleSpectrum(parts(null, [1, 1, 0, 1], [1, 2, NaN, 4]))).reason).toMatch(/^no usable pixel: all 4 pixels are masked/);
  });

  it('refuses weight and unmasked pixels that never meet', () => {
    const e = caught(() => assembleSpectrum(parts([1, 0, 1, 0], [1, 0, 1, 0])));
    expect(e.reason).toMatch(/^no usable pixel: every pixel with non-zero weight is masked/);
  });

  it('keeps the place of the data in the error', () => {
    const e = caught(() => assembleSpectrum({ ...parts([0, 0, 0, 0]), where: { hdu: 2 } }));
    expect(e.where.hdu).toBe(2);
    expect(e.message).toMatch(/^obj-0042\.dat \(HDU 2\): no usable pixel/);
  });

  it('accepts one usable pixel, and no uncertainty at all (weights come from the noise estimate)', () => {
    const one = assembleSpectrum(parts([0, 0, 0, 3], [0, 0, 0, 0]));
    expect(Array.from(one.ivar!)).toEqual([0, 0, 0, 3]);
    const none = assembleSpectrum(parts(null));
    expect(none.ivar).toBeNull();
    expect(Array.from(none.mask)).toEqual([0, 0, 0, 0]);
  });

  it('still zeroes negative, NaN and infinite inverse variance instead of refusing the spectrum', () => {
    const s = assembleSpectrum(parts([-1, NaN, Infinity, 2]));
    expect(Array.from(s.ivar!)).toEqual([0, 0, 0, 2]);
  });
});
