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
  for (let i = 0; i < parts.length; i++) parts[i] = parts[i].trim();
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

const NUMBER = /^[+-]?(?:\d+\.?\d*|\.\d+)(?:[eEdD][+-]?\d+)?$/;
const MISSING = /^(?:[+-]?nan|null|na|n\/a|--)$/i;
const INFINITE = /^[+-]?inf(?:inity)?$/i;

/**
 * Read one field as a number. Accepts decimal and exponent notation (also the
 * Fortran 'D' exponent), 'nan', 'inf', '-inf', and as missing values an empty
 * field, 'null', 'NA' and '--' (NaN). Returns undefined for anything else
 * (hexadecimal, words, decimal commas), so the caller can name the line.
 */
export function parseField(s: string): number | undefined {
  if (NUMBER.test(s)) {
    // Fortran exponents: 1.5D+03
    return s.includes('d') || s.includes('D') ? Number(s.replace(/[dD]/, 'e')) : Number(s);
  }
  if (s.length === 0 || MISSING.test(s)) return NaN;
  if (INFINITE.test(s)) return s[0] === '-' ? -Infinity : Infinity;
  const unquoted = s.length >= 2 && (s[0] === '"' || s[0] === "'") && s[s.length - 1] === s[0] ? s.slice(1, -1).trim() : null;
  return unquoted !== null ? parseField(unquoted) : undefined;
}

/** True when every field reads as a number (a data row rather than a header row). */
export function allNumeric(fields: readonly string[]): boolean {
  for (const f of fields) if (parseField(f) === undefined) return false;
  return true;
}
