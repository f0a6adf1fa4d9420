/** The automatic candidates: z, class, chi-square gap to the best, and which one is shown. */
import type { Candidate, Grade } from '../../core/types';
import { fmtNum, fmtZ } from '../format';

export interface CandidateListProps {
  candidates: readonly Candidate[];
  /** Machine grade of the best candidate. */
  bestGrade: Grade;
  selected: number | null;
  onPick: (index: number) => void;
}

export function CandidateList({ candidates, bestGrade, selected, onPick }: CandidateListProps) {
  if (!candidates.length) return <p className="muted">No automatic candidates.</p>;
  return (
    <table className="candidates" aria-label="Candidates" data-testid="candidate-list">
      <thead>
        <tr>
          <th scope="col">key</th>
          <th scope="col">z</th>
          <th scope="col">±</th>
          <th scope="col">class</th>
          <th scope="col" title="chi-square of this candidate minus the best">Δχ²</th>
          <th scope="col">grade</th>
        </tr>
      </thead>
      <tbody>
        {candidates.slice(0, 9).map((c, i) => (
          <tr key={i} aria-selected={selected === i} className={selected === i ? 'current' : undefined} onClick={() => onPick(i)} data-testid="candidate-row">
            <td>
              <button type="button" className="key-button" aria-label={`Show candidate ${i + 1}`} onClick={(e) => (e.stopPropagation(), onPick(i))}>
                {i + 1}
              </button>
            </td>
            <td>{fmtZ(c.z)}</td>
            <td>{fmtZ(c.zErr, 5)}</td>
            <td>
              {c.class}
              {c.atEdge ? ' (at range edge)' : ''}
            </td>
            <td>{i === 0 ? '0' : fmtNum(c.deltaChi2, 1)}</td>
            <td>{i === 0 ? bestGrade : 'runner-up'}</td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}
