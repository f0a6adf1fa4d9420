/** Fitting progress: a bar, counts of done, failed and waiting, and cancel / resume. */
import type { Progress } from '../state/session';

export interface ProgressPanelProps {
  progress: Progress;
  onCancel: () => void;
  onResume: () => void;
  /** Files a cancel left unfitted (resume offered when > 0). */
  unfitted: number;
}

export function ProgressPanel({ progress, onCancel, onResume, unfitted }: ProgressPanelProps) {
  const { total, done, failed, waiting, active } = progress;
  if (!active && unfitted === 0 && total === 0) return null;
  const finished = done + failed;
  return (
    <section className="progress" aria-label="Fitting progress" data-testid="progress">
      {total > 0 && (
        <progress max={total} value={finished} aria-label="Files fitted">
          {finished} of {total}
        </progress>
      )}
      <span className="progress-counts" data-testid="progress-counts">
        <span data-testid="count-done">{done} done</span> · <span data-testid="count-failed">{failed} failed</span> ·{' '}
        <span data-testid="count-waiting">{waiting} waiting</span>
      </span>
      {active ? (
        <button type="button" onClick={onCancel}>
          Cancel fitting
        </button>
      ) : unfitted > 0 ? (
        <button type="button" onClick={onResume}>
          Fit the {unfitted} left
        </button>
      ) : null}
    </section>
  );
}
