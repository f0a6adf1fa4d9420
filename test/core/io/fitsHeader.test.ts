import { describe, expect, it } from 'vitest';
import { SpectrumReadError } from '../../../src/core/types';
import { FitsHeader, MAX_HEADER_BLOCKS, parseCard, readHeader } from '../../../src/core/io/fits/header';
import { fitsCard, fitsHeaderBytes } from '../../../src/core/io/fits/write';
import { caught as readError } from '../../helpers/caught';


/** Raw 80-column card text (for cards our writer would never produce). */
const raw = (s: string): string => s.padEnd(80, ' ');

describe('parseCard(card)', () => {
  // Value syntax: FITS Standard 4.0, sec. 4.2.
  it('reads logical, integer and float values with comments', () => {
    expect(parseCard(raw('SIMPLE  =                    T / conforms'))).toEqual({ key: 'SIMPLE', value: true, comment: 'conforms' });
    expect(parseCard(raw('EXTEND  =                    F')).value).toBe(false);
    expect(parseCard(raw('NAXIS1  =                 3904 /')).value).toBe(3904);
    expect(parseCard(raw('CRVAL1  =              3.56820 / log10')).value).toBe(3.5682);
    expect(parseCard(raw('BZERO   =              -1.5E+3')).value).toBe(-1500);
  });

  it('reads D exponents as floats', () => {
    expect(parseCard(raw('CDELT1  =       1.0000000D-04')).value).toBeCloseTo(1e-4, 18);
    expect(parseCard(raw('X       =              2.5d2')).value).toBe(250);
  });

  it('keeps integers beyond 2^53 exact as bigint (TZERO of unsigned 64-bit columns)', () => {
    expect(parseCard(raw('TZERO236=  9223372036854775808 /')).value).toBe(9223372036854775808n);
  });

  it("reads strings, undoing '' and dropping trailing (not leading) spaces", () => {
    expect(parseCard(raw("CTYPE1  = 'WAVE-LOG'           / axis")).value).toBe('WAVE-LOG');
    expect(parseCard(raw("OBJECT  = 'O''Neil / field'    / name"))).toEqual({ key: 'OBJECT', value: "O'Neil / field", comment: 'name' });
    expect(parseCard(raw("PAD     = '  x     '")).value).toBe('  x');
    expect(parseCard(raw("EMPTY   = ''")).value).toBe('');
  });

  it('reads an undefined value as null and commentary cards without a value', () => {
    expect(parseCard(raw('UNDEF   =                      / nothing')).value).toBeNull();
    const c = parseCard(raw('COMMENT --------FILE INFORMATION'));
    expect(c.key).toBe('COMMENT');
    expect(c.value).toBeUndefined();
    expect(c.comment).toBe('--------FILE INFORMATION');
    expect(parseCard(raw('HISTORY = not a value')).value).toBeUndefined();
  });

  it('marks unparseable values as malformed', () => {
    const c = parseCard(raw('CRVAL1  = abc'));
    expect(c.value).toBeNull();
    expect(c.malformed).toBe('abc');
  });

  it('reads HIERARCH cards with their full name', () => {
    expect(parseCard(raw('HIERARCH ESO DET EXPTIME = 12.5 / s'))).toMatchObject({ key: 'ESO DET EXPTIME', value: 12.5 });
  });

  it('reads what fitsCard writes (round trip)', () => {
    for (const v of [true, false, 0, -17, 123456789, 3.5797835966, 1e-17, -2.5e300, 'WAVE', "it's", '']) {
      expect(parseCard(fitsCard('KEY', v)).value).toBe(v);
    }
  });
});

describe('FitsHeader accessors', () => {
  const h = new FitsHeader(
    ['NAXIS   =                    2', "CTYPE1  = 'LINEAR  '", 'CRVAL1  = abc', "NUMSTR  = '12.5'", 'BITPIX  =                 -3.5'].map((s) => parseCard(raw(s))),
  );
  it('get, str, num and int', () => {
    expect(h.get('naxis')).toBe(2);
    expect(h.str('CTYPE1')).toBe('LINEAR');
    expect(h.num('NUMSTR', 'f', 0)).toBe(12.5);
    expect(h.num('MISSING', 'f', 0)).toBeUndefined();
    expect(h.int('NAXIS', 'f', 0)).toBe(2);
  });
  it('num names the keyword when the value is not a number', () => {
    const e = readError(() => h.num('CRVAL1', 'spec.fits', 0));
    expect(e.message).toBe('spec.fits (HDU 0, keyword CRVAL1): value abc is not a number');
  });
  it('int names the keyword when the value is missing or not an integer', () => {
    expect(readError(() => h.int('NAXIS1', 'spec.fits', 2)).message).toBe('spec.fits (HDU 2, keyword NAXIS1): required keyword NAXIS1 is missing');
    expect(readError(() => h.int('BITPIX', 'spec.fits', 0)).message).toBe('spec.fits (HDU 0, keyword BITPIX): value -3.5 is not an integer');
  });
});

describe('readHeader(bytes, offset, file, hdu)', () => {
  it('finds END and counts whole blocks', () => {
    const cards = Array.from({ length: 40 }, (_, i) => fitsCard(`K${i}`, i));
    const bytes = fitsHeaderBytes(cards);
    expect(bytes.length).toBe(5760); // 41 cards need 2 blocks of 36
    const { header, dataOffset, blocks } = readHeader(bytes, 0, 'f', 0);
    expect(blocks).toBe(2);
    expect(dataOffset).toBe(5760);
    expect(header.cards).toHaveLength(40);
    expect(header.get('K39')).toBe(39);
  });

  it('joins CONTINUE long strings (FITS 4.0 sec. 4.2.1.2)', () => {
    const long = 'a long note '.repeat(12).trim();
    const { header } = readHeader(fitsHeaderBytes([fitsCard('NOTE', long), fitsCard('NEXT', 1)]), 0, 'f', 0);
    expect(header.get('NOTE')).toBe(long);
    expect(header.get('NEXT')).toBe(1);
  });

  it('error: no END card', () => {
    const bytes = fitsHeaderBytes([fitsCard('SIMPLE', true)], false);
    const e = readError(() => readHeader(bytes, 0, 'noend.fits', 0));
    expect(e.message).toBe('noend.fits (HDU 0, keyword END): no END card: the header runs to the end of the file after 36 cards');
  });

  it('error: header truncated inside a block', () => {
    const bytes = fitsHeaderBytes([fitsCard('SIMPLE', true)]).slice(0, 1000);
    const e = readError(() => readHeader(bytes, 0, 'short.fits', 0));
    expect(e.message).toBe('short.fits (HDU 0): truncated header: only 1000 bytes where a 2880-byte header block should start');
  });

  it('error: END missing after whole blocks with a partial block at the end', () => {
    const first = fitsHeaderBytes(Array.from({ length: 36 }, (_, i) => fitsCard(`K${i}`, i)), false);
    const bytes = new Uint8Array(first.length + 100).fill(0x20);
    bytes.set(first);
    const e = readError(() => readHeader(bytes, 0, 'cut.fits', 3));
    expect(e.message).toBe('cut.fits (HDU 3, keyword END): no END card: the header runs to the end of the file after 36 cards (truncated block)');
  });

  it('error: a header with no END within 1000 blocks is refused without parsing the rest', () => {
    const bytes = new Uint8Array((MAX_HEADER_BLOCKS + 5) * 2880).fill(0x20);
    const e = readError(() => readHeader(bytes, 0, 'endless.fits', 0));
    expect(e.message).toBe('endless.fits (HDU 0, keyword END): no END card within the first 36000 cards');
  });
});
