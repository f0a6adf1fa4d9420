/**
 * How an imported session meets the one already here: new files are added,
 * a decision is taken when there is none here or ours is older, and where
 * ours is newer (or made at the same moment but different) the reviewer is
 * asked; nothing newer is overwritten silently.
 */
import type { ReviewDecision } from '../../core/types';
import type { SessionFile, SessionFileEntry } from './sessionFile';

export interface DecisionConflict {
  key: string;
  file: string;
  mine: ReviewDecision;
  theirs: ReviewDecision;
}

export interface ImportPlan {
  /** Entries not yet in this session. */
  newEntries: SessionFileEntry[];
  /** Entries already here whose bytes the file can supply. */
  bytesToAttach: SessionFileEntry[];
  /** Decisions to write without asking (none here, or ours is older). */
  decisions: { key: string; decision: ReviewDecision }[];
  /** Ours is newer or differs at the same time: ask first. */
  conflicts: DecisionConflict[];
  /** Decisions identical to ours. */
  unchanged: number;
}

function sameDecision(a: ReviewDecision, b: ReviewDecision): boolean {
  return JSON.stringify(a) === JSON.stringify(b);
}

export function planImport(
  existing: ReadonlyMap<string, { hasBytes: boolean; decision?: ReviewDecision }>,
  incoming: SessionFile,
): ImportPlan {
  const plan: ImportPlan = { newEntries: [], bytesToAttach: [], decisions: [], conflicts: [], unchanged: 0 };
  for (const entry of incoming.entries) {
    const here = existing.get(entry.key);
    if (!here) {
      plan.newEntries.push(entry);
      if (entry.decision) plan.decisions.push({ key: entry.key, decision: entry.decision });
      continue;
    }
    if (!here.hasBytes && entry.bytes) plan.bytesToAttach.push(entry);
    const theirs = entry.decision;
    if (!theirs) continue;
    const mine = here.decision;
    if (!mine) {
      plan.decisions.push({ key: entry.key, decision: theirs });
      continue;
    }
    if (sameDecision(mine, theirs)) {
      plan.unchanged++;
      continue;
    }
    const tMine = Date.parse(mine.decidedAt);
    const tTheirs = Date.parse(theirs.decidedAt);
    if (tTheirs > tMine) plan.decisions.push({ key: entry.key, decision: theirs });
    else plan.conflicts.push({ key: entry.key, file: entry.file, mine, theirs });
  }
  return plan;
}
