/**
 * The session as a whole: add more files, save everything to one file,
 * load a saved session (checked strictly; newer decisions here are never
 * replaced without asking), or start again.
 */
import { useRef, useState } from 'react';
import { useServices, useSessionSnapshot } from '../state/SessionContext';
import { Overlay } from './Overlay';
import { DropZone } from '../intake/DropZone';
import type { Collected } from '../intake/collectFiles';
import type { ImportPlan } from '../persist/planImport';
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
  const [problems, setProblems] = useState<string[]>([]);
  const [plan, setPlan] = useState<ImportPlan | null>(null);
  const [take, setTake] = useState<Set<string>>(new Set());
  const fileInput = useRef<HTMLInputElement>(null);

  const saveWithSpectra = async () => {
    setStatus('Saving…');
    const text = await session.exportSession(true);
    downloadBlob(text, `shiftmark-session-${stamp()}.json`, 'application/json');
    setStatus('Saved with spectra.');
  };

  const readSessionFile = async (file: File) => {
    setProblems([]);
    setPlan(null);
    const planned = session.planSessionImport(await file.text());
    if (!planned.ok) {
      setProblems(planned.problems);
      return;
    }
    if (planned.plan.conflicts.length) {
      setPlan(planned.plan);
      setTake(new Set());
      return;
    }
    await apply(planned.plan, new Set());
  };

  const apply = async (p: ImportPlan, chosen: ReadonlySet<string>) => {
    await session.applyImport(p, chosen);
    setPlan(null);
    setStatus(
      `Loaded: ${p.newEntries.length} new spectra, ${p.decisions.length + chosen.size} decisions taken, ${p.unchanged} already the same` +
        (p.conflicts.length - chosen.size > 0 ? `, ${p.conflicts.length - chosen.size} of yours kept` : '') +
        '.',
    );
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
        <button type="button" onClick={() => fileInput.current?.click()}>
          Load a session file…
        </button>
        <input
          ref={fileInput}
          type="file"
          accept=".json,application/json"
          hidden
          aria-label="Session file"
          onChange={(e) => {
            const f = e.currentTarget.files?.[0];
            if (f) void readSessionFile(f);
            e.currentTarget.value = '';
          }}
        />
      </div>
      {problems.length > 0 && (
        <div role="alert" className="error-text">
          <p>This session file was not loaded:</p>
          <ul>
            {problems.map((p, i) => (
              <li key={i}>{p}</li>
            ))}
          </ul>
        </div>
      )}
      {plan && (
        <div className="conflicts" data-testid="import-conflicts">
          <p>
            {plan.conflicts.length} spectra have a decision here that is newer than (or differs from) the one in the file. Yours are kept unless
            you tick them:
          </p>
          <ul>
            {plan.conflicts.map((c) => (
              <li key={c.key}>
                <label>
                  <input
                    type="checkbox"
                    checked={take.has(c.key)}
                    onChange={(e) => {
                      const t = new Set(take);
                      if (e.target.checked) t.add(c.key);
                      else t.delete(c.key);
                      setTake(t);
                    }}
                  />{' '}
                  {c.file}: yours {c.mine.state} z={String(c.mine.z)} ({c.mine.decidedAt}) — file {c.theirs.state} z={String(c.theirs.z)} (
                  {c.theirs.decidedAt}), take the file's
                </label>
              </li>
            ))}
          </ul>
          <button type="button" className="primary" onClick={() => void apply(plan, take)}>
            Load
          </button>
          <button type="button" onClick={() => setPlan(null)}>
            Cancel
          </button>
        </div>
      )}
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
