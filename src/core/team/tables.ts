/**
 * The team review's tables: the final catalogue (catalogue row of the final
 * verdict plus the consensus columns) and the long table of every verdict.
 * Formatting is core/table's, so every format writes the same cells.
 */
import { orderedReviewFlags, type CosmologyParams, type FitResult, type ReviewDecision } from '../types';
import { CATALOGUE_COLUMNS, type ColumnDef, type TableRow } from '../table/columns';
import { CONSENSUS_COLUMNS, VERDICT_COLUMNS } from '../table/teamColumns';
import { catalogueRow } from '../table/rows';
import { formatCell, type CellValue } from '../table/formatCell';
import { failedResult } from '../failedResult';
import type { Consensus, Settlement } from './consensus';
import type { MergedBatch } from './merge';

export const FINAL_COLUMNS: readonly ColumnDef[] = [...CATALOGUE_COLUMNS, ...CONSENSUS_COLUMNS];
/** Cells that come from the fit (automatic and physics groups). */
const AUTOMATIC_NAMES = CATALOGUE_COLUMNS.filter((c) => c.group !== 'review' && c.group !== 'derived').map((c) => c.name);

function format(columns: readonly ColumnDef[], values: Record<string, CellValue>): Record<string, string> {
  const row: Record<string, string> = {};
  for (const c of columns) row[c.name] = formatCell(c, values[c.name]);
  return row;
}

/**
 * One final catalogue row per spectrum of the merge. `resultOf` gives the
 * fit of a spectrum id; without one the automatic columns say so in `error`.
 */
export function finalCatalogueRows(merged: MergedBatch, consensus: readonly Consensus[], resultOf: (id: string) => FitResult | undefined, cosmology: CosmologyParams): TableRow[] {
  const files = new Map(merged.spectra.map((s) => [s.id, s.file]));
  return consensus.map((c) => {
    const file = files.get(c.id) ?? c.id;
    const fitted = resultOf(c.id);
    const exported = merged.autoRows[c.id];
    const result = fitted ?? failedResult(file, 'no fit result in the merged files');
    // The final verdict is paired with the fit under the fit's file name.
    const final = c.final ? { ...c.final, file: result.file } : undefined;
    let base = catalogueRow(result, final, cosmology);
    // Without a fit, a reviewer's exported row gives the automatic cells as that export wrote them.
    if (!fitted && exported) base = { ...base, ...Object.fromEntries(AUTOMATIC_NAMES.map((n) => [n, exported[n] ?? ''])) };
    const consensusCells = format(CONSENSUS_COLUMNS, { n_reviewers: c.verdicts.length, agreement: c.state, settled_by: c.settledBy });
    return { ...base, ...consensusCells };
  });
}

function verdictCells(d: ReviewDecision): Record<string, CellValue> {
  return {
    review_state: d.state,
    z: d.z,
    z_err: d.zErr,
    class: d.class,
    how_set: d.howSet,
    reviewer_grade: d.reviewerGrade ?? '',
    review_flags: orderedReviewFlags(d.flags).join(';'),
    note: d.note,
    reviewed_at: d.decidedAt,
  };
}

/** Every verdict and every settlement, one row each, grouped by spectrum in the merge's order. */
export function verdictRows(merged: MergedBatch, consensus: readonly Consensus[], settlements: readonly Settlement[]): TableRow[] {
  const files = new Map(merged.spectra.map((s) => [s.id, s.file]));
  const byId = new Map(consensus.map((c) => [c.id, c]));
  const group = <T extends { id: string }>(items: readonly T[]) => {
    const m = new Map<string, T[]>();
    for (const x of items) {
      const list = m.get(x.id);
      if (list) list.push(x);
      else m.set(x.id, [x]);
    }
    return m;
  };
  const verdictsOf = group(merged.verdicts);
  const settlementsOf = group(settlements);
  const rows: TableRow[] = [];
  for (const s of merged.spectra) {
    const c = byId.get(s.id);
    const state = c?.state ?? 'none';
    // The verdict the final catalogue carries: the settlement's, else the first counted one (consensus.ts).
    const takenVerdict = c && !c.settlement && c.final ? c.verdicts[0] : undefined;
    for (const v of verdictsOf.get(s.id) ?? []) {
      rows.push(
        format(VERDICT_COLUMNS, {
          file: files.get(s.id) ?? s.id,
          spectrum_id: s.id,
          role: 'reviewer',
          reviewer: v.reviewer,
          ...verdictCells(v.decision),
          source: v.source,
          counted: v.counted,
          agreement: state,
          in_final: takenVerdict === v,
        }),
      );
    }
    for (const st of settlementsOf.get(s.id) ?? []) {
      rows.push(
        format(VERDICT_COLUMNS, {
          file: files.get(s.id) ?? s.id,
          spectrum_id: s.id,
          role: 'arbiter',
          ...verdictCells(st.decision),
          reviewer: st.arbiter,
          source: '',
          counted: c?.settlement === st,
          agreement: state,
          in_final: c?.settlement === st,
        }),
      );
    }
  }
  return rows;
}
