/**
 * The y range that fits the visible flux. A plain min/max lets one cosmic ray
 * flatten the whole spectrum; plain percentiles clip the peaks of strong narrow
 * lines, which are the features a reviewer most needs to see. So: the extremes of
 * a running median over SPIKE_WINDOW_PX pixels, which drops spikes up to
 * floor(SPIKE_WINDOW_PX / 2) pixels wide and keeps anything wider (a resolved
 * line spans several pixels). Pure, no DOM.
 */
import { medianInPlace } from '../../core/numeric/median';

/** Running-median window, pixels (odd). 5 removes spikes of 1-2 pixels. */
export const SPIKE_WINDOW_PX = 5;

/** Fraction of the data range added above and below, so lines do not touch the frame. */
export const Y_PAD_FRACTION = 0.06;


/**
 * [low, high] (flux units) for y[i0..i1), padded by Y_PAD_FRACTION of the span,
 * ignoring NaN (masked pixels arrive as NaN). Neighbours just outside the slice
 * take part in the running median so a pan does not make the range jump.
 * Fewer than 3 * SPIKE_WINDOW_PX finite samples: plain min/max (a median of a
 * handful says nothing). Returns null when the slice holds no finite sample.
 */
export function robustYRange(y: Float64Array, i0: number, i1: number): [number, number] | null {
  const a = Math.max(0, i0);
  const b = Math.min(y.length, i1);
  const half = SPIKE_WINDOW_PX >> 1;
  let lo = Infinity;
  let hi = -Infinity;
  let nFinite = 0;
  for (let i = a; i < b; i++) {
    const v = y[i];
    if (!Number.isFinite(v)) continue;
    nFinite++;
    if (v < lo) lo = v;
    if (v > hi) hi = v;
  }
  if (nFinite === 0) return null;
  // Too few samples for a median to mean anything: plain extremes.
  if (nFinite < 3 * SPIKE_WINDOW_PX) return padRange(lo, hi);
  lo = Infinity;
  hi = -Infinity;
  const buf = new Float64Array(SPIKE_WINDOW_PX);
  for (let i = a; i < b; i++) {
    if (!Number.isFinite(y[i])) continue;
    let n = 0;
    const ja = Math.max(0, i - half);
    const jb = Math.min(y.length - 1, i + half);
    for (let j = ja; j <= jb; j++) if (Number.isFinite(y[j])) buf[n++] = y[j];
    const m = medianInPlace(buf, n);
    if (m < lo) lo = m;
    if (m > hi) hi = m;
  }
  if (!(hi >= lo)) return null;
  return padRange(lo, hi);
}

/** Pads [lo, hi] by Y_PAD_FRACTION; a flat range gets +-10% of its level (or +-1 at zero). */
export function padRange(lo: number, hi: number): [number, number] {
  if (hi === lo) {
    const d = lo === 0 ? 1 : Math.abs(lo) * 0.1;
    return [lo - d, hi + d];
  }
  const d = (hi - lo) * Y_PAD_FRACTION;
  return [lo - d, hi + d];
}
