/**
 * Which rows the list shows and in what order. Pure functions over the
 * session's rows, so a 10,000-row batch is filtered and sorted without
 * touching the DOM, and tested directly.
 */
import type { Row } from '../state/session';
import type { ReviewState } from '../../core/types';

export type ListFilter = 'all' | 'unreviewed' | 'reviewed' | 'failures';
export type ListSort = 'batch' | 'lowConfidence' | 'redshift' | 'name';

export const FILTERS: readonly { id: ListFilter; label: string }[] = [
  { id: 'all', label: 'All spectra' },
  { id: 'unreviewed', label: 'Not yet reviewed' },
  { id: 'reviewed', label: 'Reviewed' },
  { id: 'failures', label: 'Only failures' },
];

export const SORTS: readonly { id: ListSort; label: string }[] = [
  { id: 'batch', label: 'Order loaded' },
  { id: 'lowConfidence', label: 'Low confidence first' },
  { id: 'redshift', label: 'Redshift' },
  { id: 'name', label: 'Name' },
];

export function reviewState(row: Row): ReviewState {
  return row.decision?.state ?? 'unreviewed';
}

/** Read or fit failed (time-outs included). */
export function isFailure(row: Row): boolean {
  return row.status === 'failed' || row.status === 'timeout';
}

/** The name the list shows: the header's object id, else the file's base name. */
export function displayName(row: Row): string {
  return row.summary?.objectId || row.file.slice(row.file.lastIndexOf('/') + 1);
}

function matches(row: Row, filter: ListFilter): boolean {
  switch (filter) {
    case 'all':
      return true;
    case 'unreviewed':
      return reviewState(row) === 'unreviewed';
    case 'reviewed':
      return reviewState(row) !== 'unreviewed';
    case 'failures':
      return isFailure(row);
  }
}

/** Machine score for ordering; rows without a usable fit sort after every fitted one. */
function scoreKey(row: Row): number {
  return row.summary && row.summary.status === 'ok' ? row.summary.score : Infinity;
}

/** Redshift shown for a row: the reviewer's when decided, else the automatic one. */
export function shownZ(row: Row): number {
  if (row.decision && row.decision.state !== 'unreviewed') return row.decision.z ?? NaN;
  return row.summary?.status === 'ok' ? row.summary.z : NaN;
}

function nanLast(a: number, b: number): number {
  const an = Number.isNaN(a), bn = Number.isNaN(b);
  if (an || bn) return an === bn ? 0 : an ? 1 : -1;
  return a - b;
}

export function viewRows(rows: readonly Row[], filter: ListFilter, sort: ListSort): Row[] {
  const out = rows.filter((r) => matches(r, filter));
  switch (sort) {
    case 'batch':
      out.sort((a, b) => a.order - b.order);
      break;
    case 'lowConfidence':
      out.sort((a, b) => nanLast(scoreKey(a) === Infinity ? NaN : scoreKey(a), scoreKey(b) === Infinity ? NaN : scoreKey(b)) || a.order - b.order);
      break;
    case 'redshift':
      out.sort((a, b) => nanLast(shownZ(a), shownZ(b)) || a.order - b.order);
      break;
    case 'name':
      out.sort((a, b) => displayName(a).localeCompare(displayName(b), undefined, { numeric: true }) || a.order - b.order);
      break;
  }
  return out;
}

/**
 * The next row after `fromKey` (wrapping) that is fitted and not yet
 * reviewed, or null. Failures are skipped unless asked for (the 'only
 * failures' view): they can only be rejected, and would stall the loop.
 */
export function nextUnreviewed(rows: readonly Row[], fromKey: string | null, includeFailures = false): Row | null {
  const start = fromKey ? rows.findIndex((r) => r.key === fromKey) : -1;
  for (let i = 1; i <= rows.length; i++) {
    const r = rows[(start + i + rows.length) % rows.length];
    if (!r || r.key === fromKey || reviewState(r) !== 'unreviewed') continue;
    if (r.status === 'ok' || (includeFailures && isFailure(r))) return r;
  }
  return null;
}

export function cycle<T extends string>(list: readonly { id: T }[], current: T): T {
  const i = list.findIndex((x) => x.id === current);
  return list[(i + 1) % list.length].id;
}
