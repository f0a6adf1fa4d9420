import { describe, expect, it } from 'vitest';
import { cellValue, formatCell, isPlainValue } from '../../../src/core/table/formatCell';
import { columnByName } from '../../../src/core/table/columns';

const Z = columnByName('z')!;
const N = columnByName('n_pix')!;
const B = columnByName('noise_estimated')!;
const T = columnByName('note')!;

describe('formatCell(col, value)', () => {
  it('writes floats with the column\'s fixed decimals (ECMA-262 toFixed)', () => {
    expect(formatCell(Z, 2.345678912)).toBe('2.345679');
    expect(formatCell(Z, 1)).toBe('1.000000');
    expect(formatCell(Z, -0.000123)).toBe('-0.000123');
    expect(formatCell(columnByName('lum_dist_mpc')!, 46652.22297)).toBe('46652.22');
  });
  it('drops the sign of a rounded negative zero', () => {
    expect(formatCell(Z, -1e-9)).toBe('0.000000');
    expect(formatCell(Z, -0)).toBe('0.000000');
  });
  it('writes empty for null, undefined, NaN and infinities', () => {
    for (const v of [null, undefined, NaN, Infinity, -Infinity]) expect(formatCell(Z, v)).toBe('');
    expect(formatCell(N, NaN)).toBe('');
  });
  it('writes ints and booleans, and refuses the wrong type', () => {
    expect(formatCell(N, 3900)).toBe('3900');
    expect(formatCell(B, true)).toBe('true');
    expect(formatCell(B, false)).toBe('false');
    expect(() => formatCell(N, 2.5)).toThrow(/integer/);
    expect(() => formatCell(Z, '1.0')).toThrow(TypeError);
    expect(() => formatCell(B, 1)).toThrow(TypeError);
  });
  it('passes text through unchanged (guarding is the CSV writer\'s job)', () => {
    expect(formatCell(T, '=1+1')).toBe('=1+1');
  });
});

describe('isPlainValue(col, cell) and cellValue(col, cell)', () => {
  it('recognises only what the formatter writes', () => {
    expect(isPlainValue(Z, '-0.000120')).toBe(true);
    expect(isPlainValue(Z, '-2+3')).toBe(false);
    expect(isPlainValue(N, '12')).toBe(true);
    expect(isPlainValue(N, '1.5')).toBe(false);
    expect(isPlainValue(B, 'true')).toBe(true);
    expect(isPlainValue(T, '5')).toBe(false); // text is never "plain"
    expect(isPlainValue(undefined, '5')).toBe(false);
  });
  it('types cells back: numbers, booleans, null for empty, text as is', () => {
    expect(cellValue(Z, '2.345679')).toBe(2.345679);
    expect(cellValue(Z, '')).toBeNull();
    expect(cellValue(N, '3900')).toBe(3900);
    expect(cellValue(B, 'false')).toBe(false);
    expect(cellValue(T, '')).toBe('');
    expect(cellValue(undefined, 'x')).toBe('x');
  });
});
