import type { ColumnDef } from './columns';

/** A value before formatting; null/undefined/NaN/Infinity become an empty cell. */
export type CellValue = string | number | boolean | null | undefined;

/**
 * Format one value for its column. Floats use a fixed number of decimals
 * (Number.prototype.toFixed is exactly specified by ECMA-262, so Node and every
 * browser give the same bytes); a rounded negative zero is written without its
 * sign. Non-finite numbers give '' (no value), never 'NaN' or 'Infinity'.
 */
export function formatCell(col: ColumnDef, v: CellValue): string {
  if (v === null || v === undefined) return '';
  switch (col.type) {
    case 'text':
      return String(v);
    case 'bool':
      if (typeof v !== 'boolean') throw new TypeError(`column ${col.name} wants a boolean, got ${typeof v}`);
      return v ? 'true' : 'false';
    case 'int':
      if (typeof v !== 'number') throw new TypeError(`column ${col.name} wants a number, got ${typeof v}`);
      if (!Number.isFinite(v)) return '';
      if (!Number.isInteger(v)) throw new RangeError(`column ${col.name} wants an integer, got ${v}`);
      return String(v);
    case 'float': {
      if (typeof v !== 'number') throw new TypeError(`column ${col.name} wants a number, got ${typeof v}`);
      if (!Number.isFinite(v)) return '';
      if (col.significant !== undefined) return v === 0 ? (0).toExponential(col.significant - 1) : v.toExponential(col.significant - 1);
      const d = col.decimals ?? 6;
      // toFixed switches to exponent notation at 1e21; no catalogue quantity comes near.
      const s = Math.abs(v) < 1e21 ? v.toFixed(d) : v.toExponential(d);
      return /^-0(\.0*)?$/.test(s) ? s.slice(1) : s;
    }
  }
}

/** True when a cell is a value its numeric/bool column could have produced. */
export function isPlainValue(col: ColumnDef | undefined, cell: string): boolean {
  if (!col) return false;
  switch (col.type) {
    case 'float':
      return /^-?\d+(\.\d+)?(e[+-]\d+)?$/.test(cell);
    case 'int':
      return /^-?\d+$/.test(cell);
    case 'bool':
      return cell === 'true' || cell === 'false';
    default:
      return false;
  }
}

/**
 * A formatted cell back to a typed value: float/int -> number, bool -> boolean,
 * '' -> null for those; text (and unknown columns) stay strings.
 */
export function cellValue(col: ColumnDef | undefined, cell: string): string | number | boolean | null {
  if (!col || col.type === 'text') return cell;
  if (cell === '') return null;
  if (col.type === 'bool') return cell === 'true';
  const v = Number(cell);
  return Number.isFinite(v) ? v : null;
}
