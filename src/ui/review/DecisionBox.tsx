/** The reviewer's side: own grade, note, accept / reject / undo. */
import type { Ref } from 'react';
import type { Grade } from '../../core/types';
import { FLAGS, type ReviewFlag } from './flags';

const GRADES: (Grade | '')[] = ['', 'high', 'medium', 'low', 'none'];

export interface DecisionBoxProps {
  grade: Grade | null;
  onGrade: (g: Grade | null) => void;
  note: string;
  onNote: (n: string) => void;
  noteRef?: Ref<HTMLTextAreaElement>;
  flags: readonly ReviewFlag[];
  onToggleFlag: (f: ReviewFlag) => void;
  canAccept: boolean;
  /** 'Accept' for the automatic solution, 'Accept change' for anything else. */
  acceptLabel: string;
  onAccept: () => void;
  onReject: () => void;
  /** Shown when there is a decision to undo. */
  onUndo?: () => void;
}

export function DecisionBox(p: DecisionBoxProps) {
  return (
    <div className="decision-box" aria-label="Decision">
      <h3>Decision</h3>
      <label className="field">
        Your confidence{' '}
        <select value={p.grade ?? ''} onChange={(e) => p.onGrade((e.target.value || null) as Grade | null)} aria-label="Your confidence grade">
          {GRADES.map((g) => (
            <option key={g} value={g}>
              {g === '' ? '(not set)' : g}
            </option>
          ))}
        </select>
      </label>
      <label className="field">
        Note
        <textarea ref={p.noteRef} value={p.note} onChange={(e) => p.onNote(e.target.value)} rows={2} maxLength={2000} aria-label="Note" />
      </label>
      <fieldset className="flags" aria-label="Review flags">
        <legend>Flags</legend>
        {FLAGS.map((f) => {
          const on = p.flags.includes(f.id);
          return (
            <button key={f.id} type="button" className={`flag-button${on ? ' on' : ''}`} aria-pressed={on} title={f.label} onClick={() => p.onToggleFlag(f.id)} data-testid={`flag-${f.id}`}>
              {on ? '⚑ ' : ''}
              {f.short} <kbd>{f.key}</kbd>
            </button>
          );
        })}
      </fieldset>
      <div className="decision-buttons">
        <button type="button" className="primary" onClick={p.onAccept} disabled={!p.canAccept} data-testid="accept">
          {p.acceptLabel} <kbd>a</kbd>
        </button>
        <button type="button" onClick={p.onReject} data-testid="reject">
          Reject as unusable <kbd>x</kbd>
        </button>
        {p.onUndo && (
          <button type="button" onClick={p.onUndo}>
            Undo decision <kbd>u</kbd>
          </button>
        )}
      </div>
    </div>
  );
}
