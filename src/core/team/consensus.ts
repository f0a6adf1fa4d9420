/**
 * The final verdict of each spectrum. An arbiter's settlement counts first
 * (the latest, when they changed their mind); else agreeing reviewers give
 * the verdict of the first of them by name (they agree, so any would do);
 * a single reviewer's verdict stands; an unsettled disagreement has none.
 * Settlements are kept beside the verdicts, never in their place.
 */
import type { ReviewDecision } from '../types';
import { agreementOf, type AgreementRule, type AgreementState } from './agreement';
import { countedBySpectrum, type MergedBatch, type MergedVerdict } from './merge';

export interface Settlement {
  id: string;
  arbiter: string;
  /** ISO 8601. */
  settledAt: string;
  /** The reviewer whose verdict was taken, or null for a new decision of the arbiter's. */
  picked: string | null;
  decision: ReviewDecision;
}

export interface Consensus {
  id: string;
  state: AgreementState;
  /** Counted verdicts, reviewers in name order. */
  verdicts: MergedVerdict[];
  final: ReviewDecision | null;
  /** Arbiter's name when settled, else ''. */
  settledBy: string;
  /** The settlement in force, if any. */
  settlement: Settlement | null;
}

/** The settlement in force for each spectrum (the latest). */
export function latestSettlements(settlements: readonly Settlement[]): Map<string, Settlement> {
  const out = new Map<string, Settlement>();
  for (const s of settlements) {
    const prev = out.get(s.id);
    if (!prev || Date.parse(s.settledAt) >= Date.parse(prev.settledAt)) out.set(s.id, s);
  }
  return out;
}

export function consensusOf(merged: MergedBatch, settlements: readonly Settlement[], rule: AgreementRule): Consensus[] {
  const by = countedBySpectrum(merged);
  const settled = latestSettlements(settlements);
  return merged.spectra.map((s) => {
    const verdicts = by.get(s.id) ?? [];
    const state = agreementOf(
      verdicts.map((v) => v.decision),
      rule,
    );
    const settlement = settled.get(s.id) ?? null;
    let final: ReviewDecision | null = null;
    if (settlement) final = settlement.decision;
    else if (state === 'agree' || state === 'single') final = verdicts[0].decision;
    return { id: s.id, state, verdicts, final, settledBy: settlement?.arbiter ?? '', settlement };
  });
}
