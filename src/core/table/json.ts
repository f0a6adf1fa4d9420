import type { ColumnDef, TableRow } from './columns';
import { cellValue } from './formatCell';
import { rowCell, type TableWriter } from './csv';
import { LINE_COLUMNS } from './lines';
import { cosmologySummary, derivedNote, exportCaution, oneLine, type ExportMeta } from './meta';

export interface CatalogueJson {
  meta: {
    software: string;
    version: string;
    templateSet: string;
    cosmology: ReturnType<typeof cosmologySummary>;
    createdAt: string;
    extra?: Record<string, string>;
    caution: string;
    derived: string;
  };
  columns: Array<{ name: string; unit: string; type: string; description: string; ucd?: string }>;
  /** The columns of each row's `lines` (LINE_COLUMNS without file); present when lines were asked for. */
  lineColumns?: Array<{ name: string; unit: string; type: string; description: string; ucd?: string }>;
  /**
   * One object per row; numbers and booleans typed, null where the cell is
   * empty. With lines: `lines` holds the spectrum's line measurements, one object each.
   */
  rows: Array<Record<string, JsonCell | Array<Record<string, JsonCell>>>>;
}

type JsonCell = string | number | boolean | null;

/** The line columns nested in a JSON row: the row already names the file. */
const NESTED_LINE_COLUMNS = LINE_COLUMNS.filter((c) => c.name !== 'file');

export interface JsonOptions {
  /** Give every row a `lines` array (the line table of that spectrum) and list lineColumns. */
  lines?: boolean;
}

function jsonMeta(meta: ExportMeta, columns: readonly ColumnDef[]): CatalogueJson['meta'] {
  return {
    software: oneLine(meta.software),
    version: oneLine(meta.version),
    templateSet: oneLine(meta.templateSet),
    cosmology: cosmologySummary(meta.cosmology),
    createdAt: oneLine(meta.createdAt),
    ...(meta.extra ? { extra: { ...meta.extra } } : {}),
    caution: exportCaution(columns),
    derived: derivedNote(columns),
  };
}

function jsonColumns(columns: readonly ColumnDef[]): CatalogueJson['columns'] {
  return columns.map((c) => ({ name: c.name, unit: c.unit, type: c.type, description: c.description, ...(c.ucd ? { ucd: c.ucd } : {}) }));
}

type AnyRow = Readonly<Record<string, unknown>>;

function typedCells(row: AnyRow, columns: readonly ColumnDef[]): Record<string, JsonCell> {
  const out: Record<string, JsonCell> = {};
  for (const c of columns) out[c.name] = cellValue(c, rowCell(row, c.name));
  return out;
}

function jsonRow(row: AnyRow, columns: readonly ColumnDef[], lines: readonly AnyRow[] | undefined): CatalogueJson['rows'][number] {
  const out: CatalogueJson['rows'][number] = typedCells(row, columns);
  if (lines) out.lines = lines.map((l) => typedCells(l, NESTED_LINE_COLUMNS));
  return out;
}

/**
 * The catalogue as a JSON-ready object: { meta, columns, rows }, plus
 * lineColumns and a `lines` array in every row when `lines` (one array of
 * line rows per catalogue row, same order) is given. Numbers are the rounded table values.
 */
export function catalogueJson(
  rows: readonly TableRow[],
  columns: readonly ColumnDef[],
  meta: ExportMeta,
  lines?: readonly (readonly TableRow[])[],
): CatalogueJson {
  checkLineCount(rows, lines);
  return {
    meta: jsonMeta(meta, columns),
    columns: jsonColumns(columns),
    ...(lines ? { lineColumns: jsonColumns(NESTED_LINE_COLUMNS) } : {}),
    rows: rows.map((r, i) => jsonRow(r, columns, lines?.[i])),
  };
}

function checkLineCount(rows: readonly unknown[], lines: readonly unknown[] | undefined): void {
  if (lines && lines.length !== rows.length) throw new RangeError(`${lines.length} line lists for ${rows.length} rows`);
}

/**
 * JSON written row by row (one compact row object per line), for batches too
 * large to hold; parses to catalogueJson of the same rows.
 */
export function jsonWriter(columns: readonly ColumnDef[], meta: ExportMeta, options: JsonOptions = {}): TableWriter {
  let n = 0;
  const indent = (s: string) => s.replace(/\n/g, '\n  ');
  return {
    begin() {
      n = 0;
      return (
        '{\n' +
        `  "meta": ${indent(JSON.stringify(jsonMeta(meta, columns), null, 2))},\n` +
        `  "columns": ${indent(JSON.stringify(jsonColumns(columns), null, 2))},\n` +
        (options.lines ? `  "lineColumns": ${indent(JSON.stringify(jsonColumns(NESTED_LINE_COLUMNS), null, 2))},\n` : '') +
        '  "rows": ['
      );
    },
    row(row, lines) {
      return (n++ === 0 ? '\n    ' : ',\n    ') + JSON.stringify(jsonRow(row, columns, options.lines ? (lines ?? []) : undefined));
    },
    end() {
      return (n === 0 ? ']' : '\n  ]') + '\n}\n';
    },
  };
}

/** The catalogue as JSON text (same bytes as jsonWriter; with lines when given, as in catalogueJson). */
export function catalogueJsonText(
  rows: readonly TableRow[],
  columns: readonly ColumnDef[],
  meta: ExportMeta,
  lines?: readonly (readonly TableRow[])[],
): string {
  checkLineCount(rows, lines);
  const w = jsonWriter(columns, meta, { lines: lines !== undefined });
  return w.begin() + rows.map((r, i) => w.row(r, lines?.[i])).join('') + w.end();
}
