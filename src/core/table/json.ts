import type { ColumnDef, TableRow } from './columns';
import { cellValue } from './formatCell';
import { cosmologySummary, derivedNote, exportCaution, oneLine, type ExportMeta } from './meta';

export interface CatalogueJson {
  meta: {
    software: string;
    version: string;
    templateSet: string;
    cosmology: ReturnType<typeof cosmologySummary>;
    createdAt: string;
    caution: string;
    derived: string;
  };
  columns: Array<{ name: string; unit: string; type: string; description: string; ucd?: string }>;
  /** One object per row; numbers and booleans typed, null where the cell is empty. */
  rows: Array<Record<string, string | number | boolean | null>>;
}

/** The catalogue as a JSON-ready object: { meta, columns, rows }. Numbers are the rounded table values. */
export function catalogueJson(rows: readonly TableRow[], columns: readonly ColumnDef[], meta: ExportMeta): CatalogueJson {
  return {
    meta: {
      software: oneLine(meta.software),
      version: oneLine(meta.version),
      templateSet: oneLine(meta.templateSet),
      cosmology: cosmologySummary(meta.cosmology),
      createdAt: oneLine(meta.createdAt),
      caution: exportCaution(columns),
      derived: derivedNote(columns),
    },
    columns: columns.map((c) => ({
      name: c.name,
      unit: c.unit,
      type: c.type,
      description: c.description,
      ...(c.ucd ? { ucd: c.ucd } : {}),
    })),
    rows: rows.map((row) => {
      const out: Record<string, string | number | boolean | null> = {};
      for (const c of columns) out[c.name] = cellValue(c, row[c.name] ?? '');
      return out;
    }),
  };
}

/** catalogueJson as text, two-space indented, with a final newline. */
export function catalogueJsonText(rows: readonly TableRow[], columns: readonly ColumnDef[], meta: ExportMeta): string {
  return JSON.stringify(catalogueJson(rows, columns, meta), null, 2) + '\n';
}
