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
export { catalogueCsv, parseCatalogueCsv, guardCell, quoteCsv, CatalogueParseError, type CsvOptions, type ParsedCatalogue } from './csv';
export { catalogueJson, catalogueJsonText, type CatalogueJson } from './json';
export { catalogueVotable, xmlEscape } from './votable';
export { catalogueFits, FITS_INT_NULL } from './fitsTable';
