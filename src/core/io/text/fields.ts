/**
 * Splitting a text line into fields and reading one field as a number.
 * Separators: comma, semicolon, or runs of spaces and tabs (which covers
 * tab-separated files without empty fields).
 */

export type Separator = ',' | ';' | 'space';

/** The separator a line uses: a comma if it has one, else a semicolon, else spaces/tabs. */
export function detectSeparator(line: string): Separator {
  if (line.includes(',')) return ',';
  if (line.includes(';')) return ';';
  return 'space';
}

/** Split a line into trimmed fields; double-quoted fields may contain the separator. */
export function splitFields(line: string, sep: Separator): string[] {
  if (line.includes('"')) return splitQuoted(line, sep);
  if (sep === 'space') {
    const t = line.trim();
    return t.length === 0 ? [] : t.split(/[ \t]+/);
  }
  const parts = line.split(sep);
  for (let i = 0; i < parts.length; i++) {
    const p = parts[i];
    // Trim only when needed: most fields have no surrounding blanks.
    if (p.length > 0 && (p.charCodeAt(0) <= 32 || p.charCodeAt(p.length - 1) <= 32)) parts[i] = p.trim();
  }
  return parts;
}

/** The slow, careful splitter for lines with double quotes (RFC 4180 quoting, "" for a quote). */
function splitQuoted(line: string, sep: Separator): string[] {
  const out: string[] = [];
  let cur = '';
  let inQuotes = false;
  let started = false; // a field has begun (for space separation)
  const isSep = (c: string) => (sep === 'space' ? c === ' ' || c === '\t' : c === sep);
  for (let i = 0; i < line.length; i++) {
    const c = line[i];
    if (inQuotes) {
      if (c === '"' && line[i + 1] === '"') {
        cur += '"';
        i++;
      } else if (c === '"') inQuotes = false;
      else cur += c;
    } else if (c === '"') {
      inQuotes = true;
      started = true;
    } else if (isSep(c)) {
      if (sep === 'space') {
        if (started) out.push(cur);
        started = false;
      } else out.push(cur.trim());
      cur = '';
    } else {
      cur += c;
      if (c !== ' ' && c !== '\t') started = true;
    }
  }
  if (sep === 'space') {
    if (started) out.push(cur);
  } else out.push(cur.trim());
  return out;
}

/** Decimal number syntax the reader accepts; the reference for scanNumber. */
export const NUMBER_SYNTAX = /^[+-]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eEdD][+-]?\d+)?$/;
const MISSING = /^(?:[+-]?nan|null|na|n\/a|--)$/i;
const INFINITE = /^[+-]?inf(?:inity)?$/i;

/**
 * Char-by-char check of NUMBER_SYNTAX (the hot path of the reader; tested
 * against the regular expression). Returns 0 = not a number, 1 = number,
 * 2 = number with a Fortran 'D' exponent.
 */
export function scanNumber(s: string): 0 | 1 | 2 {
  const n = s.length;
  let i = 0;
  let c = n > 0 ? s.charCodeAt(0) : 0;
  if (c === 43 || c === 45) c = s.charCodeAt(++i); // + -
  let digits = 0;
  while (i < n && c >= 48 && c <= 57) {
    digits++;
    c = s.charCodeAt(++i);
  }
  if (i < n && c === 46) {
    // '.'
    c = s.charCodeAt(++i);
    while (i < n && c >= 48 && c <= 57) {
      digits++;
      c = s.charCodeAt(++i);
    }
  }
  if (digits === 0) return 0;
  if (i === n) return 1;
  const fortran = c === 68 || c === 100; // D d
  if (!(fortran || c === 69 || c === 101)) return 0; // E e
  c = s.charCodeAt(++i);
  if (c === 43 || c === 45) c = s.charCodeAt(++i);
  const expStart = i;
  while (i < n && c >= 48 && c <= 57) c = s.charCodeAt(++i);
  if (i === expStart || i !== n) return 0;
  return fortran ? 2 : 1;
}

/**
 * Read one field as a number. Accepts decimal and exponent notation (also the
 * Fortran 'D' exponent), 'nan', 'inf', '-inf', and as missing values an empty
 * field, 'null', 'NA' and '--' (NaN). Returns undefined for anything else
 * (hexadecimal, words, decimal commas), so the caller can name the line.
 */
export function parseField(s: string): number | undefined {
  const kind = scanNumber(s);
  if (kind === 1) return fastDecimal(s);
  if (kind === 2) return Number(s.replace(/[dD]/, 'e'));
  if (s.length === 0 || MISSING.test(s)) return NaN;
  if (INFINITE.test(s)) return s[0] === '-' ? -Infinity : Infinity;
  const unquoted = s.length >= 2 && (s[0] === '"' || s[0] === "'") && s[s.length - 1] === s[0] ? s.slice(1, -1).trim() : null;
  return unquoted !== null ? parseField(unquoted) : undefined;
}

const POW10 = [1, 1e1, 1e2, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8, 1e9, 1e10, 1e11, 1e12, 1e13, 1e14, 1e15, 1e16, 1e17, 1e18, 1e19, 1e20, 1e21, 1e22];

/**
 * Value of a string already known to match NUMBER_SYNTAX with an 'e' exponent or
 * none. Fast path (Clinger 1990, "How to read floating point numbers accurately",
 * PLDI '90): when the decimal mantissa has at most 15 digits (< 2^53, exact) and
 * the power of ten is at most 10^22 (exact in binary64), one IEEE multiplication
 * or division is correctly rounded, so the result equals Number(s). Anything
 * else goes to Number(s), the slow obvious version it is tested against.
 */
export function fastDecimal(s: string): number {
  const n = s.length;
  let i = 0;
  let neg = false;
  let c = s.charCodeAt(0);
  if (c === 43 || c === 45) {
    neg = c === 45;
    i++;
  }
  let mant = 0;
  let digits = 0;
  let scale = 0; // decimal exponent adjustment from fraction digits
  let seenDot = false;
  for (; i < n; i++) {
    c = s.charCodeAt(i);
    if (c >= 48 && c <= 57) {
      if (digits > 0 || c !== 48) digits++;
      mant = mant * 10 + (c - 48);
      if (seenDot) scale--;
    } else if (c === 46) seenDot = true;
    else break;
  }
  let exp = 0;
  if (i < n) {
    // exponent: [eE][+-]?digits (syntax already checked)
    i++;
    let eneg = false;
    c = s.charCodeAt(i);
    if (c === 43 || c === 45) {
      eneg = c === 45;
      i++;
    }
    for (; i < n; i++) {
      exp = exp * 10 + (s.charCodeAt(i) - 48);
      if (exp > 400) return Number(s);
    }
    if (eneg) exp = -exp;
  }
  if (digits > 15) return Number(s);
  const e10 = exp + scale;
  let v: number;
  if (e10 === 0) v = mant;
  else if (e10 > 0 && e10 <= 22) v = mant * POW10[e10];
  else if (e10 < 0 && e10 >= -22) v = mant / POW10[-e10];
  else return Number(s);
  return neg ? -v : v;
}

/** True when every field reads as a number (a data row rather than a header row). */
export function allNumeric(fields: readonly string[]): boolean {
  for (const f of fields) if (parseField(f) === undefined) return false;
  return true;
}
