/**
 * Over 400 lines on purpose: the screen's key handling and panel switching are
 * one state machine; the panels themselves are separate components.
 *
 * The review screen: the list on the left, the current spectrum on the
 * right, panels over both. One keyboard handler drives the whole loop
 * (KEY_MAP); keys typed into a text field stay there.
 */
import React, { useCallback, useEffect, useMemo, useRef, useState } from 'react';
import type { ReviewDecision } from '../../core/types';
import { useServices, useSessionSnapshot } from '../state/SessionContext';
import { SpectrumList } from '../list/SpectrumList';
import { ChoiceSelect } from '../controls/ChoiceSelect';
import { FILTERS, SORTS, bulkAcceptable, cycle, findByName, isFailure, nextUnreviewed, reviewState, viewRows, type ListFilter, type ListSort } from '../list/listView';
import { bulkAcceptDraft } from '../review/solution';
import type { Row } from '../state/session';
import { actionForKey, keyFor } from '../keys/keyMap';
import { ReviewPanel, type ReviewHandle } from '../review/ReviewPanel';
import type { DecisionDraft } from '../review/solution';
import { HelpOverlay } from '../panels/HelpOverlay';
import { CosmologyPanel } from '../panels/CosmologyPanel';
import { ReviewerNameDialog } from '../panels/ReviewerNameDialog';
import { ExportPanel } from '../export/ExportPanel';
import { SessionPanel } from '../panels/SessionPanel';
import type { Collected } from '../intake/collectFiles';
import { Overlay } from '../panels/Overlay';

type PanelId = 'help' | 'export' | 'cosmology' | 'session' | null;

export interface WorkbenchProps {
  onCollected: (c: Collected) => void;
  onDemo: () => void;
  onExportSession: () => void;
}

/** "30 high, 10 medium, 4 low" for a confirmation. */
function gradeBreakdown(rows: readonly Row[]): string {
  const n = new Map<string, number>();
  for (const r of rows) {
    const g = r.summary?.confidence ?? 'none';
    n.set(g, (n.get(g) ?? 0) + 1);
  }
  return ['high', 'medium', 'low', 'none']
    .filter((g) => n.has(g))
    .map((g) => `${n.get(g)} ${g}`)
    .join(', ');
}

/** The list keeps at least 280 px, the review panel at least 480 px. */
export function clampListWidth(px: number, bodyPx: number): number {
  return Math.round(Math.max(280, Math.min(px, Math.max(280, bodyPx - 480))));
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
  // The place saved by the last page: filter, order and the open spectrum come back after a reload.
  const [saved] = useState(() => session.savedView());
  const [filter, setFilter] = useState<ListFilter>(() => (FILTERS.some((f) => f.id === saved?.filter) ? (saved!.filter as ListFilter) : 'all'));
  const [sort, setSort] = useState<ListSort>(() => (SORTS.some((s) => s.id === saved?.sort) ? (saved!.sort as ListSort) : 'batch'));
  const [currentKey, setCurrentKey] = useState<string | null>(() => (saved?.currentKey && session.row(saved.currentKey) ? saved.currentKey : null));
  const [panel, setPanel] = useState<PanelId>(null);
  const [pending, setPending] = useState<DecisionDraft | null>(null);
  const [allDone, setAllDone] = useState(false);
  const reviewRef = useRef<ReviewHandle>(null);
  const jumpInput = useRef<HTMLInputElement>(null);
  const [jumpText, setJumpText] = useState('');
  const [jumpNote, setJumpNote] = useState<string | null>(null);
  const [listWidthPx, setListWidthPx] = useState<number | null>(() => (typeof saved?.listWidthPx === 'number' ? saved.listWidthPx : null));
  const [confirmRemove, setConfirmRemove] = useState(false);
  /** Rows a bulk accept is about to take (the confirmation is open), and the last bulk step (for its undo). */
  const [bulkAsk, setBulkAsk] = useState<Row[] | null>(null);
  const [bulkNeedsName, setBulkNeedsName] = useState<Row[] | null>(null);
  const [lastBulk, setLastBulk] = useState<{ keys: string[]; decidedAt: string } | null>(null);

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

  useEffect(() => {
    session.saveView({ filter, sort, currentKey, listWidthPx: listWidthPx ?? undefined });
  }, [session, filter, sort, currentKey, listWidthPx]);

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

  /** Jump to the next spectrum whose id or file contains the text; outside the view, the filter opens up to all. */
  const jump = useCallback(() => {
    const inView = findByName(rows, jumpText, currentKey);
    const hit = inView ?? findByName(snap.rows, jumpText, currentKey);
    if (!hit) {
      setJumpNote(jumpText.trim() ? `No spectrum matches "${jumpText.trim()}".` : null);
      return;
    }
    if (!inView) setFilter('all');
    setJumpNote(null);
    choose(hit.key);
  }, [rows, snap.rows, jumpText, currentKey, choose]);

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

  const runBulk = useCallback(
    async (take: readonly Row[], reviewer: string) => {
      const decidedAt = new Date().toISOString();
      const items = take
        .filter((r) => r.summary && r.summary.status === 'ok')
        .map((r) => ({ key: r.key, decision: { ...bulkAcceptDraft(r.file, r.summary!), reviewer, decidedAt } satisfies ReviewDecision }));
      await session.decideMany(items).catch(() => undefined);
      setLastBulk({ keys: items.map((i) => i.key), decidedAt });
    },
    [session],
  );

  const undoBulk = useCallback(async () => {
    if (!lastBulk) return;
    // Only decisions the step made and nobody changed since.
    const keys = lastBulk.keys.filter((k) => session.row(k)?.decision?.decidedAt === lastBulk.decidedAt);
    setLastBulk(null);
    await session.reopenMany(keys).catch(() => undefined);
  }, [lastBulk, session]);

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
      if (panel || pending || bulkAsk || bulkNeedsName) return; // an open panel has the keyboard (Escape closes it)
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
        case 'jump':
          jumpInput.current?.focus();
          jumpInput.current?.select();
          break;
        default:
          used = reviewRef.current?.handle(action, e.key) ?? false;
      }
      if (used) e.preventDefault();
    };
    window.addEventListener('keydown', onKey);
    return () => window.removeEventListener('keydown', onKey);
  }, [panel, pending, bulkAsk, bulkNeedsName, move, goNextUnreviewed]);

  // Files that could not be read or fitted are not counted as work to review (unless someone decided on them).
  const counts = useMemo(() => {
    let reviewed = 0;
    let failed = 0;
    let total = 0;
    for (const r of snap.rows) {
      const decided = reviewState(r) !== 'unreviewed';
      if (isFailure(r)) failed++;
      if (decided) reviewed++;
      if (decided || !isFailure(r)) total++;
    }
    return { reviewed, total, failed };
  }, [snap.rows]);
  const failedKeys = useMemo(() => snap.rows.filter((r) => isFailure(r) && reviewState(r) === 'unreviewed').map((r) => r.key), [snap.rows]);

  const startResize = (e: React.PointerEvent<HTMLDivElement>) => {
    const body = e.currentTarget.parentElement;
    if (!body) return;
    const left = body.getBoundingClientRect().left;
    const move = (ev: PointerEvent) => setListWidthPx(clampListWidth(ev.clientX - left, body.clientWidth));
    const up = () => {
      window.removeEventListener('pointermove', move);
      window.removeEventListener('pointerup', up);
    };
    window.addEventListener('pointermove', move);
    window.addEventListener('pointerup', up);
    e.preventDefault();
  };

  return (
    <main className="workbench">
      <div className="toolbar" role="toolbar" aria-label="Workbench">
        <ChoiceSelect label="Show" ariaLabel="Filter" choices={FILTERS} value={filter} onChange={setFilter} />
        <ChoiceSelect label="Order" ariaLabel="Order" choices={SORTS} value={sort} onChange={setSort} />
        <form
          className="inline-form jump-form"
          onSubmit={(e) => {
            e.preventDefault();
            jump();
          }}
        >
          <label>
            Go to{' '}
            <input ref={jumpInput} value={jumpText} onChange={(e) => setJumpText(e.target.value)} placeholder="id or file name" aria-label="Jump to a spectrum by name" />
          </label>
          <kbd>/</kbd>
        </form>
        <span className="muted" data-testid="review-counts">
          {counts.reviewed} of {counts.total} reviewed · {rows.length} shown{counts.failed ? ` · ${counts.failed} could not be read or fitted` : ''}
        </span>
        {bulkAcceptable(rows).length > 0 && (
          <button type="button" onClick={() => setBulkAsk(bulkAcceptable(rows))} data-testid="bulk-accept">
            Accept all shown…
          </button>
        )}
        {failedKeys.length > 0 &&
          (confirmRemove ? (
            <span className="confirm" role="group" aria-label="Confirm removal">
              Remove {failedKeys.length} failed files from the batch?{' '}
              <button
                type="button"
                onClick={() => {
                  setConfirmRemove(false);
                  void session.removeFiles(failedKeys).catch(() => undefined);
                }}
              >
                Remove
              </button>{' '}
              <button type="button" onClick={() => setConfirmRemove(false)}>
                Keep
              </button>
            </span>
          ) : (
            <button type="button" onClick={() => setConfirmRemove(true)} data-testid="remove-failed">
              Remove failed files ({failedKeys.length})
            </button>
          ))}
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
      {lastBulk && (
        <p className="banner banner-note" role="status" data-testid="bulk-done">
          Accepted {lastBulk.keys.length} automatic redshifts in one step.{' '}
          <button type="button" onClick={() => void undoBulk()} data-testid="bulk-undo">
            Undo this step
          </button>{' '}
          <button type="button" onClick={() => setLastBulk(null)}>
            Dismiss
          </button>
        </p>
      )}
      {jumpNote && (
        <p className="banner banner-note" role="status" data-testid="jump-note">
          {jumpNote}
        </p>
      )}
      {allDone && (
        <p className="banner banner-note" role="status" data-testid="all-reviewed">
          No spectrum in this view is left to review.
        </p>
      )}
      <div className="workbench-body" style={listWidthPx ? ({ '--list-width': `${listWidthPx}px` } as React.CSSProperties) : undefined}>
        <SpectrumList rows={rows} currentKey={currentKey} onSelect={choose} />
        <div
          className="list-splitter"
          role="separator"
          aria-orientation="vertical"
          aria-label="Width of the list (drag, or arrow keys)"
          aria-valuenow={listWidthPx ?? undefined}
          tabIndex={0}
          onPointerDown={startResize}
          onDoubleClick={() => setListWidthPx(null)}
          onKeyDown={(e) => {
            if (e.key !== 'ArrowLeft' && e.key !== 'ArrowRight') return;
            const body = e.currentTarget.parentElement;
            const now = listWidthPx ?? e.currentTarget.previousElementSibling?.getBoundingClientRect().width ?? 480;
            setListWidthPx(clampListWidth(now + (e.key === 'ArrowRight' ? 40 : -40), body?.clientWidth ?? 1400));
            e.preventDefault();
          }}
          data-testid="list-splitter"
        />
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
      {bulkAsk && (
        <Overlay title="Accept all shown" onClose={() => setBulkAsk(null)} testId="bulk-confirm">
          <p>
            Accept the automatic redshift of <strong data-testid="bulk-count">{bulkAsk.length}</strong> spectra in this view ({FILTERS.find((f) => f.id === filter)?.label.toLowerCase()}), without opening them one by one?
          </p>
          <p className="muted">Machine grades: {gradeBreakdown(bulkAsk)}.</p>
          <p className="caution">Each is recorded as accepted by you, with a note that it was accepted in a bulk step. You can undo the whole step right after.</p>
          <div className="decision-buttons">
            <button
              type="button"
              className="primary"
              data-testid="bulk-confirm-accept"
              onClick={() => {
                const take = bulkAsk;
                setBulkAsk(null);
                if (snap.reviewer) void runBulk(take, snap.reviewer);
                else setBulkNeedsName(take);
              }}
            >
              Accept {bulkAsk.length}
            </button>
            <button type="button" onClick={() => setBulkAsk(null)}>
              Cancel
            </button>
          </div>
        </Overlay>
      )}
      {bulkNeedsName && (
        <ReviewerNameDialog
          onCancel={() => setBulkNeedsName(null)}
          onSubmit={(name) => {
            const take = bulkNeedsName;
            setBulkNeedsName(null);
            void session.setReviewer(name).then(() => runBulk(take, name));
          }}
        />
      )}
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
