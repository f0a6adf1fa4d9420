/** The solution on screen in one line: z, class, how it was set, and whether anyone has reviewed it. */
import type { ReviewDecision } from '../../core/types';
import { lineById } from '../../core/lines/catalogue';
import type { ResultSummary } from '../persist/resultSummary';
import { fmtNum, fmtZ, REVIEW_LABEL } from '../format';
import type { Solution } from './solution';

export interface SolutionLineProps {
  solution: Solution | null;
  /** The stored decision, when the spectrum has been reviewed. */
  decided: ReviewDecision | null;
  summary: ResultSummary | undefined;
}

/** True when the solution shown is the automatic best. */
export function isAutoShown(s: Solution | null): boolean {
  return s?.howSet === 'auto' && s.candidateIndex === 0;
}

export function SolutionLine({ solution, decided, summary }: SolutionLineProps) {
  const shownIsAuto = isAutoShown(solution);
  return (
    <div className="solution-line" data-testid="solution">
      {solution ? (
        <>
          <strong>
            z = <span data-testid="solution-z">{fmtZ(solution.z, 5)}</span>
            {Number.isFinite(solution.zErr) ? ` ± ${fmtZ(solution.zErr, 5)}` : ''}
          </strong>{' '}
          <span>{solution.cls}</span> <span className="muted">set by: {describeHow(solution)}</span>
        </>
      ) : (
        <strong>No redshift</strong>
      )}
      {decided ? (
        <span className={`state-badge review-${decided.state}`} data-testid="decision-state">
          {REVIEW_LABEL[decided.state]} by {decided.reviewer} at {decided.decidedAt.slice(0, 16).replace('T', ' ')}
        </span>
      ) : solution ? (
        <span className="caution" data-testid="unreviewed-caution">
          {shownIsAuto ? 'Automatic redshift, not reviewed: a hypothesis until accepted.' : 'Not yet saved: accept (a) to keep it.'}
        </span>
      ) : null}
      {summary?.status === 'ok' && shownIsAuto && (
        <span className="muted">
          machine confidence {summary.confidence} (score {fmtNum(summary.score, 2)})
        </span>
      )}
    </div>
  );
}

export function describeHow(s: Solution): string {
  switch (s.howSet) {
    case 'auto':
      return 'automatic fit';
    case 'candidate':
      return s.candidateIndex === null ? 'a runner-up candidate' : `candidate ${s.candidateIndex + 1}`;
    case 'line':
      return s.lineId ? `line ${lineById(s.lineId.id)?.label ?? s.lineId.id} at ${s.lineId.observedA.toFixed(1)} Å` : 'line identification';
    case 'typed':
      return 'typed redshift';
    case 'refit':
      return 'refit near a chosen z';
  }
}
