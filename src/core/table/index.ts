export {
  CATALOGUE_COLUMNS,
  AUTOMATIC_COLUMNS,
  columnByName,
  type ColumnDef,
  type ColumnType,
  type ColumnGroup,
  type ColumnName,
  type TableRow,
} from './columns';
export { formatCell, cellValue, type CellValue } from './formatCell';
export { exportCaution, metaEntries, type ExportMeta } from './meta';
export { automaticRow, catalogueRow } from './rows';
export {
  catalogueCsv,
  csvWriter,
  parseCatalogueCsv,
  guardCell,
  quoteCsv,
  csvRecord,
  CatalogueParseError,
  type CsvOptions,
  type ParsedCatalogue,
  type TableWriter,
} from './csv';
export { catalogueJson, catalogueJsonText, jsonWriter, type CatalogueJson, type JsonOptions } from './json';
export { LINE_COLUMNS, lineRows } from './lines';
export { catalogueTableWriter, type TableFormat, type TableWriterOptions } from './tableWriter';
export { catalogueVotable, xmlEscape } from './votable';
export { catalogueFits, FITS_INT_NULL } from './fitsTable';
