import type { ColumnDef, TableRow } from './columns';
import { cellValue } from './formatCell';
import { rowCell, type TableWriter } from './csv';
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
  /** One object per row; numbers and booleans typed, null where the cell is empty. */
  rows: Array<Record<string, string | number | boolean | null>>;
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

function jsonRow(row: Readonly<Record<string, unknown>>, columns: readonly ColumnDef[]): CatalogueJson['rows'][number] {
  const out: Record<string, string | number | boolean | null> = {};
  for (const c of columns) out[c.name] = cellValue(c, rowCell(row, c.name));
  return out;
}

/** The catalogue as a JSON-ready object: { meta, columns, rows }. Numbers are the rounded table values. */
export function catalogueJson(rows: readonly TableRow[], columns: readonly ColumnDef[], meta: ExportMeta): CatalogueJson {
  return { meta: jsonMeta(meta, columns), columns: jsonColumns(columns), rows: rows.map((r) => jsonRow(r, columns)) };
}

/**
 * JSON written row by row (one compact row object per line), for batches too
 * large to hold; parses to catalogueJson of the same rows.
 */
export function jsonWriter(columns: readonly ColumnDef[], meta: ExportMeta): TableWriter {
  let n = 0;
  const indent = (s: string) => s.replace(/\n/g, '\n  ');
  return {
    begin() {
      n = 0;
      return (
        '{\n' +
        `  "meta": ${indent(JSON.stringify(jsonMeta(meta, columns), null, 2))},\n` +
        `  "columns": ${indent(JSON.stringify(jsonColumns(columns), null, 2))},\n` +
        '  "rows": ['
      );
    },
    row(row) {
      return (n++ === 0 ? '\n    ' : ',\n    ') + JSON.stringify(jsonRow(row, columns));
    },
    end() {
      return (n === 0 ? ']' : '\n  ]') + '\n}\n';
    },
  };
}

/** The catalogue as JSON text (same bytes as jsonWriter). */
export function catalogueJsonText(rows: readonly TableRow[], columns: readonly ColumnDef[], meta: ExportMeta): string {
  const w = jsonWriter(columns, meta);
  return w.begin() + rows.map((r) => w.row(r)).join('') + w.end();
}
