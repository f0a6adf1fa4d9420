/**
 * The team review screen: make packets from the batch here; merge the
 * reviewers' saved sessions; walk the disagreements (filter, j/k, number
 * keys take a reviewer's verdict) and settle them; statistics; export.
 */
import { ChoiceSelect } from '../controls/ChoiceSelect';
import { useEffect, useMemo, useRef, useState } from 'react';
import { useServices, useSessionSnapshot } from '../state/SessionContext';
import { PacketMaker } from './PacketMaker';
import { StatsView } from './StatsView';
import { VerdictTable } from './VerdictTable';
import { SettlePane } from './SettlePane';
import { TeamExport } from './TeamExport';
import { useMergeWork } from './useMergeWork';
import './team.css';

export type TeamFilter = 'all' | 'disagree' | 'open';
const FILTERS: { id: TeamFilter; label: string }[] = [
  { id: 'open', label: 'Open disagreements' },
  { id: 'disagree', label: 'All disagreements' },
  { id: 'all', label: 'Every spectrum' },
];

function isTyping(t: EventTarget | null): boolean {
  const el = t as HTMLElement | null;
  return !!el && (el.tagName === 'TEXTAREA' || el.tagName === 'SELECT' || (el.tagName === 'INPUT' && !['checkbox', 'radio', 'button'].includes((el as HTMLInputElement).type)));
}

export function TeamView() {
  const { session } = useServices();
  const snap = useSessionSnapshot();
  const state = useMergeWork(session);
  const [filter, setFilter] = useState<TeamFilter>('open');
  const [currentId, setCurrentId] = useState<string | null>(null);
  const [loadNote, setLoadNote] = useState<{ added: string[]; refused: string[] } | null>(null);
  const [toleranceText, setToleranceText] = useState<string | null>(null);
  const fileInput = useRef<HTMLInputElement>(null);
  const { merged, consensus, stats, work } = state;
  const tag = session.teamTag();

  const files = useMemo(() => new Map((merged?.spectra ?? []).map((s) => [s.id, s.file])), [merged]);
  const reviewers = useMemo(() => [...new Set((merged?.verdicts ?? []).filter((v) => v.counted).map((v) => v.reviewer))].sort(), [merged]);
  const shown = useMemo(
    () => consensus.filter((c) => filter === 'all' || (c.state === 'disagree' && (filter === 'disagree' || !c.settlement))),
    [consensus, filter],
  );
  const current = consensus.find((c) => c.id === currentId) ?? null;

  // Keep something open: the first shown spectrum when the current one left the view.
  useEffect(() => {
    if (currentId && shown.some((c) => c.id === currentId)) return;
    if (currentId && current && filter === 'open' && current.settlement) return; // just settled: stays until the next key
    setCurrentId(shown[0]?.id ?? null);
  }, [shown, currentId, current, filter]);

  const move = (step: number) => {
    if (!shown.length) return;
    const i = shown.findIndex((c) => c.id === currentId);
    const j = i < 0 ? 0 : Math.max(0, Math.min(shown.length - 1, i + step));
    setCurrentId(shown[j].id);
  };

  const nextOpen = (after: string | null) => {
    const open = consensus.filter((c) => c.state === 'disagree' && !c.settlement && c.id !== after);
    const i = consensus.findIndex((c) => c.id === after);
    return open.find((c) => consensus.indexOf(c) > i) ?? open[0] ?? null;
  };

  const settle = async (s: Parameters<typeof state.settle>[0]) => {
    await state.settle(s);
    const n = nextOpen(s.id);
    if (n) setCurrentId(n.id);
  };

  useEffect(() => {
    const onKey = (e: KeyboardEvent) => {
      if (e.defaultPrevented || isTyping(e.target) || e.ctrlKey || e.metaKey || e.altKey) return;
      if (e.key === 'j') move(1);
      else if (e.key === 'k') move(-1);
      else if (e.key === 'n') {
        const n = nextOpen(currentId);
        if (n) setCurrentId(n.id);
      } else if (/^[1-9]$/.test(e.key) && current && work.arbiter) {
        const v = current.verdicts[Number(e.key) - 1];
        if (!v) return;
        void settle({ id: current.id, arbiter: work.arbiter, settledAt: new Date().toISOString(), picked: v.reviewer, decision: { ...v.decision } });
      } else return;
      e.preventDefault();
    };
    window.addEventListener('keydown', onKey);
    return () => window.removeEventListener('keydown', onKey);
  });

  const readFiles = async (list: FileList) => {
    const texts = await Promise.all([...list].map(async (f) => ({ name: f.name, text: await f.text() })));
    setLoadNote(await state.addFiles(texts));
  };

  return (
    <main className="team-view" data-testid="team-view">
      <h2>Team review</h2>
      {tag && (
        <p className="banner banner-note" data-testid="packet-banner">
          This batch is the review packet of batch {tag.batchId} for {tag.reviewer} ({tag.spectra.length} spectra). Review as usual, then save the
          session (Session panel) and send the file back.
        </p>
      )}
      <details open={!merged && !tag && snap.rows.length > 0}>
        <summary>
          <h3>Make review packets</h3>
        </summary>
        <PacketMaker />
      </details>
      <section>
        <h3>Merge the reviewers&apos; work</h3>
        <div className="drop-buttons">
          <button type="button" onClick={() => fileInput.current?.click()} disabled={!state.loaded} data-testid="merge-load">
            Add reviewers&apos; session files or catalogue exports…
          </button>
          <input
            ref={fileInput}
            type="file"
            multiple
            hidden
            accept=".json,.csv,application/json,text/csv"
            aria-label="Reviewer session files"
            onChange={(e) => {
              if (e.currentTarget.files?.length) void readFiles(e.currentTarget.files);
              e.currentTarget.value = '';
            }}
          />
          {merged && (
            <button type="button" onClick={() => window.confirm('Forget the merge and every settlement in this browser? Save the merge first if you need it.') && void state.clear()}>
              Start the merge again…
            </button>
          )}
        </div>
        {loadNote && (
          <div role="status" data-testid="merge-note">
            {loadNote.added.length > 0 && <p>Merged: {loadNote.added.join(', ')}.</p>}
            {loadNote.refused.length > 0 && (
              <div role="alert" className="error-text">
                <p>Not merged:</p>
                <ul>
                  {loadNote.refused.map((r, i) => (
                    <li key={i}>{r}</li>
                  ))}
                </ul>
              </div>
            )}
          </div>
        )}
        {merged && (
          <p className="muted small" data-testid="merge-sources">
            Batch {merged.batchId}: {merged.sources.map((s) => `${s.name} (${s.reviewer}, ${s.verdicts} verdicts)`).join('; ')}.
          </p>
        )}
        <label>
          Arbiter{' '}
          <input value={work.arbiter} onChange={(e) => void state.setArbiter(e.target.value)} aria-label="Arbiter name" placeholder="your name" />
        </label>{' '}
        <label>
          Same redshift when |dz|/(1+z) &lt;{' '}
          <input
            value={toleranceText ?? String(work.tolerance)}
            size={6}
            onChange={(e) => setToleranceText(e.target.value)}
            onBlur={() => {
              const t = Number(toleranceText);
              if (toleranceText !== null && t > 0 && t < 1) void state.setTolerance(t);
              setToleranceText(null);
            }}
            aria-label="Redshift tolerance"
          />
        </label>
      </section>
      {stats && (
        <section>
          <h3>Agreement</h3>
          <StatsView stats={stats} />
        </section>
      )}
      {merged && (
        <section>
          <h3>Verdicts side by side</h3>
          <div className="toolbar">
            <ChoiceSelect label="Show" ariaLabel="Team filter" choices={FILTERS} value={filter} onChange={setFilter} />
            <span className="muted small">
              <kbd>j</kbd>/<kbd>k</kbd> next / previous, <kbd>n</kbd> next open disagreement, <kbd>1</kbd>-<kbd>9</kbd> take that reviewer&apos;s verdict
            </span>
            <span className="muted" data-testid="team-shown">
              {shown.length} shown
            </span>
          </div>
          {current && <SettlePane key={current.id} item={current} file={files.get(current.id) ?? current.id} arbiter={work.arbiter.trim()} onSettle={(s) => void settle(s)} />}
          {!shown.length && <p className="muted" data-testid="team-none">No spectrum in this view{filter === 'open' ? ': every disagreement is settled' : ''}.</p>}
          <VerdictTable items={shown} files={files} reviewers={reviewers} currentId={currentId} onSelect={setCurrentId} />
        </section>
      )}
      {merged && (
        <section>
          <h3>Export</h3>
          <TeamExport state={state} />
        </section>
      )}
    </main>
  );
}
