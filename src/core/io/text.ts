/**
 * Reader for spectra stored as columns of text: CSV, semicolon-separated, and
 * space- or tab-separated, with or without a header row.
 *
 * Columns: wavelength, flux, then optionally an uncertainty (inverse variance,
 * 1-sigma error or variance) and a mask (non-zero = bad pixel).
 * - With a header row (or a comment line naming the columns, e.g.
 *   `# wavelength flux ivar` or `# columns: wave,flux,err`), columns are found by
 *   name and unrecognised columns are ignored.
 * - Without one, 2 to 4 columns are taken in the order wavelength, flux,
 *   1-sigma error, mask.
 * Wavelength unit (Angstrom, nm, um), medium (air or vacuum) and scale (linear,
 * log10 as in 'loglam', natural log) come from the wavelength column's name
 * (e.g. 'wavelength_air_nm', 'Wavelength [nm]') or from a comment
 * (`# wavelength: air, nm`). When nothing is stated the wavelength is taken as
 * vacuum Angstrom on a linear scale. Air wavelengths are converted to vacuum
 * (Morton 2000, ApJS 130, 403, via airToVacuumA) and meta.convertedFromAir is set.
 * Wavelengths may run in either direction: a strictly decreasing list is reversed
 * (with all columns); anything else that is not strictly monotonic is an error.
 * 'nan', 'inf', '-inf', empty fields, 'null', 'NA' and '--' are accepted and give
 * non-finite values (flux pixels then masked; a non-finite wavelength is an error).
 * Comment lines start with '#', '%' or ';'; `key: value` comments fill the metadata.
 * A '#' later on a line (after a blank, a separator or a number, outside
 * double quotes) starts a trailing comment, which is dropped: `4000 1.2 0.1 # cosmic`.
 */
import { strFromU8 } from 'fflate';
import { SpectrumReadError, type Spectrum, type SpectrumMeta } from '../types';
import { assembleSpectrum, checkPixelCount } from './assemble';
import { airToVacuumA } from './airVacuum';
import { allNumeric, detectSeparator, parseField, splitFields, type Separator } from './text/fields';
import { parseColumnName, type ColumnName, type ColumnRole, type Medium, type WavelengthScale, type WavelengthUnit } from './text/columnNames';
import { CommentError, readCommentFacts, type CommentLine } from './text/commentMeta';

/** Largest text file accepted, bytes (256 MiB: above this a browser tab cannot hold the decoded string comfortably). */
export const MAX_TEXT_BYTES = 256 * 1024 * 1024;
/** Longest line accepted, characters. A row of numbers is under 200; binary data without newlines is not. */
export const MAX_LINE_CHARS = 65_536;

const COMMENT_CHARS = new Set(['#', '%', ';']);
const UNIT_TO_ANGSTROM: Record<WavelengthUnit, number> = { angstrom: 1, nm: 10, um: 1e4 };

/** The columns the reader uses, as indices into a row's fields (-1 = absent). */
interface ColumnPlan {
  names: string[];
  wavelength: number;
  flux: number;
  uncertainty: number;
  uncertaintyKind: 'ivar' | 'error' | 'variance';
  mask: number;
  wavelengthColumn?: ColumnName;
  fluxColumn?: ColumnName;
  headerLine: number | null;
}

export function readTextSpectrum(bytes: Uint8Array, file: string): Spectrum {
  if (bytes.length === 0) throw new SpectrumReadError(file, 'empty file');
  if (bytes.length > MAX_TEXT_BYTES) {
    throw new SpectrumReadError(file, `file is ${bytes.length} bytes, more than the limit of ${MAX_TEXT_BYTES} bytes for text spectra`);
  }
  let text = strFromU8(bytes);
  if (text.charCodeAt(0) === 0xfeff) text = text.slice(1); // UTF-8 byte-order mark
  // Old Mac line ends: CR alone, no LF anywhere in the file.
  if (text.indexOf('\n') < 0 && text.indexOf('\r') >= 0) text = text.replace(/\r/g, '\n');

  // Pass 1: classify lines, count data rows, collect comments.
  const comments: CommentLine[] = [];
  let contentLines = 0;
  let first: { line: number; text: string } | null = null;
  let commentsBeforeFirst = 0;
  forEachLine(text, file, (line, lineNo) => {
    const lead = firstNonBlank(line);
    if (lead < 0) return;
    if (COMMENT_CHARS.has(line[lead])) {
      comments.push({ line: lineNo, body: line.slice(lead + 1).replace(/^[#%;]+/, '').trim() });
      return;
    }
    if (!first) {
      first = { line: lineNo, text: stripTrailingComment(line) };
      commentsBeforeFirst = comments.length;
    }
    contentLines++;
  });
  if (!first) throw new SpectrumReadError(file, 'no numeric rows (only blank or comment lines)');
  const firstLine: { line: number; text: string } = first;

  let facts;
  try {
    facts = readCommentFacts(comments);
  } catch (e) {
    if (e instanceof CommentError) throw new SpectrumReadError(file, `${e.key}: ${e.reason}`, { line: e.line });
    throw e;
  }

  // Header row or not; which column is which.
  const sep = detectSeparator(firstLine.text);
  const firstFields = splitFields(firstLine.text, sep);
  // A header row's first field is a name; a first row starting with a number is
  // data, and any text in it is reported as a bad value.
  // An empty first name is a header too (an unnamed index column, as data-frame exports write).
  const lead0 = firstFields[0] ?? '';
  const hasHeader = !allNumeric(firstFields) && (lead0 === '' || parseField(lead0) === undefined);
  let nData = contentLines;
  let plan: ColumnPlan;
  if (hasHeader) {
    nData--;
    plan = planFromNames(firstFields, firstLine.line, file);
  } else {
    const commented = commentedHeader(comments.slice(0, commentsBeforeFirst), facts.columns, firstFields.length, sep);
    plan = commented ? planFromNames(commented.names, commented.line, file) : positionalPlan(firstFields.length, firstLine.line, file);
  }
  if (nData === 0) throw new SpectrumReadError(file, 'no numeric rows after the header', { line: firstLine.line });
  checkPixelCount(file, nData);

  // Pass 2: parse the data rows.
  const nCol = plan.names.length;
  const wl = new Float64Array(nData);
  const flux = new Float64Array(nData);
  const unc = plan.uncertainty >= 0 ? new Float64Array(nData) : null;
  const mask = plan.mask >= 0 ? new Uint8Array(nData) : undefined;
  const lineOf = new Int32Array(nData);
  let row = 0;
  let seenFirst = false;
  forEachLine(text, file, (line, lineNo) => {
    const lead = firstNonBlank(line);
    if (lead < 0 || COMMENT_CHARS.has(line[lead])) return;
    if (hasHeader && !seenFirst) {
      seenFirst = true;
      return;
    }
    const fields = splitFields(stripTrailingComment(line), sep);
    if (fields.length !== nCol) {
      const expected = plan.headerLine !== null ? `the header on line ${plan.headerLine} names ${nCol}` : `the first row has ${nCol}`;
      throw new SpectrumReadError(file, `row has ${fields.length} columns but ${expected}`, { line: lineNo });
    }
    wl[row] = field(fields, plan.wavelength, plan, lineNo, file);
    flux[row] = field(fields, plan.flux, plan, lineNo, file);
    if (unc) unc[row] = field(fields, plan.uncertainty, plan, lineNo, file);
    if (mask) {
      const m = field(fields, plan.mask, plan, lineNo, file);
      mask[row] = m === 0 ? 0 : 1; // non-zero or NaN = bad
    }
    lineOf[row] = lineNo;
    row++;
  });

  // Wavelength: statement, checks with line numbers, conversion to vacuum Angstrom.
  const stated = wavelengthStatement(plan, facts.wavelength, file);
  checkWavelengthValues(wl, lineOf, plan.names[plan.wavelength], stated.scale, file);
  const reversed = nData > 1 && wl[1] < wl[0];
  checkMonotonic(wl, lineOf, reversed, file);
  toVacuumAngstrom(wl, stated);

  const ivar = unc ? toInverseVariance(unc, plan.uncertaintyKind) : null;
  const meta: SpectrumMeta = { ...facts.meta };
  if (meta.fluxUnit === undefined && plan.fluxColumn?.bracketUnit) meta.fluxUnit = plan.fluxColumn.bracketUnit;
  if (stated.medium === 'air') meta.convertedFromAir = true;
  if (reversed) {
    wl.reverse();
    flux.reverse();
    ivar?.reverse();
    mask?.reverse();
  }
  return assembleSpectrum({ file, format: 'text', wavelengthA: wl, flux, ivar, mask, meta });
}

/** Call fn for every line (1-based numbers), CR LF or LF endings, enforcing the line-length limit. */
function forEachLine(text: string, file: string, fn: (line: string, lineNo: number) => void): void {
  let start = 0;
  let lineNo = 0;
  while (start <= text.length) {
    let end = text.indexOf('\n', start);
    if (end < 0) end = text.length;
    lineNo++;
    if (end - start > MAX_LINE_CHARS) {
      throw new SpectrumReadError(file, `line is longer than ${MAX_LINE_CHARS} characters (binary data or a broken file?)`, { line: lineNo });
    }
    let stop = end;
    if (stop > start && text.charCodeAt(stop - 1) === 13) stop--; // CR of CR LF
    fn(text.slice(start, stop), lineNo);
    start = end + 1;
  }
}

/**
 * The line without a trailing `# comment`: cut at the first '#' outside double
 * quotes that follows a blank, comma, semicolon, digit or '.' (so a name like
 * 'n#obs' or '"flux #2"' is kept), then trailing blanks are dropped. A separator
 * just before the '#' stays: `4000,1,#x` has three fields, the last one empty. A line without '#' is returned as it is (the common, fast case).
 */
export function stripTrailingComment(line: string): string {
  const first = line.indexOf('#');
  if (first < 0) return line;
  let inQuotes = false;
  for (let i = 0; i < line.length; i++) {
    const c = line.charCodeAt(i);
    if (c === 34) inQuotes = !inQuotes; // '"' ('""' inside quotes toggles twice: no change)
    else if (c === 35 && !inQuotes && i >= first) {
      const prev = i === 0 ? 32 : line.charCodeAt(i - 1);
      const afterNumber = (prev >= 48 && prev <= 57) || prev === 46; // '1.5#note': no number holds a '#'
      if (afterNumber || prev === 32 || prev === 9 || prev === 44 || prev === 59) return line.slice(0, i).trimEnd();
    }
  }
  return line;
}

function firstNonBlank(line: string): number {
  for (let i = 0; i < line.length; i++) {
    const c = line.charCodeAt(i);
    if (c !== 32 && c !== 9 && c !== 13 && c !== 0xfeff) return i;
  }
  return -1;
}

function field(fields: string[], col: number, plan: ColumnPlan, lineNo: number, file: string): number {
  const v = parseField(fields[col]);
  if (v === undefined) {
    // '4000,5' (split on ';' or spaces) or '5\t1' (split on ','): numbers written with a decimal comma.
    const comma = /^[+-]?\d+,\d+$/.test(fields[col]) || /\d[\t;]\s*\d/.test(fields[col]);
    const hint = comma ? ' (a decimal comma? numbers must use a decimal point)' : '';
    throw new SpectrumReadError(file, `'${clip(fields[col])}' is not a number${hint}`, { line: lineNo, column: plan.names[col] });
  }
  return v;
}

function clip(s: string): string {
  return s.length > 40 ? `${s.slice(0, 40)}...` : s;
}

/** Columns from header names: wavelength and flux required; unknown names ignored. */
function planFromNames(names: string[], line: number, file: string): ColumnPlan {
  const parsed = names.map(parseColumnName);
  const byRole = (role: ColumnRole) => parsed.map((c, i) => (c.role === role ? i : -1)).filter((i) => i >= 0);
  const one = (role: ColumnRole, label: string): number => {
    const idx = byRole(role);
    if (idx.length > 1) {
      throw new SpectrumReadError(file, `the header has ${idx.length} ${label} columns (${idx.map((i) => `'${parsed[i].raw}'`).join(', ')}); keep one`, { line });
    }
    return idx.length ? idx[0] : -1;
  };
  const listed = parsed.map((c) => `'${c.raw}'`).join(', ');
  const wavelength = one('wavelength', 'wavelength');
  if (wavelength < 0) {
    throw new SpectrumReadError(file, `the header (${listed}) names no wavelength column; expected a name like wavelength, wave, lambda or loglam`, { line });
  }
  const flux = one('flux', 'flux');
  if (flux < 0) throw new SpectrumReadError(file, `the header (${listed}) names no flux column`, { line });
  // One uncertainty: inverse variance preferred, then error, then variance.
  let uncertainty = -1;
  let uncertaintyKind: ColumnPlan['uncertaintyKind'] = 'ivar';
  for (const kind of ['ivar', 'error', 'variance'] as const) {
    const i = one(kind, kind === 'ivar' ? 'inverse-variance' : kind);
    if (i >= 0 && uncertainty < 0) {
      uncertainty = i;
      uncertaintyKind = kind;
    }
  }
  // Masks: an AND mask (bad in every exposure) is preferred; otherwise the first.
  const masks = byRole('mask');
  const mask = masks.find((i) => parsed[i].andMask) ?? (masks.length ? masks[0] : -1);
  return {
    names: parsed.map((c) => c.raw),
    wavelength,
    flux,
    uncertainty,
    uncertaintyKind,
    mask,
    wavelengthColumn: parsed[wavelength],
    fluxColumn: parsed[flux],
    headerLine: line,
  };
}

/** Columns by position when there is no header: wavelength, flux, error, mask. */
function positionalPlan(nCol: number, line: number, file: string): ColumnPlan {
  if (nCol < 2) throw new SpectrumReadError(file, 'only one column; a spectrum needs at least wavelength and flux', { line });
  if (nCol > 4) {
    throw new SpectrumReadError(file, `${nCol} columns and no header row naming them; without a header expect 2 to 4 columns (wavelength, flux, error, mask)`, { line });
  }
  const names = ['wavelength', 'flux', 'error', 'mask'].slice(0, nCol);
  return { names, wavelength: 0, flux: 1, uncertainty: nCol >= 3 ? 2 : -1, uncertaintyKind: 'error', mask: nCol >= 4 ? 3 : -1, headerLine: null };
}

/**
 * Column names given in a comment: an explicit `columns: ...` line, or the last
 * comment line before the data if it splits into as many names as the data has
 * columns and names a wavelength and a flux column.
 */
function commentedHeader(
  before: CommentLine[],
  columns: { line: number; names: string } | undefined,
  nCol: number,
  sep: Separator,
): { line: number; names: string[] } | null {
  const split = (s: string) => {
    const a = splitFields(s, sep);
    return a.length === nCol ? a : splitFields(s, detectSeparator(s));
  };
  if (columns) return { line: columns.line, names: split(columns.names) };
  const last = before[before.length - 1];
  if (!last) return null;
  const names = split(last.body);
  if (names.length !== nCol) return null;
  const roles = names.map((n) => parseColumnName(n).role);
  return roles.includes('wavelength') && roles.includes('flux') ? { line: last.line, names } : null;
}

interface WavelengthStatement {
  unit: WavelengthUnit;
  medium: Medium;
  scale: WavelengthScale;
}

/** Unit, medium and scale from the column name and comments; contradictions are errors. */
function wavelengthStatement(plan: ColumnPlan, statements: { line: number; unit?: WavelengthUnit; medium?: Medium; scale?: WavelengthScale }[], file: string): WavelengthStatement {
  const col = plan.wavelengthColumn;
  const sources: { line: number; unit?: WavelengthUnit; medium?: Medium; scale?: WavelengthScale; from: string }[] = [];
  if (col) sources.push({ line: plan.headerLine ?? 0, unit: col.unit, medium: col.medium, scale: col.scale, from: `column '${col.raw}'` });
  for (const s of statements) sources.push({ ...s, from: `line ${s.line}` });
  const pick = <K extends 'unit' | 'medium' | 'scale'>(key: K): WavelengthStatement[K] | undefined => {
    let found: { value: WavelengthStatement[K]; from: string } | undefined;
    for (const s of sources) {
      const v = s[key] as WavelengthStatement[K] | undefined;
      if (v === undefined) continue;
      if (found && found.value !== v) {
        throw new SpectrumReadError(file, `wavelength ${key} stated twice and differently: ${found.value} (${found.from}) and ${v} (${s.from})`, { line: s.line || undefined });
      }
      found ??= { value: v, from: s.from };
    }
    return found?.value;
  };
  return { unit: pick('unit') ?? 'angstrom', medium: pick('medium') ?? 'vacuum', scale: pick('scale') ?? 'linear' };
}

function checkWavelengthValues(wl: Float64Array, lineOf: Int32Array, column: string, scale: WavelengthScale, file: string): void {
  for (let i = 0; i < wl.length; i++) {
    if (!Number.isFinite(wl[i])) {
      throw new SpectrumReadError(file, `wavelength must be a finite number, got ${wl[i]}`, { line: lineOf[i], column });
    }
    if (scale === 'linear' && wl[i] <= 0) {
      throw new SpectrumReadError(file, `wavelength must be positive, got ${wl[i]}`, { line: lineOf[i], column });
    }
  }
}

/** Strictly increasing, or strictly decreasing when `descending`; the error names both lines. */
function checkMonotonic(wl: Float64Array, lineOf: Int32Array, descending: boolean, file: string): void {
  for (let i = 1; i < wl.length; i++) {
    const ok = descending ? wl[i] < wl[i - 1] : wl[i] > wl[i - 1];
    if (!ok) {
      const how = wl[i] === wl[i - 1] ? 'repeats' : descending ? 'goes up again' : 'goes down';
      throw new SpectrumReadError(
        file,
        `wavelength ${how} (${wl[i - 1]} on line ${lineOf[i - 1]}, then ${wl[i]}); wavelengths must be strictly increasing or strictly decreasing`,
        { line: lineOf[i] },
      );
    }
  }
}

/** In place: undo the log scale, convert the unit to Angstrom, air to vacuum. */
function toVacuumAngstrom(wl: Float64Array, s: WavelengthStatement): void {
  const toA = UNIT_TO_ANGSTROM[s.unit];
  for (let i = 0; i < wl.length; i++) {
    let v = s.scale === 'log10' ? 10 ** wl[i] : s.scale === 'ln' ? Math.exp(wl[i]) : wl[i];
    v *= toA;
    wl[i] = s.medium === 'air' ? airToVacuumA(v) : v;
  }
}

/** Inverse variance from the file's uncertainty; non-positive or non-finite errors give 0 (no information). */
function toInverseVariance(u: Float64Array, kind: ColumnPlan['uncertaintyKind']): Float64Array {
  if (kind === 'ivar') return u;
  for (let i = 0; i < u.length; i++) {
    const x = u[i];
    const variance = kind === 'error' ? x * x : x;
    u[i] = x > 0 && Number.isFinite(x) ? 1 / variance : 0;
  }
  return u;
}
