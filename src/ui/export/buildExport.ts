/**
 * The catalogue from the browser: the same rows, columns and writers
 * (src/core/table) as the command line, with the review columns filled. Results are
 * read from the database one at a time, so a large batch does not sit in
 * memory all at once.
 */
import type { CosmologyParams, FitResult, ReviewDecision } from '../../core/types';
import {
  CATALOGUE_COLUMNS,
  LINE_COLUMNS,
  catalogueRow,
  lineRows,
  catalogueCsv,
  catalogueJsonText,
  catalogueVotable,
  catalogueFits,
  type ExportMeta,
  type TableRow,
} from '../../core/table';
import { SOFTWARE_VERSION } from '../version';
import { TEAM_META_KEY } from '../../core/team/fromCatalogue';
import type { TeamTag } from '../../core/team/teamTag';
import { ENGINE_VERSION } from '../../core/engine/version';
import { decisionWithPhysics, withDecisionPhysics } from '../../core/physics/rowValues';
import { measureMissingPhysics, type QuasarMeasurer } from './measureMissing';

export type ExportFormat = 'csv' | 'csv-plain' | 'json' | 'fits' | 'votable' | 'lines-csv';

export const EXPORT_FORMATS: readonly { id: ExportFormat; label: string; ext: string; mime: string }[] = [
  { id: 'csv', label: 'CSV with a header block (provenance and cosmology as # lines)', ext: 'csv', mime: 'text/csv' },
  { id: 'csv-plain', label: 'CSV, column names only (RFC 4180, for strict readers)', ext: 'csv', mime: 'text/csv' },
  { id: 'json', label: 'JSON (with each spectrum\'s line measurements)', ext: 'json', mime: 'application/json' },
  { id: 'fits', label: 'FITS binary table (line measurements in a second table, LINES)', ext: 'fits', mime: 'application/fits' },
  { id: 'votable', label: 'VOTable 1.4 (line measurements in a second table)', ext: 'vot', mime: 'application/x-votable+xml' },
  { id: 'lines-csv', label: 'Line measurements CSV (one row per spectrum and line)', ext: 'csv', mime: 'text/csv' },
];

export type ExportScope = 'all' | 'reviewed';

export interface ExportSource {
  /** File keys in batch order with their decisions. */
  rows: readonly { key: string; decision?: ReviewDecision }[];
  getResult: (key: string) => Promise<FitResult | undefined>;
  /** The review packet the batch came from: CSV and JSON exports carry it, so a team merge can take them. */
  team?: TeamTag | null;
  /** Measures quasar decisions nobody measured at their z (measureMissing.ts); without it their cells stay empty with a note. */
  measureQuasar?: QuasarMeasurer;
  /** Progress of those measurements (called after each batch; not at all when none is needed). */
  onMeasureProgress?: (done: number, total: number) => void;
}

export interface BuiltExport {
  data: string | Uint8Array;
  /** Catalogue rows (spectra) in the export. */
  rowCount: number;
  /** Line-table rows in the export (0 for formats without them). */
  lineCount: number;
  /** Files left out because they have no fit yet. */
  notFitted: number;
  /** Quasar decisions measured for this export, and those that could not be (their cells keep the note). */
  physicsMeasured: number;
  physicsUnmeasured: number;
}

export async function buildExport(
  source: ExportSource,
  format: ExportFormat,
  cosmology: CosmologyParams,
  scope: ExportScope = 'all',
  createdAt = new Date().toISOString(),
): Promise<BuiltExport> {
  const rows: TableRow[] = [];
  /** The line-table rows of each catalogue row, same order. */
  const lines: TableRow[][] = [];
  let notFitted = 0;
  let templateSet = '';
  const missing = source.measureQuasar
    ? await measureMissingPhysics(source.rows, source.getResult, source.measureQuasar, source.onMeasureProgress)
    : { measured: new Map(), failed: 0 };
  for (const r of source.rows) {
    if (scope === 'reviewed' && (!r.decision || r.decision.state === 'unreviewed')) continue;
    const result = await source.getResult(r.key);
    if (!result) {
      notFitted++;
      continue;
    }
    if (!templateSet && result.status === 'ok') templateSet = result.templateSet;
    // A decision at a changed z brings its own quasar measurement (src/core/physics/rowValues.ts), or this export's.
    const m = missing.measured.get(r.key);
    const decision = m && r.decision ? decisionWithPhysics(r.decision, m) : r.decision;
    rows.push(catalogueRow(withDecisionPhysics(result, decision), decision, cosmology));
    lines.push(lineRows(result));
  }
  const meta: ExportMeta = { software: 'Shiftmark', version: SOFTWARE_VERSION, templateSet: templateSet || 'none (no spectrum fitted)', cosmology, createdAt, extra: { engine: ENGINE_VERSION } };
  // The packet rides in the CSV header block and the JSON meta only (a FITS card or VOTable INFO is no place for it).
  if (source.team && (format === 'csv' || format === 'json')) meta.extra = { ...meta.extra, [TEAM_META_KEY]: JSON.stringify(source.team) };
  const cols = CATALOGUE_COLUMNS;
  let data: string | Uint8Array;
  let lineCount = 0;
  const flat = () => {
    const all = lines.flat();
    lineCount = all.length;
    return all;
  };
  switch (format) {
    case 'csv':
      data = catalogueCsv(rows, cols, meta, { headerBlock: true });
      break;
    case 'csv-plain':
      data = catalogueCsv(rows, cols, meta, { headerBlock: false });
      break;
    case 'json':
      data = catalogueJsonText(rows, cols, meta, lines);
      lineCount = lines.reduce((n, l) => n + l.length, 0);
      break;
    case 'fits':
      data = catalogueFits(rows, cols, meta, flat());
      break;
    case 'lines-csv':
      data = catalogueCsv(flat(), LINE_COLUMNS, meta, { headerBlock: true });
      break;
    case 'votable':
      data = catalogueVotable(rows, cols, meta, flat());
      break;
  }
  return { data, rowCount: rows.length, lineCount, notFitted, physicsMeasured: missing.measured.size, physicsUnmeasured: missing.failed };
}
