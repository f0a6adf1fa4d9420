/**
 * Review flags: problems a reviewer marks on a spectrum, beside the redshift
 * and the grade. Each has an id (stored and exported), a plain label and one
 * key. Stored with the decision (ReviewDecision has no field for them yet, so
 * the UI keeps them as an extra `flags` list on the record).
 */
import type { ReviewDecision } from '../../core/types';

export type ReviewFlag = 'broad-absorption' | 'sky-residuals' | 'low-snr' | 'partial-coverage' | 'blend';

export interface FlagDef {
  id: ReviewFlag;
  label: string;
  /** Short text for the list and the buttons. */
  short: string;
  key: string;
}

export const FLAGS: readonly FlagDef[] = [
  { id: 'broad-absorption', label: 'Broad absorption troughs (BAL)', short: 'BAL', key: 'w' },
  { id: 'sky-residuals', label: 'Sky or telluric residuals spoil part of the spectrum', short: 'sky', key: 'y' },
  { id: 'low-snr', label: 'Low S/N', short: 'low S/N', key: 'd' },
  { id: 'partial-coverage', label: 'Partial coverage: key lines outside the range or masked', short: 'partial', key: 'p' },
  { id: 'blend', label: 'Possible blend or two objects in the spectrum', short: 'blend', key: 'm' },
];

const IDS = new Set<string>(FLAGS.map((f) => f.id));

export function isReviewFlag(v: unknown): v is ReviewFlag {
  return typeof v === 'string' && IDS.has(v);
}

export function flagByKey(key: string): FlagDef | undefined {
  return FLAGS.find((f) => f.key === key);
}

/** Toggle one flag; the result keeps the order of FLAGS so stored lists compare equal. */
export function toggleFlag(flags: readonly ReviewFlag[], f: ReviewFlag): ReviewFlag[] {
  const set = new Set(flags);
  if (set.has(f)) set.delete(f);
  else set.add(f);
  return FLAGS.map((d) => d.id).filter((id) => set.has(id));
}

/** A decision as the UI stores it: the core record plus the review flags. */
export type FlaggedDecision = ReviewDecision & { flags?: ReviewFlag[] };

/** The flags of a stored decision (unknown words are dropped). */
export function flagsOf(d: ReviewDecision | undefined | null): ReviewFlag[] {
  const f = (d as FlaggedDecision | undefined | null)?.flags;
  return Array.isArray(f) ? f.filter(isReviewFlag) : [];
}

/** Export cell: flag ids joined by ';' in the order of FLAGS. */
export function flagsCell(d: ReviewDecision | undefined | null): string {
  return flagsOf(d).join(';');
}
