/**
 * The review screen: the list on the left, the current spectrum on the
 * right, panels over both. One keyboard handler drives the whole loop
 * (KEY_MAP); keys typed into a text field stay there.
 */
import { useCallback, useEffect, useMemo, useRef, useState } from 'react';
import type { ReviewDecision } from '../../core/types';
import { useServices, useSessionSnapshot } from '../state/SessionContext';
import { SpectrumList } from '../list/SpectrumList';
import { FILTERS, SORTS, cycle, nextUnreviewed, reviewState, viewRows, type ListFilter, type ListSort } from '../list/listView';
import { actionForKey, keyFor } from '../keys/keyMap';
import { ReviewPanel, type ReviewHandle } from '../review/ReviewPanel';
import type { DecisionDraft } from '../review/solution';
import { HelpOverlay } from '../panels/HelpOverlay';
import { CosmologyPanel } from '../panels/CosmologyPanel';
import { ReviewerNameDialog } from '../panels/ReviewerNameDialog';
import { ExportPanel } from '../export/ExportPanel';
import { SessionPanel } from '../panels/SessionPanel';
import type { Collected } from '../intake/collectFiles';

type PanelId = 'help' | 'export' | 'cosmology' | 'session' | null;

export interface WorkbenchProps {
  onCollected: (c: Collected) => void;
  onDemo: () => void;
  onExportSession: () => void;
}

function isTextTarget(t: EventTarget | null): boolean {
  const el = t as HTMLElement | null;
  if (!el || !el.tagName) return false;
  const tag = el.tagName;
  if (tag === 'TEXTAREA' || tag === 'SELECT' || el.isContentEditable) return true;
  if (tag !== 'INPUT') return false;
  const type = (el as HTMLInputElement).type;
  return !['checkbox', 'radio', 'button', 'submit', 'range'].includes(type);
}

export function Workbench({ onCollected, onDemo, onExportSession }: WorkbenchProps) {
  const { session } = useServices();
  const snap = useSessionSnapshot();
  const [filter, setFilter] = useState<ListFilter>('all');
  const [sort, setSort] = useState<ListSort>('batch');
  const [currentKey, setCurrentKey] = useState<string | null>(null);
  const [panel, setPanel] = useState<PanelId>(null);
  const [pending, setPending] = useState<DecisionDraft | null>(null);
  const [allDone, setAllDone] = useState(false);
  const reviewRef = useRef<ReviewHandle>(null);

  const rows = useMemo(() => viewRows(snap.rows, filter, sort), [snap.rows, filter, sort]);
  const current = currentKey ? session.row(currentKey) ?? null : null;
  // Read the row from the snapshot so that a new decision re-renders the panel.
  const currentRow = useMemo(() => (currentKey ? snap.rows.find((r) => r.key === currentKey) ?? null : null), [snap.rows, currentKey]);

  // Open something at the start and whenever the current row leaves the view.
  // A row opened automatically while the batch is still fitting gives way to
  // the first fitted one; a row the reviewer chose stays.
  const autoPicked = useRef(false);
  useEffect(() => {
    if (currentKey && current && !(autoPicked.current && current.status !== 'ok' && filter !== 'failures')) return;
    const first = nextUnreviewed(rows, null, filter === 'failures') ?? (currentKey && current ? null : rows[0]) ?? null;
    if (first && first.key !== currentKey) {
      autoPicked.current = true;
      setCurrentKey(first.key);
    }
  }, [rows, currentKey, current, filter]);

  const choose = useCallback((key: string) => {
    autoPicked.current = false;
    setCurrentKey(key);
  }, []);

  const move = useCallback(
    (step: number) => {
      if (!rows.length) return;
      const i = rows.findIndex((r) => r.key === currentKey);
      const j = Math.max(0, Math.min(rows.length - 1, (i < 0 ? 0 : i) + step));
      choose(rows[j].key);
    },
    [rows, currentKey, choose],
  );

  const goNextUnreviewed = useCallback(() => {
    const n = nextUnreviewed(rows, currentKey, filter === 'failures');
    if (n) {
      choose(n.key);
      setAllDone(false);
    } else setAllDone(true);
  }, [rows, currentKey, filter, choose]);

  const store = useCallback(
    async (draft: DecisionDraft, reviewer: string) => {
      if (!currentKey) return;
      const key = currentKey;
      // Choose the next spectrum before the list changes under the filter.
      const next = nextUnreviewed(rows, key, filter === 'failures');
      const decision: ReviewDecision = { ...draft, reviewer, decidedAt: new Date().toISOString() };
      try {
        await session.decide(key, decision);
      } catch {
        /* the banner reports it; the decision is kept in memory */
      }
      if (next) {
        choose(next.key);
        setAllDone(false);
      } else setAllDone(true);
    },
    [currentKey, rows, session, filter, choose],
  );

  const onDecision = useCallback(
    (draft: DecisionDraft) => {
      if (!snap.reviewer) setPending(draft);
      else void store(draft, snap.reviewer);
    },
    [snap.reviewer, store],
  );

  useEffect(() => {
    const onKey = (e: KeyboardEvent) => {
      if (e.defaultPrevented) return;
      const action = actionForKey(e);
      if (panel === 'help' && action === 'help') {
        setPanel(null);
        e.preventDefault();
        return;
      }
      if (panel || pending) return; // an open panel has the keyboard (Escape closes it)
      if (!action) return;
      if (isTextTarget(e.target)) {
        if (action === 'escape') (e.target as HTMLElement).blur();
        return;
      }
      // Enter on a focused button or link keeps its usual meaning.
      if (e.key === 'Enter' && (e.target as HTMLElement)?.closest?.('button, a, [role=listbox], [role=option]')) return;
      let used = true;
      switch (action) {
        case 'next':
          move(1);
          break;
        case 'previous':
          move(-1);
          break;
        case 'nextUnreviewed':
          goNextUnreviewed();
          break;
        case 'filter':
          setFilter((f) => cycle(FILTERS, f));
          break;
        case 'sort':
          setSort((s) => cycle(SORTS, s));
          break;
        case 'help':
          setPanel('help');
          break;
        case 'export':
          setPanel('export');
          break;
        case 'cosmology':
          setPanel('cosmology');
          break;
        case 'session':
          setPanel('session');
          break;
        default:
          used = reviewRef.current?.handle(action, e.key) ?? false;
      }
      if (used) e.preventDefault();
    };
    window.addEventListener('keydown', onKey);
    return () => window.removeEventListener('keydown', onKey);
  }, [panel, pending, move, goNextUnreviewed]);

  const counts = useMemo(() => {
    let reviewed = 0;
    for (const r of snap.rows) if (reviewState(r) !== 'unreviewed') reviewed++;
    return { reviewed, total: snap.rows.length };
  }, [snap.rows]);

  return (
    <main className="workbench">
      <div className="toolbar" role="toolbar" aria-label="Workbench">
        <label>
          Show{' '}
          <select value={filter} onChange={(e) => setFilter(e.target.value as ListFilter)} aria-label="Filter">
            {FILTERS.map((f) => (
              <option key={f.id} value={f.id}>
                {f.label}
              </option>
            ))}
          </select>
        </label>
        <label>
          Order{' '}
          <select value={sort} onChange={(e) => setSort(e.target.value as ListSort)} aria-label="Order">
            {SORTS.map((s) => (
              <option key={s.id} value={s.id}>
                {s.label}
              </option>
            ))}
          </select>
        </label>
        <span className="muted" data-testid="review-counts">
          {counts.reviewed} of {counts.total} reviewed · {rows.length} shown
        </span>
        <span className="spacer" />
        <button type="button" onClick={() => setPanel('session')}>
          Session <kbd>{keyFor('session')}</kbd>
        </button>
        <button type="button" onClick={() => setPanel('cosmology')}>
          Cosmology <kbd>{keyFor('cosmology')}</kbd>
        </button>
        <button type="button" onClick={() => setPanel('export')}>
          Export catalogue <kbd>{keyFor('export')}</kbd>
        </button>
        <button type="button" onClick={() => setPanel('help')} aria-label="Keys (help)">
          Keys <kbd>?</kbd>
        </button>
      </div>
      {allDone && (
        <p className="banner banner-note" role="status" data-testid="all-reviewed">
          No spectrum in this view is left to review.
        </p>
      )}
      <div className="workbench-body">
        <SpectrumList rows={rows} currentKey={currentKey} onSelect={choose} />
        {currentRow ? (
          <ReviewPanel
            key={currentRow.key}
            ref={reviewRef}
            row={currentRow}
            cosmology={snap.cosmology}
            onDecision={onDecision}
            onReopen={() => void session.reopen(currentRow.key).catch(() => undefined)}
          />
        ) : (
          <p className="muted review-empty">Choose a spectrum from the list.</p>
        )}
      </div>
      {panel === 'help' && <HelpOverlay onClose={() => setPanel(null)} />}
      {panel === 'cosmology' && (
        <CosmologyPanel
          value={snap.cosmology}
          onClose={() => setPanel(null)}
          onSave={(p) => {
            void session.setCosmology(p);
            setPanel(null);
          }}
        />
      )}
      {panel === 'export' && <ExportPanel onClose={() => setPanel(null)} />}
      {panel === 'session' && <SessionPanel onClose={() => setPanel(null)} onCollected={onCollected} onDemo={onDemo} onExportSession={onExportSession} />}
      {pending && (
        <ReviewerNameDialog
          onCancel={() => setPending(null)}
          onSubmit={(name) => {
            const draft = pending;
            setPending(null);
            void session.setReviewer(name).then(() => store(draft, name));
          }}
        />
      )}
    </main>
  );
}
