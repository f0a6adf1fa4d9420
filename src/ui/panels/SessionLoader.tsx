/**
 * Load a saved session file: checked strictly first; with spectra already
 * here, the reviewer chooses to merge (decisions here that are newer or
 * different are kept unless ticked) or to replace the batch. Used on the
 * start page and in the session panel.
 */
import { useRef, useState } from 'react';
import { useServices, useSessionSnapshot } from '../state/SessionContext';
import type { ImportPlan } from '../persist/planImport';
import type { SessionFile } from '../persist/sessionFile';

export function SessionLoader({ onLoaded }: { onLoaded?: () => void }) {
  const { session } = useServices();
  const snap = useSessionSnapshot();
  const [status, setStatus] = useState<string | null>(null);
  const [problems, setProblems] = useState<string[]>([]);
  /** A checked file waiting for the reviewer's choice: merge or replace, and which conflicts to take. */
  const [waiting, setWaiting] = useState<{ text: string; name: string; plan: ImportPlan; entries: number; team?: SessionFile['team'] } | null>(null);
  const [mode, setMode] = useState<'merge' | 'replace'>('merge');
  const [take, setTake] = useState<Set<string>>(new Set());
  const fileInput = useRef<HTMLInputElement>(null);

  const apply = async (p: ImportPlan, chosen: ReadonlySet<string>) => {
    await session.applyImport(p, chosen);
    setWaiting(null);
    setStatus(
      `Loaded: ${p.newEntries.length} new spectra, ${p.decisions.length + chosen.size} decisions taken, ${p.unchanged} already the same` +
        (p.conflicts.length - chosen.size > 0 ? `, ${p.conflicts.length - chosen.size} of yours kept` : '') +
        '.',
    );
    onLoaded?.();
  };

  const readSessionFile = async (file: File) => {
    setProblems([]);
    setWaiting(null);
    setStatus(null);
    const text = await file.text();
    const planned = session.planSessionImport(text);
    if (!planned.ok) {
      setProblems(planned.problems);
      return;
    }
    if (snap.rows.length === 0) {
      // The packet's reviewer is set before the batch appears, so no decision is made under another name.
      await adoptPacket(planned.session.team);
      await apply(planned.plan, new Set());
      return;
    }
    setMode('merge');
    setTake(new Set());
    setWaiting({ text, name: file.name, plan: planned.plan, entries: planned.session.entries.length, team: planned.session.team });
  };

  /** A review packet (or a session saved from one) opened as the batch: remember the packet and whose it is. */
  const adoptPacket = async (team: SessionFile['team']) => {
    if (!team) return;
    await session.setTeamTag(team).catch(() => undefined);
    await session.setReviewer(team.reviewer);
  };

  const confirm = async () => {
    if (!waiting) return;
    if (mode === 'merge') return apply(waiting.plan, take);
    const done = await session.replaceWithSession(waiting.text);
    if (!done.ok) {
      setProblems(done.problems);
      setWaiting(null);
      return;
    }
    setWaiting(null);
    setStatus(`Replaced: the batch is now the file's ${done.plan.newEntries.length} spectra with ${done.plan.decisions.length} decisions.`);
    await adoptPacket(waiting.team);
    onLoaded?.();
  };

  const plan = waiting?.plan;
  return (
    <div className="session-loader">
      <button type="button" onClick={() => fileInput.current?.click()} data-testid="load-session">
        Load a session file or review packet…
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
      {waiting && plan && (
        <div className="conflicts" data-testid="import-choice">
          <p>
            {waiting.name} holds {waiting.entries} spectra; this browser has {snap.rows.length}.
          </p>
          {waiting.team && (
            <p className="caution" data-testid="packet-hint">
              This is a review packet for {waiting.team.reviewer}. To review it as {waiting.team.reviewer}, choose Replace (or open it in a browser
              profile of its own); merged into this batch it is only more spectra.
            </p>
          )}
          <label className="radio">
            <input type="radio" name="load-mode" checked={mode === 'merge'} onChange={() => setMode('merge')} /> Merge: add its {plan.newEntries.length} new spectra and
            its decisions to the batch here
          </label>
          <label className="radio">
            <input type="radio" name="load-mode" checked={mode === 'replace'} onChange={() => setMode('replace')} data-testid="load-replace" /> Replace: forget
            the {snap.rows.length} spectra here and their decisions, then load the file (save the session first if you need it)
          </label>
          {mode === 'merge' && plan.conflicts.length > 0 && (
            <div data-testid="import-conflicts">
              <p>
                {plan.conflicts.length} spectra have a decision here that is newer than (or differs from) the one in the file. Yours are kept unless you
                tick them:
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
            </div>
          )}
          <button type="button" className="primary" onClick={() => void confirm()} data-testid="load-confirm">
            {mode === 'merge' ? 'Merge' : 'Replace'}
          </button>{' '}
          <button type="button" onClick={() => setWaiting(null)}>
            Cancel
          </button>
        </div>
      )}
      {status && (
        <p role="status" data-testid="load-status">
          {status}
        </p>
      )}
    </div>
  );
}
