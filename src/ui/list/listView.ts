/**
 * Which rows the list shows and in what order. Pure functions over the
 * session's rows, so a 10,000-row batch is filtered and sorted without
 * touching the DOM, and tested directly.
 */
import type { Row } from '../state/session';
import type { Grade, ReviewState } from '../../core/types';
import { flagsOf } from '../review/flags';

export type ListFilter = 'all' | 'unreviewed' | 'unreviewedHigh' | 'reviewed' | 'flagged' | 'failures';
export type ListSort = 'batch' | 'lowConfidence' | 'redshift' | 'snr' | 'name';

export const FILTERS: readonly { id: ListFilter; label: string }[] = [
  { id: 'all', label: 'All spectra' },
  { id: 'unreviewed', label: 'Not yet reviewed' },
  { id: 'unreviewedHigh', label: 'Not yet reviewed, machine grade high' },
  { id: 'reviewed', label: 'Reviewed' },
  { id: 'flagged', label: 'Flagged by a reviewer' },
  { id: 'failures', label: 'Only failures' },
];

export const SORTS: readonly { id: ListSort; label: string }[] = [
  { id: 'batch', label: 'Order loaded' },
  { id: 'lowConfidence', label: 'Low machine grade first' },
  { id: 'redshift', label: 'Redshift' },
  { id: 'snr', label: 'Low S/N first' },
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

/** Full identity for a tooltip: object id (when the header gave one) and the file as given. */
export function fullName(row: Row): string {
  return row.summary?.objectId ? `${row.summary.objectId}\n${row.file}` : row.file;
}

/**
 * First row whose object id or file contains `text` (case-insensitive),
 * starting after `fromKey` and wrapping, so pressing Enter again finds the
 * next match. null when none.
 */
export function findByName(rows: readonly Row[], text: string, fromKey: string | null = null): Row | null {
  const t = text.trim().toLowerCase();
  if (!t) return null;
  const start = fromKey ? rows.findIndex((r) => r.key === fromKey) : -1;
  for (let i = 1; i <= rows.length; i++) {
    const r = rows[(start + i + rows.length) % rows.length];
    if ((r.summary?.objectId ?? '').toLowerCase().includes(t) || r.file.toLowerCase().includes(t)) return r;
  }
  return null;
}

/** Grades from least to most sure: the order of "low machine grade first". */
export const GRADE_ORDER: readonly Grade[] = ['none', 'low', 'medium', 'high'];

function matches(row: Row, filter: ListFilter): boolean {
  switch (filter) {
    case 'all':
      return true;
    case 'unreviewed':
      return reviewState(row) === 'unreviewed';
    case 'unreviewedHigh':
      return reviewState(row) === 'unreviewed' && row.status === 'ok' && row.summary?.status === 'ok' && row.summary.confidence === 'high';
    case 'reviewed':
      return reviewState(row) !== 'unreviewed';
    case 'flagged':
      return flagsOf(row.decision).length > 0;
    case 'failures':
      return isFailure(row);
  }
}

/** Machine grade rank (0 = none ... 3 = high); NaN for rows without a usable fit, which sort last. */
function gradeKey(row: Row): number {
  return row.summary && row.summary.status === 'ok' ? GRADE_ORDER.indexOf(row.summary.confidence) : NaN;
}

/** Machine score; NaN without a usable fit. */
function scoreKey(row: Row): number {
  return row.summary && row.summary.status === 'ok' ? row.summary.score : NaN;
}

/** Median S/N of the input; NaN when unknown. */
export function snrOf(row: Row): number {
  const v = row.summary?.medianSnr;
  return typeof v === 'number' && Number.isFinite(v) ? v : NaN;
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
      out.sort((a, b) => nanLast(gradeKey(a), gradeKey(b)) || nanLast(scoreKey(a), scoreKey(b)) || a.order - b.order);
      break;
    case 'redshift':
      out.sort((a, b) => nanLast(shownZ(a), shownZ(b)) || a.order - b.order);
      break;
    case 'snr':
      out.sort((a, b) => nanLast(snrOf(a), snrOf(b)) || a.order - b.order);
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

/** Rows a bulk accept would take: fitted, not yet reviewed, with an automatic redshift. */
export function bulkAcceptable(rows: readonly Row[]): Row[] {
  return rows.filter((r) => r.status === 'ok' && reviewState(r) === 'unreviewed' && r.summary?.status === 'ok' && Number.isFinite(r.summary.z));
}
