/** Asked once, before the first decision: the name written with every decision. */
import { useState } from 'react';
import { Overlay } from './Overlay';

export function ReviewerNameDialog({ onSubmit, onCancel }: { onSubmit: (name: string) => void; onCancel: () => void }) {
  const [name, setName] = useState('');
  return (
    <Overlay title="Your name" onClose={onCancel} testId="reviewer-dialog">
      <form
        onSubmit={(e) => {
          e.preventDefault();
          if (name.trim()) onSubmit(name.trim());
        }}
      >
        <p>Every decision records who made it. This is asked once and kept in this browser.</p>
        <label>
          Reviewer name <input value={name} onChange={(e) => setName(e.target.value)} maxLength={80} autoFocus aria-label="Reviewer name" />
        </label>
        <button type="submit" className="primary" disabled={!name.trim()}>
          Save and continue
        </button>
      </form>
    </Overlay>
  );
}
