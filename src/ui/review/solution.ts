/**
 * The solution on screen for one spectrum: where it came from and what a
 * decision built from it records. Pure, so the decision rules are tested
 * without rendering.
 */
import { orderedReviewFlags, type Candidate, type FitResult, type Grade, type HowSet, type LineMeasurement, type ReviewDecision, type ReviewFlag, type SpectrumClass } from '../../core/types';
import { classHasLine, classOfLine } from '../../core/lines/classLines';

export interface Solution {
  z: number;
  /** 1-sigma error; NaN when the way it was set gives none. */
  zErr: number;
  cls: SpectrumClass;
  howSet: HowSet;
  /** Index into the automatic candidates when picked from them (0 = the automatic best). */
  candidateIndex: number | null;
  lineId?: { id: string; observedA: number };
  /** Line measurements at this solution; null until measured. */
  lines: LineMeasurement[] | null;
  /** Template family whose model is drawn over the data (when known). */
  family?: string;
  /** Set by a refit: the redshift it started from and how that one was set (display only). */
  refinedFrom?: { z: number; how: string };
}

/** Candidate keys 1-9 reach at most this many candidates. */
export const CANDIDATE_KEYS = 9;

/** Index of the best candidate of a class (candidates are ranked best first), or -1. */
export function bestOfClass(candidates: readonly Candidate[], cls: SpectrumClass): number {
  return candidates.findIndex((c) => c.class === cls);
}

/**
 * Which candidates the number keys reach, in rank order: the best of every
 * class always, then the next best overall, up to `max`. So a star that lost
 * to nine galaxy minima is still one key away.
 */
export function keyedCandidates(candidates: readonly Candidate[], max = CANDIDATE_KEYS): number[] {
  if (candidates.length <= max) return candidates.map((_, i) => i);
  const chosen = new Set<number>();
  for (const c of candidates) {
    const i = bestOfClass(candidates, c.class);
    if (chosen.size < max) chosen.add(i);
  }
  for (let i = 0; i < candidates.length && chosen.size < max; i++) chosen.add(i);
  return [...chosen].sort((a, b) => a - b);
}

/** Family whose model to draw: the solution's own, else a typical one for its class. */
export function modelFamily(s: Solution): string | null {
  if (s.family) return s.family;
  return s.cls === 'qso' ? 'qso' : s.cls === 'galaxy' ? 'galaxy' : s.cls === 'star' ? 'star' : null;
}

/** The automatic best solution of a fit, or null when the fit failed. */
export function autoSolution(result: FitResult): Solution | null {
  if (result.status !== 'ok' || !result.candidates.length) return null;
  return { z: result.z, zErr: result.zErr, cls: result.class, howSet: 'auto', candidateIndex: 0, lines: result.lines, family: result.candidates[0].family };
}

/** Solution from the i-th automatic candidate (lines measured later unless it is the best). */
export function candidateSolution(result: FitResult, i: number): Solution | null {
  const c = result.candidates[i];
  if (!c) return null;
  return { z: c.z, zErr: c.zErr, cls: c.class, howSet: i === 0 ? 'auto' : 'candidate', candidateIndex: i, lines: i === 0 ? result.lines : null, family: c.family };
}

/** Solution restored from an earlier decision (not for rejections). */
export function solutionFromDecision(d: ReviewDecision, result: FitResult | null): Solution | null {
  if (d.state === 'rejected' || d.z === null) return null;
  const sameAsAuto = result && result.status === 'ok' && d.howSet === 'auto' && d.z === result.z;
  // A decision taken from a runner-up keeps pointing at it (the record holds z and class, not the index).
  const picked = !sameAsAuto && d.howSet === 'candidate' && result ? result.candidates.findIndex((c) => c.z === d.z && c.class === d.class) : -1;
  return {
    z: d.z,
    zErr: d.zErr ?? NaN,
    cls: d.class,
    howSet: d.howSet,
    candidateIndex: sameAsAuto ? 0 : picked >= 0 ? picked : null,
    lineId: d.lineId,
    lines: sameAsAuto ? result!.lines : null,
    family: sameAsAuto ? result!.candidates[0]?.family : picked >= 0 ? result!.candidates[picked].family : undefined,
  };
}

/**
 * The class a named line speaks for: the shown class when its lines hold the
 * line, else the class the line defines (core's rule, src/core/lines/classLines.ts:
 * broad lines quasar; narrow emission or absorption features galaxy).
 */
export function classForLine(lineId: string, current: SpectrumClass): SpectrumClass {
  if (current !== 'unknown' && classHasLine(current, lineId)) return current;
  return classOfLine(lineId) ?? current;
}

/**
 * Naming a line: z is exactly the one that line implies, observed / rest - 1
 * (the definition of redshift), with the error of the measured centre,
 * sigma_z = sigma_observed / rest. A refit is a separate, explicit step.
 */
export function lineSolution(line: { lineId: string; restA: number }, observedA: number, observedErrA: number, cls: SpectrumClass): Solution {
  return {
    z: observedA / line.restA - 1,
    zErr: Number.isFinite(observedErrA) ? observedErrA / line.restA : NaN,
    cls,
    howSet: 'line',
    candidateIndex: null,
    lineId: { id: line.lineId, observedA },
    lines: null,
  };
}

/** Solution from a refit near a chosen z (through a line, a typed value or the fit-quality plot). */
export function refitSolution(refit: FitResult, howSet: HowSet, fallbackZ: number, fallbackClass: SpectrumClass, lineId?: { id: string; observedA: number }): Solution {
  const ok = refit.status === 'ok' && Number.isFinite(refit.z);
  const s: Solution = {
    z: ok ? refit.z : fallbackZ,
    zErr: ok ? refit.zErr : NaN,
    cls: ok ? refit.class : fallbackClass,
    howSet,
    candidateIndex: null,
    lines: ok ? refit.lines : null,
  };
  if (ok && refit.candidates[0]) s.family = refit.candidates[0].family;
  if (lineId) s.lineId = lineId;
  return s;
}

/** The decision parts the panel decides; reviewer and time are added when it is stored. */
export type DecisionDraft = Omit<ReviewDecision, 'reviewer' | 'decidedAt'>;

/** Accept what is shown: 'accepted' when it is the automatic best, 'changed' otherwise. */
export function acceptDraft(file: string, s: Solution, grade: Grade | null, note: string, flags: readonly ReviewFlag[] = []): DecisionDraft {
  const d: DecisionDraft = {
    file,
    state: s.howSet === 'auto' ? 'accepted' : 'changed',
    z: s.z,
    zErr: Number.isFinite(s.zErr) ? s.zErr : null,
    class: s.cls,
    reviewerGrade: grade,
    howSet: s.howSet,
    note,
  };
  if (s.lineId) d.lineId = s.lineId;
  if (flags.length) d.flags = orderedReviewFlags(flags);
  return d;
}

/** Reject as unusable: no redshift, class unknown. */
export function rejectDraft(file: string, grade: Grade | null, note: string, flags: readonly ReviewFlag[] = []): DecisionDraft {
  const d: DecisionDraft = { file, state: 'rejected', z: null, zErr: null, class: 'unknown', reviewerGrade: grade, howSet: 'auto', note };
  if (flags.length) d.flags = orderedReviewFlags(flags);
  return d;
}

const GRADE_CYCLE: readonly (Grade | null)[] = [null, 'high', 'medium', 'low', 'none'];

/** Next reviewer grade for the cycle key: unset -> high -> medium -> low -> none -> unset. */
export function nextGrade(g: Grade | null): Grade | null {
  return GRADE_CYCLE[(GRADE_CYCLE.indexOf(g) + 1) % GRADE_CYCLE.length];
}

/** Note written on every decision of a bulk accept, so exports tell them apart from spectra looked at one by one. */
export const BULK_NOTE = 'accepted in a bulk step, not inspected one by one';

/** Accept the automatic solution of a fitted spectrum without opening it (bulk step). */
export function bulkAcceptDraft(file: string, auto: { z: number; zErr: number; class: SpectrumClass }): DecisionDraft {
  return {
    file,
    state: 'accepted',
    z: auto.z,
    zErr: Number.isFinite(auto.zErr) ? auto.zErr : null,
    class: auto.class,
    reviewerGrade: null,
    howSet: 'auto',
    note: BULK_NOTE,
  };
}
