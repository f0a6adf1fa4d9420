/** The automatic candidates as a table and as the fit quality against redshift. */
import type { FitResult } from '../../core/types';
import { FitQualityPlot } from '../plots';
import { CandidateList } from './CandidateList';

export interface CandidatesSectionProps {
  result: FitResult | null;
  currentZ: number | null;
  selected: number | null;
  onPick: (index: number) => void;
  /** A click on the curve: refit near that z. */
  onPickZ: (z: number) => void;
  /** Candidate indices in key order (the plot numbers its marks by key). */
  keyed?: readonly number[];
}

export function CandidatesSection({ result, currentZ, selected, onPick, onPickZ, keyed }: CandidatesSectionProps) {
  return (
    <div>
      <h3>Candidates</h3>
      {result && <CandidateList candidates={result.candidates} bestGrade={result.confidence} selected={selected} onPick={onPick} />}
      {result && result.curves.length > 0 && (
        <FitQualityPlot
          curves={result.curves}
          candidates={result.candidates}
          currentZ={currentZ}
          selectedCandidate={selected}
          onPickCandidate={onPick}
          onPickZ={onPickZ}
          keyed={keyed}
          height={180}
        />
      )}
      {result && result.curves.length > 0 && (
        <p className="muted small">
          The curve comes from the fast, coarse scan over all redshifts; the table gives each candidate's Δχ² after refinement with the full model. Click the
          curve to refit near that z. Families searched over a narrow range (stars, near z = 0) have their own panel on the right, in km/s.
        </p>
      )}
    </div>
  );
}
