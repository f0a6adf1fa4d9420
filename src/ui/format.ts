/** Number and label formatting shared by the screens (display only; exports format in core/table). */
import type { ReviewState } from '../core/types';
import type { RowStatus } from './state/session';

export function fmtZ(z: number | null | undefined, digits = 4): string {
  return z === null || z === undefined || !Number.isFinite(z) ? '—' : z.toFixed(digits);
}

export function fmtNum(x: number | null | undefined, digits = 2): string {
  return x === null || x === undefined || !Number.isFinite(x) ? '—' : x.toFixed(digits);
}

/** Wavelength range, Angstrom, whole numbers. */
export function fmtRangeA(min: number | undefined, max: number | undefined): string {
  return min !== undefined && max !== undefined && Number.isFinite(min) && Number.isFinite(max) ? `${Math.round(min)}–${Math.round(max)} Å` : '—';
}

export const REVIEW_LABEL: Record<ReviewState, string> = {
  unreviewed: 'not reviewed',
  accepted: 'accepted',
  changed: 'changed',
  rejected: 'unusable',
};

/** A shape per state so the state never rests on colour alone. */
export const REVIEW_MARK: Record<ReviewState, string> = {
  unreviewed: '○',
  accepted: '●',
  changed: '◆',
  rejected: '✕',
};

export const STATUS_LABEL: Record<RowStatus, string> = {
  waiting: 'waiting',
  fitting: 'fitting…',
  ok: 'fitted',
  failed: 'failed',
  timeout: 'timed out',
  cancelled: 'not fitted',
};
