/** Every spectrum of the merge with each reviewer's verdict side by side, its state and its final verdict. */
import { orderedReviewFlags, type ReviewDecision } from '../../core/types';
import type { Consensus } from '../../core/team';

export function verdictText(d: ReviewDecision): string {
  const z = d.z === null ? 'rejected' : `z ${d.z.toFixed(5)}`;
  const flags = orderedReviewFlags(d.flags);
  return [`${d.class} ${z}`, d.reviewerGrade ? `grade ${d.reviewerGrade}` : '', flags.length ? `flags ${flags.join(', ')}` : '', d.note ? `“${d.note}”` : '']
    .filter(Boolean)
    .join(' · ');
}

export interface VerdictTableProps {
  items: readonly Consensus[];
  files: ReadonlyMap<string, string>;
  reviewers: readonly string[];
  currentId: string | null;
  onSelect: (id: string) => void;
}

export function VerdictTable({ items, files, reviewers, currentId, onSelect }: VerdictTableProps) {
  return (
    <table className="verdict-table" data-testid="verdict-table">
      <thead>
        <tr>
          <th>spectrum</th>
          <th>state</th>
          {reviewers.map((r) => (
            <th key={r}>{r}</th>
          ))}
          <th>final</th>
        </tr>
      </thead>
      <tbody>
        {items.map((c) => (
          <tr key={c.id} className={c.id === currentId ? 'current' : undefined} onClick={() => onSelect(c.id)} data-testid="verdict-row" aria-selected={c.id === currentId}>
            <td>{files.get(c.id) ?? c.id}</td>
            <td className={`team-state state-${c.state}`} data-testid="verdict-state">
              {c.state}
            </td>
            {reviewers.map((r) => {
              const v = c.verdicts.find((x) => x.reviewer === r);
              return <td key={r}>{v ? verdictText(v.decision) : ''}</td>;
            })}
            <td data-testid="verdict-final">{c.final ? `${verdictText(c.final)}${c.settledBy ? ` (settled by ${c.settledBy})` : ''}` : c.state === 'disagree' ? 'open' : ''}</td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}
