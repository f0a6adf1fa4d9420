/**
 * The batch as a virtualised grid: fixed row height, only the rows in view
 * (plus a few above and below) are in the DOM, so 10,000 rows scroll as
 * lightly as 10. The current row is kept in view when the keyboard moves it.
 */
import { useEffect, useLayoutEffect, useRef, useState, memo } from 'react';
import type { Row } from '../state/session';
import { displayName, fullName, isFailure, reviewState, shownZ, snrOf } from './listView';
import { fmtNum, fmtRangeA, fmtZ, REVIEW_LABEL, REVIEW_MARK, STATUS_LABEL } from '../format';
import { FLAGS, flagsOf } from '../review/flags';

/** Height of one row, CSS px (fixed: the virtualisation relies on it). */
export const ROW_HEIGHT_PX = 26;
/** Rows drawn beyond the visible ones on each side. */
export const OVERSCAN_ROWS = 8;
/** Viewport height used before layout is known (and in jsdom), CSS px. */
const FALLBACK_HEIGHT_PX = 520;

export interface SpectrumListProps {
  rows: readonly Row[];
  currentKey: string | null;
  onSelect: (key: string) => void;
}

/** Index range [first, last) of rows to draw for a scroll position; exported for tests. */
export function visibleRange(scrollTopPx: number, viewportPx: number, count: number, rowPx = ROW_HEIGHT_PX, overscan = OVERSCAN_ROWS): [number, number] {
  const first = Math.max(0, Math.floor(scrollTopPx / rowPx) - overscan);
  const last = Math.min(count, Math.ceil((scrollTopPx + viewportPx) / rowPx) + overscan);
  return [first, Math.max(first, last)];
}

const ListRow = memo(function ListRow({ row, index, current, onSelect }: { row: Row; index: number; current: boolean; onSelect: (key: string) => void }) {
  const state = reviewState(row);
  const failed = isFailure(row);
  const s = row.summary;
  const z = shownZ(row);
  const reviewedZ = state !== 'unreviewed';
  const error = s?.error;
  const flags = flagsOf(row.decision);
  const snr = snrOf(row);
  const machine = s?.status === 'ok' ? s.confidence : '';
  const yours = state !== 'unreviewed' ? (row.decision?.reviewerGrade ?? '') : '';
  return (
    <div
      role="row"
      aria-rowindex={index + 2}
      aria-selected={current}
      data-testid="spectrum-row"
      data-key={row.key}
      className={`list-row${current ? ' current' : ''}${failed ? ' failed' : ''}`}
      style={{ transform: `translateY(${index * ROW_HEIGHT_PX}px)` }}
      onClick={() => onSelect(row.key)}
      title={error ?? undefined}
    >
      <span role="gridcell" className="c-warn" aria-label={failed ? 'read or fit error' : undefined}>
        {failed ? '⚠' : ''}
      </span>
      <span role="gridcell" className="c-id" title={fullName(row)}>
        {displayName(row)}
      </span>
      <span role="gridcell" className="c-class">
        {reviewedZ && row.decision ? row.decision.class : s?.status === 'ok' ? s.class : ''}
      </span>
      <span role="gridcell" className={`c-z${reviewedZ ? '' : ' auto'}`} title={reviewedZ ? 'reviewed redshift' : 'automatic redshift, not reviewed'}>
        {fmtZ(z)}
      </span>
      <span role="gridcell" className={`c-conf conf-${machine || 'none'}`} title="machine grade (automatic fit)">
        {machine}
      </span>
      <span role="gridcell" className="c-yours" title="your grade">
        {yours}
      </span>
      <span role="gridcell" className={`c-review review-${state}`} title={flags.length ? `flags: ${flags.map((f) => FLAGS.find((d) => d.id === f)!.label).join('; ')}` : undefined}>
        {row.status === 'ok' || row.decision ? `${REVIEW_MARK[state]} ${REVIEW_LABEL[state]}` : STATUS_LABEL[row.status]}
        {flags.length ? <span className="flag-mark" aria-label={`${flags.length} flags`}> ⚑{flags.length}</span> : null}
      </span>
      <span role="gridcell" className="c-snr" title="median S/N per pixel">
        {Number.isFinite(snr) ? fmtNum(snr, 1) : ''}
      </span>
      <span role="gridcell" className="c-range">
        {failed ? (
          <span className="row-error">{error}</span>
        ) : s ? (
          <>
            <span>{fmtRangeA(s.lambdaMinA, s.lambdaMaxA)}</span>
            {s.nPix > 0 ? <span className="muted"> · {s.nPix} px</span> : null}
          </>
        ) : (
          ''
        )}
      </span>
    </div>
  );
});

export function SpectrumList({ rows, currentKey, onSelect }: SpectrumListProps) {
  const box = useRef<HTMLDivElement>(null);
  const [scrollTop, setScrollTop] = useState(0);
  const [viewport, setViewport] = useState(FALLBACK_HEIGHT_PX);

  useLayoutEffect(() => {
    const el = box.current;
    if (!el) return;
    const measure = () => setViewport(el.clientHeight > 0 ? el.clientHeight : FALLBACK_HEIGHT_PX);
    measure();
    if (typeof ResizeObserver === 'undefined') return;
    const ro = new ResizeObserver(measure);
    ro.observe(el);
    return () => ro.disconnect();
  }, []);

  // Keep the current row in view when it moves by keyboard or after a decision.
  const currentIndex = currentKey ? rows.findIndex((r) => r.key === currentKey) : -1;
  useEffect(() => {
    const el = box.current;
    if (!el || currentIndex < 0) return;
    const top = currentIndex * ROW_HEIGHT_PX;
    const view = el.clientHeight > 0 ? el.clientHeight : viewport;
    if (top < el.scrollTop) el.scrollTop = top;
    else if (top + ROW_HEIGHT_PX > el.scrollTop + view) el.scrollTop = top + ROW_HEIGHT_PX - view;
    setScrollTop(el.scrollTop);
  }, [currentIndex, viewport]);

  const [first, last] = visibleRange(scrollTop, viewport, rows.length);
  const drawn = [];
  for (let i = first; i < last; i++) {
    const r = rows[i];
    drawn.push(<ListRow key={r.key} row={r} index={i} current={r.key === currentKey} onSelect={onSelect} />);
  }

  return (
    <div className="spectrum-list" role="grid" aria-label="Spectra" aria-rowcount={rows.length + 1} data-testid="spectrum-list">
      <div role="row" aria-rowindex={1} className="list-row list-head">
        <span role="columnheader" className="c-warn" aria-label="warning" />
        <span role="columnheader" className="c-id">id</span>
        <span role="columnheader" className="c-class">class</span>
        <span role="columnheader" className="c-z">z</span>
        <span role="columnheader" className="c-conf" title="machine grade of the automatic fit">auto</span>
        <span role="columnheader" className="c-yours" title="the reviewer's grade">yours</span>
        <span role="columnheader" className="c-review">review</span>
        <span role="columnheader" className="c-snr" title="median S/N per pixel">S/N</span>
        <span role="columnheader" className="c-range">range, pixels / error</span>
      </div>
      <div className="list-body" ref={box} onScroll={(e) => setScrollTop(e.currentTarget.scrollTop)} data-testid="spectrum-list-body">
        <div className="list-spacer" style={{ height: rows.length * ROW_HEIGHT_PX }}>
          {drawn}
        </div>
        {rows.length === 0 && <p className="list-empty">No spectra match this filter.</p>}
      </div>
    </div>
  );
}
