import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { allNumeric, detectSeparator, fastDecimal, NUMBER_SYNTAX, parseField, scanNumber, splitFields } from '../../../src/core/io/text/fields';

describe('parseField(s)', () => {
  it('reads decimal and exponent notation', () => {
    expect(parseField('4000')).toBe(4000);
    expect(parseField('-1.5e-17')).toBe(-1.5e-17);
    expect(parseField('+.5')).toBe(0.5);
    expect(parseField('3.')).toBe(3);
    expect(parseField('1.5D+03')).toBe(1500); // Fortran exponent
  });
  it('reads nan, inf and missing markers as non-finite', () => {
    for (const s of ['nan', 'NaN', '-nan', '', 'null', 'NA', '--']) expect(Number.isNaN(parseField(s)), s).toBe(true);
    expect(parseField('inf')).toBe(Infinity);
    expect(parseField('-Infinity')).toBe(-Infinity);
  });
  it('refuses what Number() would accept but a spectrum should not contain', () => {
    for (const s of ['0x10', '0b1', '1_000', '1,5', 'abc', '1e', '.', '- 1']) expect(parseField(s), s).toBeUndefined();
  });
  it('reads a quoted number', () => {
    expect(parseField('"12.5"')).toBe(12.5);
  });
});

describe('splitFields(line, sep)', () => {
  it('splits on runs of spaces and tabs', () => {
    expect(splitFields('  1 \t 2\t\t3  ', 'space')).toEqual(['1', '2', '3']);
  });
  it('splits commas and trims', () => {
    expect(splitFields('1, 2 ,3', ',')).toEqual(['1', '2', '3']);
    expect(splitFields('1,,3', ',')).toEqual(['1', '', '3']);
  });
  it('keeps a quoted separator inside a field (RFC 4180)', () => {
    expect(splitFields('"a,b",c,"d ""e"""', ',')).toEqual(['a,b', 'c', 'd "e"']);
    expect(splitFields('"flux total" wave', 'space')).toEqual(['flux total', 'wave']);
  });
});

describe('detectSeparator and allNumeric', () => {
  it('prefers comma, then semicolon, then spaces', () => {
    expect(detectSeparator('1,2;3')).toBe(',');
    expect(detectSeparator('1;2')).toBe(';');
    expect(detectSeparator('1\t2')).toBe('space');
  });
  it('tells a data row from a header row', () => {
    expect(allNumeric(['1', 'nan', ''])).toBe(true);
    expect(allNumeric(['wave', '1'])).toBe(false);
  });
});

describe('scanNumber(s) against the reference NUMBER_SYNTAX', () => {
  it('agrees with the regular expression on number-like strings', () => {
    // Property test: the fast char scanner and the slow regular expression accept the same strings.
    fc.assert(
      fc.property(fc.string({ unit: fc.constantFrom('0', '1', '9', '.', 'e', 'E', 'd', 'D', '+', '-', 'x', ' ', 'n'), maxLength: 12 }), (s) => {
        const ref = NUMBER_SYNTAX.test(s) ? (/[dD]/.test(s) ? 2 : 1) : 0;
        expect(scanNumber(s)).toBe(ref);
      }),
      { numRuns: 3000 },
    );
  });
});

describe('fastDecimal(s) against Number(s)', () => {
  it('gives exactly Number(s) for random decimal strings', () => {
    // Property test against the slow obvious version; Clinger 1990 says they must agree bit for bit.
    const decimal = fc
      .tuple(
        fc.constantFrom('', '+', '-'),
        fc.string({ unit: fc.constantFrom('0', '1', '2', '3', '4', '5', '6', '7', '8', '9'), minLength: 1, maxLength: 20 }),
        fc.option(fc.string({ unit: fc.constantFrom('0', '3', '5', '7', '9'), maxLength: 20 })),
        fc.option(fc.tuple(fc.constantFrom('e', 'E'), fc.constantFrom('', '+', '-'), fc.integer({ min: 0, max: 330 }))),
      )
      .map(([sign, int, frac, exp]) => `${sign}${int}${frac === null ? '' : `.${frac}`}${exp === null ? '' : `${exp[0]}${exp[1]}${exp[2]}`}`);
    fc.assert(
      fc.property(decimal, (s) => {
        expect(Object.is(fastDecimal(s), Number(s)), s).toBe(true);
      }),
      { numRuns: 5000 },
    );
  });
  it('agrees on survey-like values and edge cases', () => {
    for (const s of ['3803.6448', '-4.220672', '0.01550467', '1e-17', '-0', '0.1', '9007199254740993', '1e23', '123456789012345.6', '.5', '5.']) {
      expect(Object.is(fastDecimal(s), Number(s)), s).toBe(true);
    }
  });
});
