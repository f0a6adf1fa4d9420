import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { readTextSpectrum, MAX_LINE_CHARS, MAX_TEXT_BYTES } from '../../../src/core/io/text';
import { SpectrumReadError } from '../../../src/core/types';
import { caught } from '../../helpers/caught';

const enc = (s: string) => new TextEncoder().encode(s);
const read = (s: string, file = 'spec.csv') => readTextSpectrum(enc(s), file);
const arr = (a: ArrayLike<number>) => Array.from(a);


describe('readTextSpectrum(bytes, file): layouts', () => {
  it('reads a CSV with a header naming wavelength, flux and ivar', () => {
    const s = read('wavelength_vacuum_angstrom,flux,ivar\n4000,1.5,4\n4001,2.5,0\n4002,-1,0.25\n');
    expect(s.format).toBe('text');
    expect(s.file).toBe('spec.csv');
    expect(arr(s.wavelengthA)).toEqual([4000, 4001, 4002]);
    expect(arr(s.flux)).toEqual([1.5, 2.5, -1]);
    expect(arr(s.ivar!)).toEqual([4, 0, 0.25]);
    expect(arr(s.mask)).toEqual([0, 0, 0]);
    expect(s.meta.convertedFromAir).toBeUndefined();
  });

  it('reads headerless whitespace columns as wavelength, flux, error, mask', () => {
    const s = read('4000  1.0  0.5  0\n4001\t2.0\t0.25\t1\n4002 3.0 0 0\n');
    expect(arr(s.wavelengthA)).toEqual([4000, 4001, 4002]);
    expect(arr(s.ivar!)).toEqual([4, 16, 0]); // ivar = 1/error^2; error 0 = no information
    expect(arr(s.mask)).toEqual([0, 1, 0]);
  });

  it('reads two headerless columns with no uncertainty', () => {
    const s = read('4000 1\n4001 2\n');
    expect(s.ivar).toBeNull();
    expect(arr(s.flux)).toEqual([1, 2]);
  });

  it('reads tab-separated data with a tab-separated header', () => {
    const s = read('wave\tflux\terr\n5000\t1\t2\n5001\t1\t4\n');
    expect(arr(s.ivar!)).toEqual([0.25, 0.0625]);
  });

  it('reads semicolon-separated data', () => {
    const s = read('lambda;flux\n5000;1\n5001;2\n');
    expect(arr(s.wavelengthA)).toEqual([5000, 5001]);
  });

  it('accepts a UTF-8 byte-order mark, CRLF line ends, blank lines and comment lines (#, %, ;)', () => {
    const text = '\ufeff# made by hand\r\n% another comment\r\n\r\nwavelength,flux\r\n; a third\r\n4000,1\r\n\r\n4001,2\r\n';
    const s = read(text);
    expect(arr(s.wavelengthA)).toEqual([4000, 4001]);
    expect(arr(s.flux)).toEqual([1, 2]);
  });

  it('accepts quoted header names, including a quoted separator', () => {
    const s = read('"wavelength","flux, total","ivar"\n4000,1,1\n4001,2,1\n');
    expect(arr(s.flux)).toEqual([1, 2]);
    expect(s.ivar).not.toBeNull();
  });

  it('accepts quoted numbers', () => {
    const s = read('"wave","flux"\n"4000","1.5"\n"4001","2.5"\n');
    expect(arr(s.flux)).toEqual([1.5, 2.5]);
  });

  it('takes column names from the comment line just before the data', () => {
    const s = read('# wavelength flux ivar\n4000 1 9\n4001 2 9\n');
    expect(arr(s.ivar!)).toEqual([9, 9]); // ivar, not the headerless default (error)
  });

  it('takes column names from a `# columns:` comment', () => {
    const s = read('# columns: wave, flux, variance\n# source: synthetic\n4000,1,4\n4001,2,0.25\n');
    expect(arr(s.ivar!)).toEqual([0.25, 4]);
  });

  it('finds columns by name in any order and ignores unknown columns', () => {
    const s = read('sky,flux,model,loglam,and_mask,or_mask,ivar\n9,1,1,3.6,0,1,2\n9,2,1,3.6001,4,0,2\n');
    expect(s.wavelengthA[0]).toBeCloseTo(10 ** 3.6, 6);
    expect(s.wavelengthA[1]).toBeCloseTo(10 ** 3.6001, 6);
    expect(arr(s.mask)).toEqual([0, 1]); // the AND mask is used, not the OR mask
    expect(arr(s.ivar!)).toEqual([2, 2]);
  });

  it('recognises error, sigma, noise, uncertainty and variance names', () => {
    for (const name of ['err', 'error', 'sigma', 'noise', 'uncertainty', 'flux_err', 'e_flux']) {
      expect(arr(read(`wave,flux,${name}\n4000,1,2\n4001,1,2\n`).ivar!), name).toEqual([0.25, 0.25]);
    }
    for (const name of ['var', 'variance']) {
      expect(arr(read(`wave,flux,${name}\n4000,1,2\n4001,1,2\n`).ivar!), name).toEqual([0.5, 0.5]);
    }
    for (const name of ['ivar', 'inverse_variance', 'invvar']) {
      expect(arr(read(`wave,flux,${name}\n4000,1,2\n4001,1,2\n`).ivar!), name).toEqual([2, 2]);
    }
  });

  it('reads nan, NaN, inf and empty fields as non-finite values and masks those pixels', () => {
    const s = read('wave,flux,ivar\n4000,nan,1\n4001,NaN,1\n4002,inf,1\n4003,-Inf,1\n4004,,1\n4005,5,nan\n4006,6,1\n');
    expect(arr(s.mask)).toEqual([1, 1, 1, 1, 1, 0, 0]);
    expect(Number.isNaN(s.flux[0])).toBe(true);
    expect(s.flux[2]).toBe(Infinity);
    expect(s.flux[3]).toBe(-Infinity);
    expect(s.ivar![5]).toBe(0); // NaN inverse variance carries no information
  });

  it('ignores an unnamed index column written by data-frame exports', () => {
    const s = read(',wavelength,flux\n0,4000,1\n1,4001,2\n');
    expect(arr(s.wavelengthA)).toEqual([4000, 4001]);
    expect(arr(s.flux)).toEqual([1, 2]);
  });

  it('reads Fortran D exponents', () => {
    expect(arr(read('4.0D+03 1.5d-17\n4.001D+03 2.5D-17\n').wavelengthA)).toEqual([4000, 4001]);
  });

  it('reverses a strictly decreasing wavelength list, with every column', () => {
    const s = read('wave,flux,err,mask\n4002,3,1,1\n4001,2,2,0\n4000,1,4,0\n');
    expect(arr(s.wavelengthA)).toEqual([4000, 4001, 4002]);
    expect(arr(s.flux)).toEqual([1, 2, 3]);
    expect(arr(s.ivar!)).toEqual([1 / 16, 1 / 4, 1]);
    expect(arr(s.mask)).toEqual([0, 0, 1]);
  });

  it('reads a flux unit from brackets after the flux name', () => {
    expect(read('wave,flux [1e-17 erg/s/cm2/A]\n4000,1\n4001,1\n').meta.fluxUnit).toBe('1e-17 erg/s/cm2/A');
  });
});

describe('readTextSpectrum: trailing comments after data', () => {
  it('drops a trailing # comment on headerless whitespace rows (which would otherwise look like 5+ columns)', () => {
    const s = read('4000 1.0 0.5 # hand-checked\n4001 2.0 0.25  # cosmic ray nearby, flagged\n4002 3.0 0.5\n');
    expect(arr(s.wavelengthA)).toEqual([4000, 4001, 4002]);
    expect(arr(s.flux)).toEqual([1, 2, 3]);
    expect(arr(s.ivar!)).toEqual([4, 16, 4]); // third column read as a 1-sigma error
  });

  it('drops a comment whose text holds a comma, so the separator is still detected from the data', () => {
    const s = read('4000 1 # note, with a comma\n4001 2\n');
    expect(arr(s.flux)).toEqual([1, 2]);
  });

  it('drops trailing comments on CSV rows and on the header row, with or without a blank before #', () => {
    const s = read('wavelength,flux,ivar # units: vacuum Angstrom\n4000,1,4# first\n4001,2,9\t# second\n');
    expect(arr(s.wavelengthA)).toEqual([4000, 4001]);
    expect(arr(s.ivar!)).toEqual([4, 9]);
    expect(arr(read('wave;flux\n5000;1.5# a\n5001;2 #b\n').flux)).toEqual([1.5, 2]);
  });

  it('keeps the separator before a comment: `4000,1,# x` is three fields, the last one empty', () => {
    const s = read('wavelength,flux,ivar\n4000,1,# no uncertainty here\n4001,2,9\n');
    expect(s.ivar![0]).toBe(0); // empty field = missing = no information
    expect(s.ivar![1]).toBe(9);
  });

  it('keeps a # that is part of a name or inside quotes', () => {
    const s = read('wavelength,"flux #2",n#obs\n4000,1,3\n4001,2,3\n');
    expect(arr(s.flux)).toEqual([1, 2]);
  });

  it('still refuses a row whose text before the comment is not a number, naming the line', () => {
    const e = caught(() => read('4000 1\n4001 x # bad\n'));
    expect(e.where.line).toBe(2);
    expect(e.reason).toBe("'x' is not a number");
  });
});

describe('readTextSpectrum: wavelength units, medium and scale', () => {
  const twoRows = (name: string, a: number, b: number) => `${name},flux\n${a},1\n${b},1\n`;

  it('takes an unstated wavelength as vacuum Angstrom', () => {
    const s = read(twoRows('wavelength', 6562.8, 6563.8));
    expect(s.wavelengthA[0]).toBe(6562.8);
    expect(s.meta.convertedFromAir).toBeUndefined();
  });

  it.each([
    ['wavelength_nm', 10],
    ['Wavelength [nm]', 10],
    ['wavelength (Angstrom)', 1],
    ['lambda_A', 1],
    ['wave_um', 1e4],
    ['wavelength (micron)', 1e4],
    ['wavelength [\u00b5m]', 1e4],
    ['wavelength [\u00c5]', 1],
  ])('scales the column %s by %d to Angstrom', (name, factor) => {
    const s = read(twoRows(name, 0.5, 0.6));
    expect(s.wavelengthA[0]).toBeCloseTo(0.5 * factor, 9);
  });

  it('reads natural-log wavelengths from a ln_lambda column', () => {
    expect(read(twoRows('ln_lambda', 8, 8.001)).wavelengthA[0]).toBeCloseTo(Math.exp(8), 6);
  });

  it('converts air H-alpha 6562.80 A to vacuum 6564.613 A (reference sec. 2, Morton 2000)', () => {
    const s = read(twoRows('wavelength_air', 6562.8, 6563.8));
    expect(s.wavelengthA[0]).toBeCloseTo(6564.613, 3); // Morton 2000 check pair, reference.md sec. 2
    expect(s.meta.convertedFromAir).toBe(true);
  });

  it('converts air nm from the column name: wavelength_air_nm 500.684 -> 5008.237 A ([O III], reference sec. 2)', () => {
    const s = read(twoRows('wavelength_air_nm', 500.684, 500.784));
    expect(s.wavelengthA[0]).toBeCloseTo(5008.237, 3); // air 5006.84 -> vac 5008.237, reference.md sec. 2
  });

  it('takes medium and unit from a comment `# wavelength: air, nm`', () => {
    const s = read('# wavelength: air, nm\nwavelength,flux\n656.28,1\n656.38,1\n');
    expect(s.wavelengthA[0]).toBeCloseTo(6564.613, 3); // reference.md sec. 2
    expect(s.meta.convertedFromAir).toBe(true);
  });

  it('takes the medium from a headerless file with a `# medium = air` comment', () => {
    expect(read('# medium = air\n5889.95 1\n5895.92 1\n').wavelengthA[0]).toBeCloseTo(5891.582, 3); // Na D2, reference.md sec. 2
  });

  it('keeps vacuum wavelengths as they are when the comment says vacuum', () => {
    expect(read('# wavelength: vacuum Angstrom\n6564.61 1\n6565 1\n').wavelengthA[0]).toBe(6564.61);
  });

  it('rejects contradicting statements, naming both', () => {
    const e = caught(() => read('# wavelength: air\nwavelength_vac,flux\n5000,1\n5001,1\n'));
    expect(e.message).toBe("spec.csv (line 1): wavelength medium stated twice and differently: vacuum (column 'wavelength_vac') and air (line 1)");
  });
});

describe('readTextSpectrum: metadata from comments', () => {
  it('fills object, position, exposure, date, instrument and flux unit', () => {
    const s = read(
      [
        '# object: FIELD7-0042',
        '# ra: 150.1',
        '# dec: 2.2',
        '# exptime: 900',
        '# date-obs: 2031-04-05T03:12:00',
        '# instrument: invented spectrograph',
        "# flux_unit: '1e-17 erg/s/cm2/A'",
        'wave flux',
        '4000 1',
        '4001 1',
      ].join('\n'),
    );
    expect(s.meta).toEqual({
      objectId: 'FIELD7-0042',
      raDeg: 150.1,
      decDeg: 2.2,
      exposureS: 900,
      dateObs: '2031-04-05T03:12:00',
      instrument: 'invented spectrograph',
      fluxUnit: '1e-17 erg/s/cm2/A',
    });
  });

  it('reads sexagesimal right ascension (hours) and declination', () => {
    const s = read('# RA = 10:00:24.0\n# DEC = -02:12:36\n4000 1\n4001 1\n');
    expect(s.meta.raDeg).toBeCloseTo(150.1, 9); // 10h00m24s = 150.1 deg (15 deg per hour, common practice)
    expect(s.meta.decDeg).toBeCloseTo(-2.21, 9); // -(2 + 12/60 + 36/3600)
  });

  it('leaves out a position or exposure that cannot be read, and still reads the spectrum', () => {
    const s = read('# object: A\n# dec: 95\n# exptime: long\n4000 1\n4001 1\n');
    expect(s.meta.objectId).toBe('A');
    expect(s.meta.decDeg).toBeUndefined(); // |dec| > 90 deg is impossible
    expect(s.meta.exposureS).toBeUndefined();
    expect(s.flux.length).toBe(2);
  });

  it('skips metadata written as unknown', () => {
    expect(read('# ra: n/a\n4000 1\n4001 1\n').meta.raDeg).toBeUndefined();
  });
});

describe('readTextSpectrum: errors name the file and line', () => {
  it('empty file', () => {
    expect(caught(() => read('')).message).toBe('spec.csv: empty file');
  });

  it('no numeric rows', () => {
    expect(caught(() => read('# only a comment\n\n')).reason).toBe('no numeric rows (only blank or comment lines)');
    const e = caught(() => read('wavelength,flux\n'));
    expect(e.message).toBe('spec.csv (line 1): no numeric rows after the header');
  });

  it('text where a number should be: line and column name', () => {
    const e = caught(() => read('wavelength,flux\n4000,1\n4001,abc\n'));
    expect(e.message).toBe("spec.csv (column flux, line 3): 'abc' is not a number");
    expect(e.where).toEqual({ line: 3, column: 'flux' });
  });

  it('a repeated header row in the middle of the data', () => {
    const e = caught(() => read('wave,flux\n4000,1\n4001,2\nwave,flux\n4002,1\n'));
    expect(e.where.line).toBe(4);
    expect(e.reason).toBe("'wave' is not a number");
  });

  it('hexadecimal and decimal commas are not numbers', () => {
    expect(caught(() => read('4000 0x10\n4001 1\n')).where).toEqual({ line: 1, column: 'flux' });
    expect(caught(() => read('wave;flux\n4000;1,5\n')).where.line).toBe(2);
  });

  it('a row with a different number of columns', () => {
    const e = caught(() => read('wave,flux,ivar\n4000,1,1\n4001,1\n'));
    expect(e.message).toBe('spec.csv (line 3): row has 2 columns but the header on line 1 names 3');
    const h = caught(() => read('4000 1 1\n4001 1 1\n\n4002 1\n'));
    expect(h.message).toBe('spec.csv (line 4): row has 2 columns but the first row has 3');
  });

  it('non-monotonic wavelength', () => {
    const e = caught(() => read('wave,flux\n4000,1\n4002,1\n4001,1\n4003,1\n'));
    expect(e.where.line).toBe(4);
    expect(e.reason).toBe('wavelength goes down (4002 on line 3, then 4001); wavelengths must be strictly increasing or strictly decreasing');
    const d = caught(() => read('4003 1\n4002 1\n4002.5 1\n'));
    expect(d.where.line).toBe(3);
    expect(d.reason).toMatch(/^wavelength goes up again/);
  });

  it('repeated wavelength', () => {
    expect(caught(() => read('4000 1\n4000 2\n')).reason).toMatch(/^wavelength repeats \(4000 on line 1, then 4000\)/);
  });

  it('non-finite or non-positive wavelength', () => {
    expect(caught(() => read('wave,flux\n4000,1\nnan,1\n')).message).toBe('spec.csv (column wave, line 3): wavelength must be a finite number, got NaN');
    expect(caught(() => read('wave,flux\n-1,1\n4000,1\n')).where).toEqual({ line: 2, column: 'wave' });
  });

  it('all flux NaN', () => {
    expect(caught(() => read('wave,flux\n4000,nan\n4001,nan\n')).message).toBe('spec.csv: all flux values are NaN or infinite');
  });

  it('a single line longer than the limit', () => {
    const e = caught(() => read('wave,flux\n4000,1\n' + 'x'.repeat(MAX_LINE_CHARS + 1) + '\n'));
    expect(e.where.line).toBe(3);
    expect(e.reason).toMatch(/^line is longer than 65536 characters/);
  });

  it('a file larger than the limit, refused before decoding', () => {
    const big = new Uint8Array(MAX_TEXT_BYTES + 1); // zero pages: the reader must not touch them
    expect(caught(() => readTextSpectrum(big, 'big.txt')).message).toBe(
      `big.txt: file is ${MAX_TEXT_BYTES + 1} bytes, more than the limit of ${MAX_TEXT_BYTES} bytes for text spectra`,
    );
  });

  it('a header without wavelength or flux column', () => {
    expect(caught(() => read('x,y\n1,2\n')).reason).toBe("the header ('x', 'y') names no wavelength column; expected a name like wavelength, wave, lambda or loglam");
    expect(caught(() => read('wave,sky\n1,2\n')).reason).toBe("the header ('wave', 'sky') names no flux column");
  });

  it('a header with two wavelength columns', () => {
    expect(caught(() => read('wave,loglam,flux\n4000,3.6,1\n')).reason).toBe("the header has 2 wavelength columns ('wave', 'loglam'); keep one");
  });

  it('one column, or more than four without a header', () => {
    expect(caught(() => read('4000\n4001\n')).reason).toMatch(/^only one column/);
    expect(caught(() => read('1 2 3 4 5\n')).reason).toMatch(/^5 columns and no header row naming them/);
  });

  it('a single data row', () => {
    expect(caught(() => read('4000 1\n')).reason).toBe('only one pixel; a spectrum needs at least 2');
  });
});

describe('readTextSpectrum: round trip', () => {
  it('reads back exactly what was written, in every layout', () => {
    // Property: String(x) of a double reads back as the same double (ECMAScript Number::toString).
    const row = fc.record({ step: fc.double({ min: 1e-3, max: 50, noNaN: true }), flux: fc.double({ noNaN: true, min: -1e6, max: 1e6 }), err: fc.double({ min: 1e-3, max: 1e3, noNaN: true }) });
    fc.assert(
      fc.property(
        fc.array(row, { minLength: 2, maxLength: 40 }),
        fc.constantFrom(',', ';', ' ', '\t', ' , '),
        fc.boolean(),
        fc.constantFrom('\n', '\r\n'),
        (rows, sep, header, eol) => {
          let w = 3000;
          const wl = rows.map((r) => (w += r.step));
          const lines = rows.map((r, i) => [wl[i], r.flux, r.err].map(String).join(sep));
          if (header) lines.unshift(['wave', 'flux', 'sigma'].join(sep));
          const s = read(lines.join(eol) + eol);
          expect(arr(s.wavelengthA)).toEqual(wl);
          expect(arr(s.flux)).toEqual(rows.map((r) => r.flux + 0)); // String(-0) is "0"
          expect(arr(s.ivar!)).toEqual(rows.map((r) => 1 / (r.err * r.err)));
        },
      ),
      { numRuns: 200 },
    );
  });
});
