/**
 * The session as a whole: add more files, save everything to one file,
 * load a saved session (checked strictly; newer decisions here are never
 * replaced without asking), or start again.
 */
import { useState } from 'react';
import { useServices, useSessionSnapshot } from '../state/SessionContext';
import { Overlay } from './Overlay';
import { DropZone } from '../intake/DropZone';
import type { Collected } from '../intake/collectFiles';
import { SessionLoader } from './SessionLoader';
import { downloadBlob, stamp } from '../download';

export interface SessionPanelProps {
  onClose: () => void;
  onCollected: (c: Collected) => void;
  onDemo: () => void;
  onExportSession: () => void;
}

export function SessionPanel({ onClose, onCollected, onDemo, onExportSession }: SessionPanelProps) {
  const { session } = useServices();
  const snap = useSessionSnapshot();
  const [status, setStatus] = useState<string | null>(null);

  const saveWithSpectra = async () => {
    setStatus('Saving…');
    const text = await session.exportSession(true);
    downloadBlob(text, `shiftmark-session-${stamp()}.json`, 'application/json');
    setStatus('Saved with spectra.');
  };

  return (
    <Overlay title="Session" onClose={onClose} testId="session-panel">
      <h3>Add spectra</h3>
      <DropZone compact onCollected={onCollected} onDemo={onDemo} />
      <h3>Save or load the session</h3>
      <p className="muted small">
        Your work is already kept in this browser after every decision. A session file carries it to another machine or keeps a copy.
      </p>
      <div className="drop-buttons">
        <button type="button" onClick={onExportSession}>
          Save session (results and decisions)
        </button>
        <button type="button" onClick={() => void saveWithSpectra()}>
          Save session with spectra (larger)
        </button>
      </div>
      <SessionLoader />
      <h3>Start again</h3>
      <button
        type="button"
        onClick={() => {
          if (window.confirm(`Forget all ${snap.rows.length} spectra and their decisions in this browser? Save the session first if you need it.`))
            void session.clearBatch().then(onClose);
        }}
      >
        Forget this batch…
      </button>
      {status && <p role="status">{status}</p>}
    </Overlay>
  );
}
