/**
 * The automatic candidates the number keys reach: key, z, class, chi-square
 * gap to the best, and which one is shown. The best solution of every class
 * is always among them (keyedCandidates), marked "best <class>".
 */
import type { Candidate, Grade } from '../../core/types';
import { fmtNum, fmtZ } from '../format';
import { bestOfClass, keyedCandidates } from './solution';

export interface CandidateListProps {
  candidates: readonly Candidate[];
  /** Machine grade of the best candidate. */
  bestGrade: Grade;
  selected: number | null;
  onPick: (index: number) => void;
}

export const CLASS_LABEL: Record<string, string> = { qso: 'quasar', galaxy: 'galaxy', star: 'star', unknown: 'unknown' };

export function CandidateList({ candidates, bestGrade, selected, onPick }: CandidateListProps) {
  if (!candidates.length) return <p className="muted">No automatic candidates.</p>;
  const keyed = keyedCandidates(candidates);
  const left = candidates.length - keyed.length;
  const classes = new Set(candidates.map((c) => c.class));
  return (
    <>
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
          {keyed.map((i, k) => {
            const c = candidates[i];
            const topOfClass = bestOfClass(candidates, c.class) === i;
            return (
              <tr
                key={i}
                aria-selected={selected === i}
                className={selected === i ? 'current' : undefined}
                onClick={() => onPick(i)}
                data-testid="candidate-row"
                data-class={c.class}
              >
                <td>
                  <button type="button" className="key-button" aria-label={`Show candidate ${k + 1}`} onClick={(e) => (e.stopPropagation(), onPick(i))}>
                    {k + 1}
                  </button>
                </td>
                <td>{fmtZ(c.z)}</td>
                <td>{fmtZ(c.zErr, 5)}</td>
                <td data-testid="candidate-class">
                  {CLASS_LABEL[c.class] ?? c.class}
                  {topOfClass && classes.size > 1 ? <span className="muted small"> best {CLASS_LABEL[c.class] ?? c.class}</span> : null}
                  {c.atEdge ? <span className="muted small"> (at range edge)</span> : null}
                </td>
                <td>{i === 0 ? '0' : fmtNum(c.deltaChi2, 1)}</td>
                <td>{i === 0 ? bestGrade : 'runner-up'}</td>
              </tr>
            );
          })}
        </tbody>
      </table>
      {left > 0 && <p className="muted small">{left} weaker candidates are not on a key.</p>}
    </>
  );
}
