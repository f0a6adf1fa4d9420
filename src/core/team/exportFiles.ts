/**
 * The files a team review exports, the same from the browser and the command
 * line: the final catalogue, the long table of every verdict (same format),
 * and the agreement report as text.
 */
import type { CosmologyParams, FitResult } from '../types';
import { catalogueCsv } from '../table/csv';
import { catalogueJsonText } from '../table/json';
import { catalogueFits } from '../table/fitsTable';
import type { ExportMeta } from '../table/meta';
import { VERDICT_COLUMNS } from '../table/teamColumns';
import type { AgreementRule } from './agreement';
import { consensusOf, type Settlement } from './consensus';
import type { MergedBatch } from './merge';
import { teamReportText } from './report';
import { teamStatistics, type TeamStatistics } from './statistics';
import { FINAL_COLUMNS, finalCatalogueRows, verdictRows } from './tables';

export type TeamFormat = 'csv' | 'json' | 'fits';
export const TEAM_FORMATS: readonly TeamFormat[] = ['csv', 'json', 'fits'];

export interface TeamExportInput {
  merged: MergedBatch;
  settlements: readonly Settlement[];
  rule: AgreementRule;
  resultOf: (id: string) => FitResult | undefined;
  cosmology: CosmologyParams;
  /** Software name and version, e.g. 'Shiftmark 0.1.0'. */
  software: string;
  version: string;
  createdAt: string;
}

export interface TeamExport {
  final: string | Uint8Array;
  verdicts: string | Uint8Array;
  report: string;
  stats: TeamStatistics;
  finalRows: number;
  verdictRows: number;
}

export function buildTeamExport(input: TeamExportInput, format: TeamFormat): TeamExport {
  const { merged, settlements, rule, cosmology } = input;
  const consensus = consensusOf(merged, settlements, rule);
  const stats = teamStatistics(merged, consensus, rule);
  const finalRows = finalCatalogueRows(merged, consensus, input.resultOf, cosmology);
  const allVerdicts = verdictRows(merged, consensus, settlements);
  const templateSet = merged.spectra.map((s) => input.resultOf(s.id)).find((r) => r && r.status === 'ok')?.templateSet ?? 'none (no fit in the merged files)';
  const meta: ExportMeta = {
    software: input.software,
    version: input.version,
    templateSet,
    cosmology,
    createdAt: input.createdAt,
    extra: {
      batch_id: merged.batchId,
      agreement_tolerance: String(rule.tolerance),
      reviewers: [...new Set(merged.verdicts.map((v) => v.reviewer))].sort().join(';'),
      merged_files: merged.sources.map((s) => s.name).join(';'),
    },
  };
  const write = (rows: typeof finalRows, columns: typeof FINAL_COLUMNS, extname: string): string | Uint8Array => {
    switch (format) {
      case 'csv':
        return catalogueCsv(rows, columns, meta, { headerBlock: true });
      case 'json':
        return catalogueJsonText(rows, columns, meta);
      case 'fits':
        return catalogueFits(rows, columns, meta, undefined, extname);
    }
  };
  return {
    final: write(finalRows, FINAL_COLUMNS, 'CATALOGUE'),
    verdicts: write(allVerdicts, VERDICT_COLUMNS, 'VERDICTS'),
    report: teamReportText(stats, { batchId: merged.batchId, sources: merged.sources, createdAt: input.createdAt, software: `${input.software} ${input.version}` }),
    stats,
    finalRows: finalRows.length,
    verdictRows: allVerdicts.length,
  };
}
