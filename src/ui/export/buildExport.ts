/**
 * The catalogue from the browser: the same rows and writers (src/core/table)
 * as the command line, with review and derived columns added. Results are
 * read from the database one at a time, so a large batch does not sit in
 * memory all at once.
 */
import type { CosmologyParams, FitResult, ReviewDecision } from '../../core/types';
import {
  CATALOGUE_COLUMNS,
  catalogueRow,
  formatCell,
  catalogueCsv,
  catalogueJsonText,
  catalogueVotable,
  catalogueFits,
  type ColumnDef,
  type ExportMeta,
  type TableRow,
} from '../../core/table';
import { SOFTWARE_VERSION } from '../version';
import { ENGINE_VERSION } from '../../core/engine/version';
import { FLAGS, flagsCell } from '../review/flags';

/**
 * Review columns the core catalogue row does not carry yet: the named line
 * and the review flags. They sit beside the review columns they belong to.
 */
export const LINE_COLUMNS: readonly ColumnDef[] = [
  {
    name: 'line_id',
    unit: '',
    type: 'text',
    group: 'review',
    description: "Catalogue line the reviewer named (how_set = line: final_z is that line's own redshift; refit: the refit started there)",
  },
  {
    name: 'line_observed_a',
    unit: 'Angstrom',
    type: 'float',
    decimals: 3,
    group: 'review',
    ucd: 'em.wl',
    description: 'Observed vacuum wavelength of the named line (fitted centre of the feature)',
  },
];
export const FLAG_COLUMNS: readonly ColumnDef[] = [
  {
    name: 'review_flags',
    unit: '',
    type: 'text',
    group: 'review',
    ucd: 'meta.code',
    description: `Problems the reviewer marked, ';'-separated: ${FLAGS.map((f) => `${f.id} (${f.label})`).join(', ')}`,
  },
];

/** The browser catalogue's columns: the core catalogue with the line columns after how_set and the flags after note. */
export const EXPORT_COLUMNS: readonly ColumnDef[] = CATALOGUE_COLUMNS.flatMap((c) =>
  c.name === 'how_set' ? [c, ...LINE_COLUMNS] : c.name === 'note' ? [c, ...FLAG_COLUMNS] : [c],
);

/** The UI's review cells of one row (empty when unreviewed). */
export function reviewExtraCells(decision: ReviewDecision | undefined): Record<string, string> {
  const decided = !!decision && decision.state !== 'unreviewed';
  const line = decided && decision.z !== null ? decision.lineId : undefined;
  return {
    line_id: formatCell(LINE_COLUMNS[0], line?.id),
    line_observed_a: formatCell(LINE_COLUMNS[1], line?.observedA),
    review_flags: decided ? flagsCell(decision) : '',
  };
}

export type ExportFormat = 'csv' | 'csv-plain' | 'json' | 'fits' | 'votable';

export const EXPORT_FORMATS: readonly { id: ExportFormat; label: string; ext: string; mime: string }[] = [
  { id: 'csv', label: 'CSV with a header block (provenance and cosmology as # lines)', ext: 'csv', mime: 'text/csv' },
  { id: 'csv-plain', label: 'CSV, column names only (RFC 4180, for strict readers)', ext: 'csv', mime: 'text/csv' },
  { id: 'json', label: 'JSON', ext: 'json', mime: 'application/json' },
  { id: 'fits', label: 'FITS binary table', ext: 'fits', mime: 'application/fits' },
  { id: 'votable', label: 'VOTable 1.4', ext: 'vot', mime: 'application/x-votable+xml' },
];

export type ExportScope = 'all' | 'reviewed';

export interface ExportSource {
  /** File keys in batch order with their decisions. */
  rows: readonly { key: string; decision?: ReviewDecision }[];
  getResult: (key: string) => Promise<FitResult | undefined>;
}

export interface BuiltExport {
  data: string | Uint8Array;
  rowCount: number;
  /** Files left out because they have no fit yet. */
  notFitted: number;
}

export async function buildExport(
  source: ExportSource,
  format: ExportFormat,
  cosmology: CosmologyParams,
  scope: ExportScope = 'all',
  createdAt = new Date().toISOString(),
): Promise<BuiltExport> {
  const rows: TableRow[] = [];
  let notFitted = 0;
  let templateSet = '';
  for (const r of source.rows) {
    if (scope === 'reviewed' && (!r.decision || r.decision.state === 'unreviewed')) continue;
    const result = await source.getResult(r.key);
    if (!result) {
      notFitted++;
      continue;
    }
    if (!templateSet && result.status === 'ok') templateSet = result.templateSet;
    rows.push({ ...catalogueRow(result, r.decision, cosmology), ...reviewExtraCells(r.decision) });
  }
  const meta: ExportMeta = { software: 'Shiftmark', version: SOFTWARE_VERSION, templateSet: templateSet || 'none (no spectrum fitted)', cosmology, createdAt, extra: { engine: ENGINE_VERSION } };
  const cols = EXPORT_COLUMNS;
  let data: string | Uint8Array;
  switch (format) {
    case 'csv':
      data = catalogueCsv(rows, cols, meta, { headerBlock: true });
      break;
    case 'csv-plain':
      data = catalogueCsv(rows, cols, meta, { headerBlock: false });
      break;
    case 'json':
      data = catalogueJsonText(rows, cols, meta);
      break;
    case 'fits':
      data = catalogueFits(rows, cols, meta);
      break;
    case 'votable':
      data = catalogueVotable(rows, cols, meta);
      break;
  }
  return { data, rowCount: rows.length, notFitted };
}
