import { describe, expect, it } from 'vitest';
import { allNumeric, detectSeparator, parseField, splitFields } from '../../../src/core/io/text/fields';

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
