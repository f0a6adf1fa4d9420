/**
 * Pixels that are not sky-subtracted astrophysics, found before any fit:
 * runs of identical values (dead pixels, zero-filled ends, clipped detector
 * reads), the roll-off next to a dead end, cliffs at the ends, and flux far
 * below zero. Each found pixel is masked; the report says how many and why.
 */
import type { Spectrum } from '../types';
import { median } from '../numeric/median';

export interface MaskedReason {
  reason: 'identical-run' | 'roll-off' | 'edge' | 'edge-step' | 'negative';
  pixels: number;
}

/** Identical consecutive values this long are not data (noise never repeats a float exactly three times). */
export const IDENTICAL_RUN_MIN = 3;
/** Pixels masked inward of a dead run that touches an end: some spectrographs roll off over 35-70 pixels before their zero-filled ends (published/README.md and issue measurements). */
export const ROLL_OFF_PIX = 80;
/** Pixels always masked at each end of the good data (flat-field and extraction edges; common practice). */
export const EDGE_PIX = 10;
/** A step at an end: median of the last EDGE_STEP_PIX pixels against the EDGE_REF_PIX before them. */
export const EDGE_STEP_PIX = 30;
export const EDGE_REF_PIX = 150;
/** Flux below -NEGATIVE_SIGMA sigma cannot be astrophysical (over-subtracted sky, bad columns). */
export const NEGATIVE_SIGMA = 5;

export function findArtifacts(s: Spectrum): { bad: Uint8Array; report: MaskedReason[] } {
  const n = s.flux.length;
  const bad = new Uint8Array(n);
  const counts = new Map<MaskedReason['reason'], number>();
  const mark = (i: number, r: MaskedReason['reason']) => {
    if (bad[i] || s.mask[i]) return;
    bad[i] = 1;
    counts.set(r, (counts.get(r) ?? 0) + 1);
  };
  const usable = (i: number) => !s.mask[i] && Number.isFinite(s.flux[i]) && (s.ivar === null || s.ivar[i] > 0);
  // 1. runs of identical values
  const runs: [number, number][] = [];
  let i = 0;
  while (i < n) {
    let j = i + 1;
    while (j < n && s.flux[j] === s.flux[i]) j++;
    if (j - i >= IDENTICAL_RUN_MIN) runs.push([i, j - 1]);
    i = j;
  }
  for (const [a, b] of runs) for (let k = a; k <= b; k++) mark(k, 'identical-run');
  // the good span after step 1
  const firstGood = () => {
    let k = 0;
    while (k < n && (bad[k] || !usable(k))) k++;
    return k;
  };
  const lastGood = () => {
    let k = n - 1;
    while (k >= 0 && (bad[k] || !usable(k))) k--;
    return k;
  };
  // 2. roll-off inward of a run that reaches an end of the data
  for (const [a, b] of runs) {
    if (b - a + 1 < 10) continue;
    const lo = firstGood();
    const hi = lastGood();
    if (a <= lo + 5 && a <= n / 2) for (let k = b + 1; k <= Math.min(n - 1, b + ROLL_OFF_PIX); k++) mark(k, 'roll-off');
    if (b >= hi - 5 && b >= n / 2) for (let k = a - 1; k >= Math.max(0, a - ROLL_OFF_PIX); k--) mark(k, 'roll-off');
  }
  // 3. ends: always EDGE_PIX, more when the end steps away from its neighbourhood
  for (const side of [1, -1] as const) {
    const start = side === 1 ? firstGood() : lastGood();
    if (start < 0 || start >= n) continue;
    const good: number[] = [];
    for (let k = start; k >= 0 && k < n && good.length < EDGE_STEP_PIX + EDGE_REF_PIX; k += side) if (usable(k) && !bad[k]) good.push(k);
    for (const k of good.slice(0, EDGE_PIX)) mark(k, 'edge');
    if (good.length < EDGE_STEP_PIX + EDGE_REF_PIX) continue;
    const end = good.slice(0, EDGE_STEP_PIX).map((k) => s.flux[k]);
    const ref = good.slice(EDGE_STEP_PIX).map((k) => s.flux[k]);
    const mEnd = median(end);
    const mRef = median(ref);
    const sig = s.ivar ? median(good.slice(EDGE_STEP_PIX).map((k) => 1 / Math.sqrt(s.ivar![k]))) : Math.abs(mRef) * 0.1;
    if (Math.abs(mEnd - mRef) > Math.max(0.3 * Math.abs(mRef), 5 * sig / Math.sqrt(EDGE_STEP_PIX))) for (const k of good.slice(0, EDGE_STEP_PIX)) mark(k, 'edge-step');
  }
  // 4. flux far below zero
  if (s.ivar) for (let k = 0; k < n; k++) if (usable(k) && s.flux[k] * Math.sqrt(s.ivar[k]) < -NEGATIVE_SIGMA) mark(k, 'negative');
  const report = [...counts].map(([reason, pixels]) => ({ reason, pixels }));
  return { bad, report };
}
