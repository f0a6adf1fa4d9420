/**
 * Review flags as the UI offers them: core's flags (src/core/types.ts,
 * REVIEW_FLAGS: ids, meanings and order, stored in ReviewDecision.flags and
 * written in the review_flags column) with a short text and one key each.
 */
import { REVIEW_FLAGS, isReviewFlag, orderedReviewFlags, type ReviewDecision, type ReviewFlag } from '../../core/types';

export { isReviewFlag, type ReviewFlag };

export interface FlagDef {
  id: ReviewFlag;
  label: string;
  /** Short text for the list and the buttons. */
  short: string;
  key: string;
}

const UI: Record<ReviewFlag, { short: string; key: string }> = {
  'broad-absorption': { short: 'BAL', key: 'w' },
  'sky-residuals': { short: 'sky', key: 'y' },
  'low-snr': { short: 'low S/N', key: 'd' },
  'partial-coverage': { short: 'partial', key: 'p' },
  blend: { short: 'blend', key: 'm' },
};

export const FLAGS: readonly FlagDef[] = REVIEW_FLAGS.map((f) => ({ id: f.id, label: f.label, ...UI[f.id] }));

export function flagByKey(key: string): FlagDef | undefined {
  return FLAGS.find((f) => f.key === key);
}

/** Toggle one flag; the result keeps core's order so stored lists compare equal. */
export function toggleFlag(flags: readonly ReviewFlag[], f: ReviewFlag): ReviewFlag[] {
  const set = new Set<ReviewFlag>(flags);
  if (set.has(f)) set.delete(f);
  else set.add(f);
  return orderedReviewFlags([...set]);
}

/** The flags of a stored decision (unknown words are dropped). */
export function flagsOf(d: ReviewDecision | undefined | null): ReviewFlag[] {
  return orderedReviewFlags(d?.flags);
}
