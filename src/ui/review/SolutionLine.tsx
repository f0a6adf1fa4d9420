/** The solution on screen in one line: z, class, how it was set, and whether anyone has reviewed it. */
import type { ReviewDecision } from '../../core/types';
import { lineById } from '../../core/lines/catalogue';
import type { ResultSummary } from '../persist/resultSummary';
import { SPEED_OF_LIGHT_KMS } from '../../core/cosmology/constants';
import { fmtNum, fmtZ, REVIEW_LABEL } from '../format';
import type { Solution } from './solution';

export interface SolutionLineProps {
  solution: Solution | null;
  /** The stored decision, when the spectrum has been reviewed. */
  decided: ReviewDecision | null;
  summary: ResultSummary | undefined;
  /** Candidate indices in key order, so "candidate N" names the key that shows it. */
  keyed?: readonly number[];
  /** Refit near the shown z; the button is offered when given. */
  onRefine?: () => void;
}

/** True when the solution shown is the automatic best. */
export function isAutoShown(s: Solution | null): boolean {
  return s?.howSet === 'auto' && s.candidateIndex === 0;
}

export function SolutionLine({ solution, decided, summary, keyed, onRefine }: SolutionLineProps) {
  const shownIsAuto = isAutoShown(solution);
  return (
    <div className="solution-line" data-testid="solution">
      {solution ? (
        <>
          <strong>
            z = <span data-testid="solution-z">{fmtZ(solution.z, 5)}</span>
            {Number.isFinite(solution.zErr) ? ` ± ${fmtZ(solution.zErr, 5)}` : ''}
          </strong>{' '}
          <span>{solution.cls}</span> <span className="muted">set by: {describeHow(solution, keyed)}</span>
          {solution.refinedFrom && (
            <span className="muted" data-testid="refined-from">
              {describeMove(solution.refinedFrom.z, solution.z, solution.refinedFrom.how)}
            </span>
          )}
          {onRefine && (
            <button type="button" className="small-button" onClick={onRefine} title="Refit the templates near this redshift">
              Refine <kbd>r</kbd>
            </button>
          )}
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

/**
 * How far a refit moved: in z and as a velocity, c dz / (1 + z) (the
 * relative velocity of two redshifts to first order).
 */
export function describeMove(fromZ: number, toZ: number, how: string): string {
  const dz = toZ - fromZ;
  const dv = (SPEED_OF_LIGHT_KMS * dz) / (1 + fromZ);
  const sign = (x: number) => (x >= 0 ? '+' : '−');
  return `refined from ${how} at z = ${fmtZ(fromZ, 5)}: moved ${sign(dz)}${fmtZ(Math.abs(dz), 5)} (${sign(dv)}${fmtNum(Math.abs(dv), 0)} km/s)`;
}

export function describeHow(s: Solution, keyed?: readonly number[]): string {
  switch (s.howSet) {
    case 'auto':
      return 'automatic fit';
    case 'candidate': {
      if (s.candidateIndex === null) return 'a runner-up candidate';
      const k = keyed ? keyed.indexOf(s.candidateIndex) : s.candidateIndex;
      return k >= 0 ? `candidate ${k + 1}` : 'a runner-up candidate';
    }
    case 'line':
      return s.lineId ? `line ${lineById(s.lineId.id)?.label ?? s.lineId.id} at ${s.lineId.observedA.toFixed(1)} Å` : 'line identification';
    case 'typed':
      return 'typed redshift';
    case 'refit':
      return s.lineId ? `refit near line ${lineById(s.lineId.id)?.label ?? s.lineId.id}` : 'refit near a chosen z';
  }
}
