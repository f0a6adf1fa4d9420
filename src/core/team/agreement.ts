/**
 * When two reviewers agree on a spectrum: the same class and redshifts
 * within |z1 - z2| / (1 + z) < tolerance, z the mean of the two (symmetric,
 * so the order of the reviewers does not matter). 0.003 is the usual bar for
 * a redshift counted right (common practice; the same bar the machine score
 * is calibrated on). Two rejections (no redshift) agree; a rejection and a
 * redshift do not.
 */
import type { ReviewDecision } from '../types';

export const DEFAULT_TOLERANCE = 0.003;

export interface AgreementRule {
  /** Largest |dz| / (1 + z) still counted as the same redshift (strictly below). */
  tolerance: number;
}

export const DEFAULT_RULE: AgreementRule = { tolerance: DEFAULT_TOLERANCE };

/** agree: all reviewers agree; disagree: some pair does not; single: one verdict; none: no verdict yet. */
export type AgreementState = 'agree' | 'disagree' | 'single' | 'none';

export const AGREEMENT_STATES: readonly AgreementState[] = ['agree', 'disagree', 'single', 'none'];

export function checkRule(rule: AgreementRule): AgreementRule {
  if (!(Number.isFinite(rule.tolerance) && rule.tolerance > 0 && rule.tolerance < 1))
    throw new RangeError(`the redshift tolerance must be a number above 0 and below 1 (got ${rule.tolerance})`);
  return rule;
}

/** What a verdict says for agreement: class and redshift (null when rejected). */
export type Said = Pick<ReviewDecision, 'class' | 'z'>;

/** |z1 - z2| / (1 + mean z). */
export function scaledDz(z1: number, z2: number): number {
  return Math.abs(z1 - z2) / (1 + (z1 + z2) / 2);
}

export function verdictsAgree(a: Said, b: Said, rule: AgreementRule = DEFAULT_RULE): boolean {
  if (a.class !== b.class) return false;
  if (a.z === null || b.z === null) return a.z === null && b.z === null;
  return scaledDz(a.z, b.z) < rule.tolerance;
}

/** The state of one spectrum from its counted verdicts. */
export function agreementOf(verdicts: readonly Said[], rule: AgreementRule = DEFAULT_RULE): AgreementState {
  if (verdicts.length === 0) return 'none';
  if (verdicts.length === 1) return 'single';
  for (let i = 0; i < verdicts.length; i++) for (let j = i + 1; j < verdicts.length; j++) if (!verdictsAgree(verdicts[i], verdicts[j], rule)) return 'disagree';
  return 'agree';
}
