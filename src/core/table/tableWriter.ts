import { AUTOMATIC_COLUMNS, type ColumnDef } from './columns';
import { csvWriter, type CsvOptions, type TableWriter } from './csv';
import { jsonWriter } from './json';
import type { ExportMeta } from './meta';

/** Formats that can be written row by row. (VOTable types text columns and FITS sizes them from all rows.) */
export type TableFormat = 'csv' | 'json';

export interface TableWriterOptions extends ExportMeta, CsvOptions {
  /** Columns to write; default AUTOMATIC_COLUMNS (the command-line table). */
  columns?: readonly ColumnDef[];
  /** JSON: nest each row's line table (row(row, lines)) as a `lines` array. */
  lines?: boolean;
}

/** A row-by-row writer for a batch table: begin(), row() per row in order, end(). */
export function catalogueTableWriter(format: TableFormat, options: TableWriterOptions): TableWriter {
  const { columns = AUTOMATIC_COLUMNS, headerBlock, lines, ...meta } = options;
  switch (format) {
    case 'csv':
      return csvWriter(columns, meta, { headerBlock });
    case 'json':
      return jsonWriter(columns, meta, { lines });
    default:
      throw new RangeError(`unknown table format '${format as string}': use csv or json`);
  }
}
