/**
 * A reviewer's verdicts read from a catalogue they exported (CSV with its
 * header block, or JSON) from a packet session: the export carries the
 * packet's team block under `team_packet`, and each row's review columns
 * are the verdict. The automatic cells of each row are kept, so the final
 * catalogue can show them when no fit result is at hand.
 */
import { isReviewFlag, type Grade, type HowSet, type ReviewDecision, type ReviewState, type SpectrumClass } from '../types';
import { parseCatalogueCsv } from '../table/csv';
import { columnByName, type TableRow } from '../table/columns';
import { formatCell } from '../table/formatCell';
import { teamTagProblems, type TeamTag } from './teamTag';
import { TeamFileError, type MachineSolution, type VerdictSet } from './verdictSet';

/** Meta key (CSV header line, JSON meta.extra) holding the packet's team block as JSON. */
export const TEAM_META_KEY = 'team_packet';

const STATES: readonly ReviewState[] = ['accepted', 'changed', 'rejected'];
const CLASSES: readonly SpectrumClass[] = ['qso', 'galaxy', 'star', 'unknown'];
const GRADES: readonly Grade[] = ['high', 'medium', 'low', 'none'];
const HOW: readonly HowSet[] = ['auto', 'candidate', 'line', 'typed', 'refit'];

/** The rows as formatted cells and the meta, from CSV or JSON catalogue text; null when the text is neither. */
function readTable(text: string): { meta: Record<string, string>; rows: TableRow[] } | null {
  const t = text.trimStart();
  if (t.startsWith('{')) {
    let raw: { meta?: { extra?: Record<string, string> }; rows?: Record<string, unknown>[] };
    try {
      raw = JSON.parse(t);
    } catch {
      return null;
    }
    if (!raw || !Array.isArray(raw.rows) || typeof raw.meta !== 'object') return null;
    const rows = raw.rows.map((r) => {
      const out: Record<string, string> = {};
      for (const [k, v] of Object.entries(r)) {
        const col = columnByName(k);
        if (v === null || v === undefined || typeof v === 'object') out[k] = '';
        else out[k] = col && (typeof v === 'number' || typeof v === 'boolean') ? formatCell(col, v) : String(v);
      }
      return out;
    });
    return { meta: { ...(raw.meta?.extra ?? {}) }, rows };
  }
  try {
    const parsed = parseCatalogueCsv(text);
    return { meta: parsed.meta, rows: parsed.rows };
  } catch {
    return null;
  }
}

/** True when the text looks like a catalogue export with a packet's team block (cheap test before parsing as a session). */
export function isTeamCatalogue(text: string): boolean {
  return text.includes(TEAM_META_KEY);
}

const num = (s: string | undefined): number | null => (s === undefined || s === '' ? null : Number.isFinite(Number(s)) ? Number(s) : null);

function decisionOf(row: TableRow, file: string, where: string): ReviewDecision | null {
  const state = row.review_state as ReviewState;
  if (!row.review_state || row.review_state === 'unreviewed') return null;
  if (!STATES.includes(state)) throw new TeamFileError(`${where}: review_state '${row.review_state}' is unknown`);
  const cls = row.final_class as SpectrumClass;
  if (!CLASSES.includes(cls)) throw new TeamFileError(`${where}: final_class '${row.final_class}' is unknown`);
  const z = state === 'rejected' ? null : num(row.final_z);
  if (state !== 'rejected' && z === null) throw new TeamFileError(`${where}: an accepted or changed row has no final_z`);
  const d: ReviewDecision = {
    file,
    state,
    z,
    zErr: state === 'rejected' ? null : num(row.final_z_err),
    class: cls,
    reviewerGrade: GRADES.includes(row.reviewer_grade as Grade) ? (row.reviewer_grade as Grade) : null,
    howSet: HOW.includes(row.how_set as HowSet) ? (row.how_set as HowSet) : 'auto',
    reviewer: row.reviewer ?? '',
    decidedAt: row.reviewed_at ?? '',
    note: row.note ?? '',
  };
  const flags = (row.review_flags ?? '').split(';').filter(isReviewFlag);
  if (flags.length) d.flags = flags;
  if (row.line_id && num(row.line_observed_a) !== null) d.lineId = { id: row.line_id, observedA: num(row.line_observed_a)! };
  return d;
}

/** The verdict set of a catalogue export, or null when the text is no catalogue export of a packet. */
export function verdictSetFromCatalogue(text: string, source: string): VerdictSet | null {
  const table = readTable(text);
  if (!table || !table.meta[TEAM_META_KEY]) return null;
  let tag: TeamTag;
  try {
    tag = JSON.parse(table.meta[TEAM_META_KEY]);
  } catch {
    throw new TeamFileError(`${source}: the ${TEAM_META_KEY} entry is not readable`);
  }
  const problems = teamTagProblems(tag);
  if (problems.length) throw new TeamFileError(`${source}: ${problems.join('; ')}`);
  const byFile = new Map(tag.spectra.map((s) => [s.file, s]));
  const machine = new Map<string, MachineSolution>();
  const autoRows: Record<string, TableRow> = {};
  const verdicts: VerdictSet['verdicts'] = [];
  let outside = 0;
  table.rows.forEach((row, i) => {
    const sp = byFile.get(row.file ?? '');
    const d = decisionOf(row, row.file ?? '', `${source}, row ${i + 1}`);
    if (!sp) {
      if (d) outside++;
      return;
    }
    autoRows[sp.id] = row;
    const z = num(row.z);
    if (z !== null && !row.error && CLASSES.includes(row.class as SpectrumClass)) machine.set(sp.id, { z, zErr: num(row.z_err) ?? NaN, class: row.class as SpectrumClass });
    if (d) verdicts.push({ id: sp.id, reviewer: d.reviewer.trim() || tag.reviewer, source, decision: d });
  });
  return {
    source,
    reviewer: tag.reviewer,
    tag,
    spectra: tag.spectra.map((s) => ({ ...s, machine: machine.get(s.id) ?? null })),
    verdicts,
    outside,
    autoRows,
  };
}
