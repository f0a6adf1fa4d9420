import { describe, expect, it } from 'vitest';
import {
  fitsCard,
  fitsHeaderBytes,
  formatFitsFloat,
  writeBinTableHdu,
  writeFitsFile,
  writeImageHdu,
} from '../../../src/core/io/fits/write';

/** Header text of an HDU (ASCII bytes up to the first data byte). */
function text(bytes: Uint8Array, from = 0, to = bytes.length): string {
  let s = '';
  for (let i = from; i < to; i++) s += String.fromCharCode(bytes[i]);
  return s;
}
function cards(bytes: Uint8Array): string[] {
  const out: string[] = [];
  for (let o = 0; o + 80 <= bytes.length; o += 80) {
    const c = text(bytes, o, o + 80);
    out.push(c);
    if (c.startsWith('END     ')) break;
  }
  return out;
}
function hex(bytes: Uint8Array, from: number, n: number): string {
  return Array.from(bytes.subarray(from, from + n), (b) => b.toString(16).padStart(2, '0')).join('');
}

describe('fitsCard(key, value, comment)', () => {
  // Layout: FITS 4.0 sec. 4.2 (keyword cols 1-8, '= ' cols 9-10, fixed values right-justified to col 30).
  it('right-justifies integers and logicals to column 30', () => {
    const c = fitsCard('NAXIS1', 4000, 'length');
    expect(c).toHaveLength(80);
    expect(c.slice(0, 10)).toBe('NAXIS1  = ');
    expect(c.slice(10, 30)).toBe('4000'.padStart(20));
    expect(c.slice(30)).toBe(' / length'.padEnd(50));
    expect(fitsCard('SIMPLE', true).slice(29, 30)).toBe('T');
    expect(fitsCard('FLAG', false).slice(29, 30)).toBe('F');
  });

  it('writes floats with a decimal point and upper-case exponent', () => {
    expect(formatFitsFloat(0.5)).toBe('0.5');
    expect(formatFitsFloat(1e-17)).toBe('1.0E-17');
    expect(formatFitsFloat(3.5797835966)).toBe('3.5797835966');
    expect(formatFitsFloat(-2.5e300)).toBe('-2.5E300');
    // Shortest round trip may exceed 20 characters; precision is reduced to fit.
    const long = formatFitsFloat(-1.2345678901234567e-300);
    expect(long.length).toBeLessThanOrEqual(20);
    expect(Number(long)).toBeCloseTo(-1.2345678901234567e-300, 310);
    expect(fitsCard('CDELT1', 0.874982335338).slice(10, 30).trim()).toBe('0.874982335338');
  });

  it('quotes strings from column 11, pads to 8 characters and doubles quotes', () => {
    expect(fitsCard('CTYPE1', 'WAVE').slice(10, 20)).toBe("'WAVE    '");
    expect(fitsCard('OBJECT', "O'Neil field").slice(10, 25)).toBe("'O''Neil field'");
  });

  it('writes an undefined value as blank', () => {
    expect(fitsCard('UNDEF', null).slice(0, 30)).toBe('UNDEF   = '.padEnd(30));
  });

  it('splits long strings with CONTINUE cards', () => {
    const long = 'x'.repeat(100) + "'" + 'y'.repeat(50);
    const c = fitsCard('NOTE', long, 'long');
    expect(c.length % 80).toBe(0);
    expect(c.length).toBe(240);
    expect(c.slice(80, 90)).toBe('CONTINUE  ');
    // Rebuild the value from the pieces: strip quotes and '&', undo ''.
    let joined = '';
    for (let o = 0; o < c.length; o += 80) {
      const m = /'((?:[^']|'')*)'/.exec(c.slice(o + 10, o + 80))!;
      joined += m[1].replace(/&$/, '');
    }
    expect(joined.replace(/''/g, "'")).toBe(long);
  });

  it('writes commentary cards as free text', () => {
    const c = fitsCard('COMMENT', 'made by a test');
    expect(c).toBe('COMMENT made by a test'.padEnd(80));
    expect(fitsCard('HISTORY', 'h'.repeat(100))).toHaveLength(160);
  });

  it('refuses bad keywords, non-finite numbers and non-ASCII strings', () => {
    expect(() => fitsCard('TOOLONGKEY', 1)).toThrow(/keyword/);
    expect(() => fitsCard('lower', 1)).toThrow(/keyword/);
    expect(() => fitsCard('X', NaN)).toThrow(/NaN/);
    expect(() => fitsCard('X', 'caf\u00e9')).toThrow(/ASCII/);
  });
});

describe('fitsHeaderBytes(cards)', () => {
  it('adds END and pads with spaces to 2880 bytes', () => {
    const h = fitsHeaderBytes([fitsCard('SIMPLE', true)]);
    expect(h.length).toBe(2880);
    expect(text(h, 80, 83)).toBe('END');
    expect(h[2879]).toBe(0x20);
  });
});

describe('writeImageHdu(spec)', () => {
  it('a 4-pixel float32 primary spectrum is 5760 bytes (reference sec. 8, computed with astropy)', () => {
    const hdu = writeImageHdu({ data: new Float32Array([1, 2, -1.5, 0]) });
    expect(hdu.length).toBe(5760);
    const cs = cards(hdu);
    expect(cs[0].slice(0, 30)).toBe('SIMPLE  =                    T');
    expect(cs[1]).toMatch(/^BITPIX  =\s+-32/);
    expect(cs[2]).toMatch(/^NAXIS   =\s+1/);
    expect(cs[3]).toMatch(/^NAXIS1  =\s+4/);
    // float32 1.0, 2.0, -1.5, 0.0 byte patterns (reference sec. 8 [C]).
    expect(hex(hdu, 2880, 16)).toBe('3f80000040000000bfc0000000000000');
    expect(hex(hdu, 2896, 4)).toBe('00000000'); // zero padding
  });

  it('float32 NaN is stored as 7fc00000 (reference sec. 8)', () => {
    const hdu = writeImageHdu({ data: new Float32Array([NaN]) });
    expect(hex(hdu, 2880, 4)).toBe('7fc00000');
  });

  it('unsigned 16-bit convention: BZERO 32768 stores 0, 1, 65535, 32768 as 8000 8001 7fff 0000 (reference sec. 8)', () => {
    const hdu = writeImageHdu({ data: new Uint16Array([0, 1, 65535, 32768]), bitpix: 16, bzero: 32768 });
    expect(hex(hdu, 2880, 8)).toBe('800080017fff0000');
    expect(cards(hdu).some((c) => /^BZERO   =\s+32768/.test(c))).toBe(true);
  });

  it('writes an IMAGE extension with PCOUNT, GCOUNT and EXTNAME, and 2-D axes', () => {
    const hdu = writeImageHdu({ data: new Float64Array(6), axes: [3, 2], primary: false, extname: 'IVAR' });
    const cs = cards(hdu);
    expect(cs[0].slice(0, 20)).toBe("XTENSION= 'IMAGE   '");
    expect(cs.some((c) => /^NAXIS2  =\s+2 /.test(c))).toBe(true);
    expect(cs.some((c) => /^PCOUNT  =\s+0 /.test(c))).toBe(true);
    expect(cs.some((c) => c.startsWith("EXTNAME = 'IVAR    '"))).toBe(true);
  });

  it('writes BITPIX 64 big-endian and BLANK for NaN in integer images', () => {
    const hdu = writeImageHdu({ data: new BigInt64Array([1n, -2n]) });
    expect(hex(hdu, 2880, 16)).toBe('0000000000000001fffffffffffffffe');
    const b = writeImageHdu({ data: [5, NaN], bitpix: 16, blank: -32768 });
    expect(hex(b, 2880, 4)).toBe('00058000');
  });

  it('refuses mismatched axes, out-of-range integers and reserved keywords', () => {
    expect(() => writeImageHdu({ data: new Float32Array(5), axes: [2, 2] })).toThrow(/need 4 values/);
    expect(() => writeImageHdu({ data: [40000], bitpix: 16 })).toThrow(/outside/);
    expect(() => writeImageHdu({ data: [1, 2], cards: [['NAXIS1', 5]] })).toThrow(/set by the writer/);
  });
});

describe('writeBinTableHdu(spec)', () => {
  it('row of D, E, E, J, I, K, B, L, 8A, 3E, I is 54 bytes (reference sec. 8, computed with astropy)', () => {
    const cols = ['D', 'E', 'E', 'J', 'I', 'K', 'B', 'L', '8A', '3E', 'I'].map((format, i) => ({
      name: `c${i}`,
      format,
      data: format === '8A' ? ['abc'] : format === 'L' ? [true] : format === '3E' ? [1, 2, 3] : [1],
      ...(i === 10 ? { tzero: 32768 } : {}),
    }));
    const hdu = writeBinTableHdu({ columns: cols, nRows: 1 });
    const cs = cards(hdu);
    expect(cs.some((c) => /^NAXIS1  =\s+54 /.test(c))).toBe(true);
    expect(cs.some((c) => /^TZERO11 =\s+32768/.test(c))).toBe(true);
    expect(hdu.length).toBe(5760);
    // Last column: physical 1 with TZERO 32768 -> stored -32767 -> 8001.
    expect(hex(hdu, 2880 + 52, 2)).toBe('8001');
    // Logical true is 'T'; string padded with spaces.
    expect(hdu[2880 + 8 + 4 + 4 + 4 + 2 + 8 + 1]).toBe(0x54);
    expect(text(hdu, 2880 + 32, 2880 + 40)).toBe('abc     ');
  });

  it('one row of arrays: repeat counts and row-major data', () => {
    const hdu = writeBinTableHdu({
      columns: [
        { name: 'wave', format: '3D', unit: 'Angstrom', data: [4000, 4001, 4002] },
        { name: 'flux', format: '3E', data: new Float32Array([1, 2, -1.5]) },
      ],
      nRows: 1,
      extname: 'SPEC',
    });
    const cs = cards(hdu);
    expect(cs.some((c) => /^NAXIS1  =\s+36 /.test(c))).toBe(true);
    expect(cs.some((c) => c.startsWith("TUNIT1  = 'Angstrom'"))).toBe(true);
    expect(hex(hdu, 2880 + 24, 12)).toBe('3f80000040000000bfc00000');
  });

  it('refuses a column whose length does not match the rows', () => {
    expect(() => writeBinTableHdu({ columns: [{ name: 'a', format: 'E', data: [1, 2] }], nRows: 3 })).toThrow(/expected 3 values/);
    expect(() => writeBinTableHdu({ columns: [{ name: 'a', format: '2A', data: ['abc'] }], nRows: 1 })).toThrow(/longer than 2/);
    expect(() => writeBinTableHdu({ columns: [{ name: 'a', format: 'P', data: [] }], nRows: 0 })).toThrow(/unsupported TFORM/);
  });
});

describe('writeFitsFile(hdus)', () => {
  it('puts an empty primary HDU before a leading table', () => {
    const table = writeBinTableHdu({ columns: [{ name: 'a', format: 'J', data: [7] }], nRows: 1 });
    const file = writeFitsFile([table]);
    expect(file.length).toBe(2880 + table.length);
    const cs = cards(file);
    expect(cs[0].slice(0, 30)).toBe('SIMPLE  =                    T');
    expect(cs.some((c) => /^NAXIS   =\s+0 /.test(c))).toBe(true);
    expect(text(file, 2880, 2888)).toBe('XTENSION');
  });

  it('keeps a leading primary image as is and refuses a primary HDU later', () => {
    const img = writeImageHdu({ data: new Float32Array(4) });
    expect(writeFitsFile([img]).length).toBe(5760);
    expect(() => writeFitsFile([img, img])).toThrow(/only the first/);
  });
});
