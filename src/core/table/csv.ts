/**
 * CSV export and import of the catalogue.
 *
 * Cells are quoted and read by d3-dsv (csvFormatRow, csvParseRows); this
 * module adds what a catalogue needs on top: CRLF record ends, the '#' header
 * block, the formula guard, and a strict check of the quoting with line numbers.
 *
 * Writing follows RFC 4180 (Shafranovich 2005): CRLF line ends; a cell holding
 * a comma, double quote, CR or LF is enclosed in double quotes with inner quotes
 * doubled (d3-dsv quotes exactly these). Before the column-name row comes an optional block of '#' comment
 * lines (provenance and the caution); RFC 4180 has no comments, so callers
 * whose readers choke on them turn the block off.
 *
 * Formula guard (OWASP "CSV injection" advice, common practice): a spreadsheet
 * runs a cell that starts with = + - @ TAB or CR as a formula. Such text cells
 * get a leading apostrophe, which spreadsheets hide. The guard is applied to
 * text only: a number this module wrote into a numeric column (e.g. z = -0.000120)
 * passes untouched. A numeric cell that is not a plain number is treated as text.
 * Text that already starts with an apostrophe gets one more, so that reading
 * back (strip one leading apostrophe) is lossless.
 */
import { csvFormatRow, csvFormatValue, csvParseRows } from 'd3-dsv';
import type { ColumnDef, TableRow } from './columns';
import { isPlainValue } from './formatCell';
import { metaEntries, type ExportMeta } from './meta';

const FORMULA_START = /^[=+\-@\t\r']/;

/** Neutralise a cell a spreadsheet could run as a formula (see module comment). */
export function guardCell(col: ColumnDef | undefined, cell: string): string {
  if (cell === '' || isPlainValue(col, cell)) return cell;
  return FORMULA_START.test(cell) ? `'${cell}` : cell;
}

/** RFC 4180 quoting: enclose in double quotes when needed, doubling inner quotes. */
export function quoteCsv(cell: string): string {
  return csvFormatValue(cell);
}

/** One CSV record: the cells, quoted where needed, comma-separated, ended with CRLF (RFC 4180 sec. 2 rules 1-2). */
export function csvRecord(cells: readonly string[]): string {
  return csvFormatRow(cells) + '\r\n';
}

export interface CsvOptions {
  /** Write the '#' comment block before the column names (default true). */
  headerBlock?: boolean;
}

/**
 * Text pieces of a table written row by row: begin() + row()... + end() is the
 * whole file. `lines` are the row's line-table rows (lines.ts); a format that
 * nests them (JSON with lines) writes them, the others ignore them.
 */
export interface TableWriter {
  begin(): string;
  row(row: Readonly<Record<string, unknown>>, lines?: readonly Readonly<Record<string, unknown>>[]): string;
  end(): string;
}

/**
 * A row's cell for a column: rows are pre-formatted strings (rows.ts); a missing
 * cell is empty; anything else is a caller's bug and throws.
 */
export function rowCell(row: Readonly<Record<string, unknown>>, name: string): string {
  const v = row[name];
  if (v === undefined || v === null) return '';
  if (typeof v !== 'string') throw new TypeError(`cell ${name} must be a formatted string, got ${typeof v}`);
  return v;
}

/** CSV written row by row, for batches too large to hold (same bytes as catalogueCsv). */
export function csvWriter(columns: readonly ColumnDef[], meta: ExportMeta, options: CsvOptions = {}): TableWriter {
  return {
    begin() {
      let text = '';
      if (options.headerBlock ?? true) {
        for (const [k, v] of metaEntries(meta, columns)) text += `# ${k}: ${v}\r\n`;
      }
      return text + csvRecord(columns.map((c) => c.name));
    },
    row(row) {
      return csvRecord(columns.map((c) => guardCell(c, rowCell(row, c.name))));
    },
    end() {
      return '';
    },
  };
}

/** The catalogue as CSV text: optional comment block, column names, one line per row, CRLF. */
export function catalogueCsv(rows: readonly TableRow[], columns: readonly ColumnDef[], meta: ExportMeta, options: CsvOptions = {}): string {
  const w = csvWriter(columns, meta, options);
  return w.begin() + rows.map((r) => w.row(r)).join('') + w.end();
}

/** A CSV that cannot be read back as a catalogue. */
export class CatalogueParseError extends Error {
  /** 1-based line number where the problem sits. */
  readonly line: number;
  constructor(line: number, reason: string) {
    super(`line ${line}: ${reason}`);
    this.name = 'CatalogueParseError';
    this.line = line;
  }
}

export interface ParsedCatalogue {
  /** The '# key: value' lines of the header block (empty when there was none). */
  meta: Record<string, string>;
  /** Column names in file order. */
  columns: string[];
  rows: TableRow[];
}

/**
 * Read a catalogue CSV back (e.g. to merge the tables of several shards).
 * Accepts CRLF, LF or CR line ends, a leading byte-order mark and a leading '#'
 * block; undoes the formula guard. Throws CatalogueParseError on an unclosed
 * quote, text after a closing quote, a row whose cell count differs from the
 * column names, or a repeated column name.
 */
export function parseCatalogueCsv(text: string): ParsedCatalogue {
  let pos = text.charCodeAt(0) === 0xfeff ? 1 : 0;
  let line = 1;
  const meta: Record<string, string> = {};
  // Comment block: whole lines starting with '#', before the column names only.
  while (pos < text.length && text[pos] === '#') {
    const end = lineEnd(text, pos);
    const body = text.slice(pos + 1, end).trim();
    const colon = body.indexOf(':');
    if (colon > 0) meta[body.slice(0, colon).trim()] = body.slice(colon + 1).trim();
    pos = skipBreak(text, end);
    line++;
  }
  const body = text.slice(pos);
  checkQuoting(body, line);
  const records: Array<{ line: number; cells: string[] }> = [];
  for (const cells of csvParseRows(body)) {
    if (!(cells.length === 1 && cells[0] === '')) records.push({ line, cells }); // skip blank lines
    line += 1 + cells.reduce((n, c) => n + lineBreaks(c), 0);
  }
  if (records.length === 0) throw new CatalogueParseError(line, 'no column-name row');
  const columns = records[0].cells;
  const seen = new Set<string>();
  for (const c of columns) {
    if (seen.has(c)) throw new CatalogueParseError(records[0].line, `column '${c}' appears twice`);
    seen.add(c);
  }
  const rows: TableRow[] = records.slice(1).map(({ line: at, cells }) => {
    if (cells.length !== columns.length) {
      throw new CatalogueParseError(at, `${cells.length} cells where the header names ${columns.length} columns`);
    }
    const row: Record<string, string> = {};
    columns.forEach((name, i) => {
      row[name] = unguardCell(cells[i]);
    });
    return row;
  });
  return { meta, columns, rows };
}

/** A quoted cell, inner quotes doubled (written unrolled so that a long cell costs no backtracking). */
const QUOTED_CELL = /"[^"]*(?:""[^"]*)*"/y;
/** An unquoted cell: anything up to the next comma or line end. */
const PLAIN_CELL = /[^,\r\n]*/y;

/**
 * d3-dsv reads leniently: it takes the character after a closing quote as a
 * separator, and reads an unclosed quote to the end of the text. In a
 * catalogue either means damage (e.g. a shard table cut off mid-write), so
 * the quoting is checked first (RFC 4180 sec. 2 rules 5-7), with the line.
 */
function checkQuoting(text: string, firstLine: number): void {
  let pos = 0;
  let line = firstLine;
  while (pos < text.length) {
    const cell = text[pos] === '"' ? QUOTED_CELL : PLAIN_CELL;
    cell.lastIndex = pos;
    const m = cell.exec(text);
    if (!m) throw new CatalogueParseError(line, 'quoted cell is never closed');
    line += lineBreaks(m[0]);
    pos = cell.lastIndex;
    if (pos >= text.length) return;
    const ch = text[pos];
    if (ch === ',') {
      pos++;
    } else if (ch === '\r' || ch === '\n') {
      pos = skipBreak(text, pos);
      line++;
    } else {
      throw new CatalogueParseError(line, 'text after a closing quote');
    }
  }
}

/** Line breaks (CRLF, LF or CR) inside a cell. */
function lineBreaks(cell: string): number {
  let n = 0;
  for (let i = 0; i < cell.length; i++) {
    const ch = cell.charCodeAt(i);
    if (ch === 10 || (ch === 13 && cell.charCodeAt(i + 1) !== 10)) n++;
  }
  return n;
}

/** Undo guardCell: drop the one apostrophe the writer added. */
function unguardCell(cell: string): string {
  return cell.startsWith("'") ? cell.slice(1) : cell;
}

function lineEnd(text: string, from: number): number {
  let i = from;
  while (i < text.length && text[i] !== '\r' && text[i] !== '\n') i++;
  return i;
}

function skipBreak(text: string, at: number): number {
  if (text[at] === '\r') return text[at + 1] === '\n' ? at + 2 : at + 1;
  if (text[at] === '\n') return at + 1;
  return at;
}
