import { describe, expect, it } from 'vitest';
import { SpectrumReadError } from '../../../src/core/types';
import { readFits } from '../../../src/core/io/fits/readFits';
import { guessNoiseKind } from '../../../src/core/io/fits/image';
import { fitsCard, fitsHeaderBytes, writeFitsFile, writeImageHdu, type FitsCardInput } from '../../../src/core/io/fits/write';
import { caught as readError } from '../../helpers/caught';

const WCS: FitsCardInput[] = [['CTYPE1', 'WAVE'], ['CUNIT1', 'Angstrom'], ['CRPIX1', 1], ['CRVAL1', 4000], ['CDELT1', 1]];


/** A primary image made by hand: header cards plus raw big-endian data bytes (independent of the writer). */
function handMade(bitpix: number, dataHex: string, extra: string[] = []): Uint8Array {
  const data = Uint8Array.from(dataHex.match(/../g)!.map((h) => parseInt(h, 16)));
  const n = data.length / (Math.abs(bitpix) / 8);
  const header = fitsHeaderBytes([
    fitsCard('SIMPLE', true),
    fitsCard('BITPIX', bitpix),
    fitsCard('NAXIS', 1),
    fitsCard('NAXIS1', n),
    fitsCard('CRVAL1', 4000),
    fitsCard('CDELT1', 1),
    ...extra,
  ]);
  const out = new Uint8Array(header.length + Math.ceil(data.length / 2880) * 2880);
  out.set(header);
  out.set(data, header.length);
  return out;
}

/** Deterministic Gaussian noise (LCG + Box-Muller), so tests never depend on Math.random. */
function noise(n: number, sigma: number, seed = 12345): Float64Array {
  let s = seed >>> 0;
  const u = () => ((s = (Math.imul(s, 1664525) + 1013904223) >>> 0) + 0.5) / 4294967296;
  const out = new Float64Array(n);
  for (let i = 0; i < n; i++) out[i] = sigma * Math.sqrt(-2 * Math.log(u())) * Math.cos(2 * Math.PI * u());
  return out;
}

describe('image pixel types (FITS 4.0 sec. 5; byte patterns from reference.md sec. 8)', () => {
  it('float32 bytes 3f800000 40000000 bfc00000 00000000 are 1, 2, -1.5, 0', () => {
    const s = readFits(handMade(-32, '3f80000040000000bfc0000000000000'), 'f32.fits');
    expect(Array.from(s.flux)).toEqual([1, 2, -1.5, 0]);
    expect(Array.from(s.wavelengthA)).toEqual([4000, 4001, 4002, 4003]);
  });

  it('float32 NaN (7fc00000) becomes NaN flux and a masked pixel', () => {
    const s = readFits(handMade(-32, '3f8000007fc0000040000000'), 'nan.fits');
    expect(s.flux[1]).toBeNaN();
    expect(Array.from(s.mask)).toEqual([0, 1, 0]);
  });

  it('unsigned 16-bit convention: BZERO 32768 and bytes 8000 8001 7fff 0000 are 0, 1, 65535, 32768', () => {
    const s = readFits(handMade(16, '800080017fff0000', [fitsCard('BZERO', 32768), fitsCard('BSCALE', 1)]), 'u16.fits');
    expect(Array.from(s.flux)).toEqual([0, 1, 65535, 32768]);
  });

  it('BITPIX 16 with BLANK: the blank value becomes NaN and is masked', () => {
    const s = readFits(handMade(16, '00058000fffe', [fitsCard('BLANK', -32768)]), 'blank.fits');
    expect(s.flux[0]).toBe(5);
    expect(s.flux[1]).toBeNaN();
    expect(s.flux[2]).toBe(-2);
    expect(Array.from(s.mask)).toEqual([0, 1, 0]);
  });

  it('BITPIX 64 is read through BigInt64 (two\'s complement, big-endian)', () => {
    const s = readFits(handMade(64, '0000000000000001fffffffffffffffe000000e8d4a51000'), 'i64.fits');
    expect(Array.from(s.flux)).toEqual([1, -2, 1e12]);
  });

  it('BITPIX 8 is unsigned; BSCALE and BZERO apply (physical = BZERO + BSCALE * stored)', () => {
    const s = readFits(handMade(8, '00ff80', [fitsCard('BSCALE', 0.5), fitsCard('BZERO', -10)]), 'u8.fits');
    expect(Array.from(s.flux)).toEqual([-10, 117.5, 54]);
  });

  for (const bitpix of [8, 16, 32, 64, -32, -64] as const) {
    it(`BITPIX ${bitpix} round trip through the writer with BSCALE 0.25 and BZERO 100`, () => {
      const data = [100, 100.25, 110, 120.5, 163.75];
      const scaled = bitpix > 0 ? { bscale: 0.25, bzero: 100 } : {};
      const s = readFits(writeFitsFile([writeImageHdu({ data, bitpix, ...scaled, cards: WCS })]), `b${bitpix}.fits`);
      expect(Array.from(s.flux)).toEqual(data);
    });
  }
});

describe('image shapes', () => {
  it('NAXIS = 2 with NAXIS2 = 1 is a 1-D spectrum', () => {
    const s = readFits(writeFitsFile([writeImageHdu({ data: new Float32Array([1, 2, 3]), axes: [3, 1], cards: WCS })]), 'row.fits');
    expect(Array.from(s.flux)).toEqual([1, 2, 3]);
    expect(s.ivar).toBeNull();
  });

  it('a spectrum in an IMAGE extension after an empty primary, WCS in the extension', () => {
    const ext = writeImageHdu({ data: new Float32Array([1, 2, 3]), primary: false, extname: 'FLUX', cards: WCS });
    const s = readFits(writeFitsFile([ext]), 'ext.fits');
    expect(Array.from(s.wavelengthA)).toEqual([4000, 4001, 4002]);
    expect(s.format).toBe('fits-image');
  });

  it('an IMAGE extension without WCS takes it from the primary header', () => {
    const primary = writeImageHdu({ data: new Float32Array(0), axes: [0], cards: WCS });
    const ext = writeImageHdu({ data: new Float32Array([1, 2, 3]), primary: false });
    const s = readFits(writeFitsFile([primary, ext]), 'pwcs.fits');
    expect(Array.from(s.wavelengthA)).toEqual([4000, 4001, 4002]);
  });

  it('a decreasing wavelength axis is turned round with its flux', () => {
    const cards: FitsCardInput[] = [['CTYPE1', 'WAVE'], ['CRPIX1', 1], ['CRVAL1', 5000], ['CDELT1', -2]];
    const s = readFits(writeFitsFile([writeImageHdu({ data: new Float32Array([1, 2, 3]), cards })]), 'desc.fits');
    expect(Array.from(s.wavelengthA)).toEqual([4996, 4998, 5000]);
    expect(Array.from(s.flux)).toEqual([3, 2, 1]);
  });

  it('a wavelength image HDU named WAVELENGTH serves when there is no WCS', () => {
    const flux = writeImageHdu({ data: new Float32Array([1, 2, 3]) });
    const wave = writeImageHdu({ data: new Float64Array([6000, 6001.5, 6003]), primary: false, extname: 'WAVELENGTH', cards: [['BUNIT', 'Angstrom']] });
    const s = readFits(writeFitsFile([flux, wave]), 'wimg.fits');
    expect(Array.from(s.wavelengthA)).toEqual([6000, 6001.5, 6003]);
  });

  it('error: a 2-D frame with many rows', () => {
    const e = readError(() => readFits(writeFitsFile([writeImageHdu({ data: new Float32Array(100 * 40), axes: [100, 40], cards: WCS })]), 'frame.fits'));
    expect(e.message).toBe(
      'frame.fits (HDU 0, keyword NAXIS): image of shape 100 x 40 is a 2-D frame, not a 1-D spectrum (at most 16 rows of flux, uncertainty and mask are read)',
    );
  });

  it('error: several spectra (two axes beyond the first longer than 1)', () => {
    const e = readError(() => readFits(writeFitsFile([writeImageHdu({ data: new Float32Array(5 * 2 * 3), axes: [5, 2, 3], cards: WCS })]), 'cube.fits'));
    expect(e.message).toBe('cube.fits (HDU 0, keyword NAXIS): image of shape 5 x 2 x 3 holds several spectra; one 1-D spectrum per file is read');
  });
});

describe('uncertainty and mask', () => {
  const n = 400;
  const sigma = 0.1;
  const flux = noise(n, sigma).map((v, i) => 10 + Math.sin(i / 50) + v);
  const twoRows = (second: ArrayLike<number>, cards: FitsCardInput[] = []) => {
    const data = new Float32Array(2 * n);
    data.set(flux);
    data.set(Array.from(second), n);
    return writeFitsFile([writeImageHdu({ data, axes: [n, 2], cards: [...WCS, ...cards] })]);
  };
  const median = (a: Float64Array) => Array.from(a).sort((x, y) => x - y)[a.length >> 1];

  for (const [kind, value] of [['ivar', 1 / sigma ** 2], ['error', sigma], ['variance', sigma ** 2]] as const) {
    it(`2-D flux / ${kind} rows without a description: the kind is judged from the data (ivar ~ 100)`, () => {
      expect(guessNoiseKind(Float64Array.from(flux), new Float64Array(n).fill(value))).toBe(kind);
      const s = readFits(twoRows(new Float32Array(n).fill(value)), `${kind}.fits`);
      expect(median(s.ivar!)).toBeCloseTo(100, 3);
    });
  }

  it("EXTEN0 'Flux Inverse Subcontinuum Andmask Ormask' names the rows (survey 2-D layout)", () => {
    const data = new Float32Array(5 * n);
    data.set(flux);
    data.fill(4, n, 2 * n); // inverse variance
    data.fill(1, 2 * n, 3 * n);
    data[3 * n + 7] = 8; // and-mask bit on pixel 8
    const file = writeFitsFile([writeImageHdu({ data, axes: [n, 5], cards: [...WCS, ['EXTEN0', 'Flux Inverse Subcontinuum Andmask Ormask']] })]);
    const s = readFits(file, 'rows.fits');
    expect(s.ivar![0]).toBe(4);
    expect(s.wavelengthA[0]).toBe(4000); // the sub-continuum row is not a wavelength: the WCS is used
    // The and-mask of this layout marks pixels bad in every exposure: applied even with an inverse variance (issue 11).
    expect(Array.from(s.mask).flatMap((m, i) => (m ? [i] : []))).toEqual([7]);
  });

  it("EXTEN0 'Flux Inverse Wavelength Andmask Ormask': wavelengths from row 3, and-mask applied, or-mask not", () => {
    const data = new Float32Array(5 * n);
    data.set(flux);
    data.fill(4, n, 2 * n);
    for (let i = 0; i < n; i++) data[2 * n + i] = 10 ** (3.6 + 1e-4 * i);
    data[3 * n + 2] = 1; // and-mask on pixel 3
    data[3 * n + 9] = 65536; // a high bit on pixel 10
    data[4 * n + 5] = 4; // or-mask only on pixel 6
    const cards: FitsCardInput[] = [['EXTEN0', 'Flux Inverse Wavelength Andmask Ormask'], ['VACUUM', true]];
    const s = readFits(writeFitsFile([writeImageHdu({ data, axes: [n, 5], cards })]), 'rows5.fits');
    expect(s.wavelengthA[0]).toBeCloseTo(10 ** 3.6, 2);
    expect(s.wavelengthA[n - 1]).toBeCloseTo(10 ** (3.6 + 1e-4 * (n - 1)), 2);
    expect(Array.from(s.mask).flatMap((m, i) => (m ? [i] : []))).toEqual([2, 9]);
  });

  it('an undescribed 5-row image whose rows fit the layout flux, ivar, wavelength, and-mask, or-mask is read that way', () => {
    const data = new Float32Array(5 * n);
    data.set(flux);
    data.fill(100, n, 2 * n);
    for (let i = 0; i < n; i++) data[2 * n + i] = 5000 + 2 * i;
    data[3 * n + 4] = 2;
    data[4 * n + 6] = 1;
    const s = readFits(writeFitsFile([writeImageHdu({ data, axes: [n, 5] })]), 'bare5.fits');
    expect(s.wavelengthA[1]).toBe(5002);
    expect(Array.from(s.mask).flatMap((m, i) => (m ? [i] : []))).toEqual([4]);
    // Rows 4-5 that are not whole numbers are not masks: nothing is masked, the WCS gives the wavelengths.
    data[3 * n + 1] = 0.5;
    const t = readFits(writeFitsFile([writeImageHdu({ data, axes: [n, 5], cards: WCS })]), 'bare5b.fits');
    expect(Array.from(t.mask).every((m) => m === 0)).toBe(true);
    expect(t.wavelengthA[1]).toBe(4001);
  });

  it("BANDIDn names the rows (IRAF multispec): 'sigma' row is the error", () => {
    const data = new Float32Array(3 * n);
    data.set(flux);
    data.fill(99, n, 2 * n); // raw spectrum, not an uncertainty
    data.fill(0.5, 2 * n, 3 * n);
    const cards: FitsCardInput[] = [
      ['BANDID1', 'spectrum - background fit, weights variance, clean no'],
      ['BANDID2', 'raw - background fit, weights none, clean no'],
      ['BANDID3', 'sigma - background fit, weights variance, clean no'],
    ];
    const s = readFits(writeFitsFile([writeImageHdu({ data, axes: [n, 1, 3], cards: [...WCS, ...cards] })]), 'ms.fits');
    expect(s.ivar![0]).toBe(4);
  });

  const withExt = (extname: string, values: ArrayLike<number>) =>
    writeFitsFile([
      writeImageHdu({ data: Float32Array.from(flux), cards: WCS }),
      writeImageHdu({ data: Float32Array.from(values), primary: false, extname }),
    ]);

  for (const [extname, value] of [['ERR', 0.5], ['sigma', 0.5], ['STDDEV', 0.5], ['IVAR', 4], ['inverse variance', 4], ['INVVAR', 4], ['WEIGHT', 4], ['VARIANCE', 0.25], ['var', 0.25]] as const) {
    it(`uncertainty HDU EXTNAME '${extname}' becomes inverse variance 4`, () => {
      const s = readFits(withExt(extname, new Float32Array(n).fill(value)), 'u.fits');
      expect(s.ivar![0]).toBeCloseTo(4, 6);
    });
  }

  it('zero or negative errors give zero inverse variance', () => {
    const err = new Float32Array(n).fill(0.5);
    err[3] = 0;
    err[4] = -1;
    const s = readFits(withExt('ERROR', err), 'z.fits');
    expect(s.ivar![3]).toBe(0);
    expect(s.ivar![4]).toBe(0);
  });

  it("mask HDU 'MASK': non-zero marks bad pixels", () => {
    const m = new Int16Array(n);
    m[10] = 1;
    m[11] = 512;
    const s = readFits(withExt('MASK', m), 'm.fits');
    expect(s.mask[10]).toBe(1);
    expect(s.mask[11]).toBe(1);
    expect(s.mask.reduce((a, b) => a + b, 0)).toBe(2);
  });

  it("bit mask HDU 'AND_MASK' is used when there is no uncertainty", () => {
    const m = new Int32Array(n);
    m[20] = 16;
    const s = readFits(withExt('AND_MASK', m), 'am.fits');
    expect(s.mask[20]).toBe(1);
  });

  it('error: uncertainty HDU with a different length', () => {
    const e = readError(() => readFits(withExt('IVAR', new Float32Array(n - 1).fill(1)), 'len.fits'));
    expect(e.message).toBe("len.fits (HDU 1, keyword NAXIS1): uncertainty image 'IVAR' has 399 pixels but the flux has 400");
  });
});
