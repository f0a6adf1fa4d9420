/**
 * Drawing budget by pixels, not points: long spectra are reduced to min/max per
 * pixel column before they reach the canvas, and an optional boxcar smooths flux
 * for the eye. Pure functions, no DOM.
 */

/** Decimate only when the visible points exceed this many per pixel column (common practice: 4). */
export const DECIMATE_POINTS_PER_COLUMN = 4;

/** Per pixel column summary of the finite samples whose x falls in that column. */
export interface MinMaxColumns {
  nColumns: number;
  /** Number of finite samples in each column. */
  count: Uint32Array;
  /** Extremes and the first/last sample (in x order) of each column; NaN where count is 0. */
  min: Float64Array;
  max: Float64Array;
  first: Float64Array;
  last: Float64Array;
}

/** First index i with x[i] >= value (x ascending); x.length when none. */
export function lowerBound(x: ArrayLike<number>, value: number): number {
  let lo = 0;
  let hi = x.length;
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if (x[mid] < value) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}

/** First index i with x[i] > value (x ascending); x.length when none. */
export function upperBound(x: ArrayLike<number>, value: number): number {
  let lo = 0;
  let hi = x.length;
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if (x[mid] <= value) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}

/** Column of x in [x0, x1] split into nColumns equal columns; x1 itself goes to the last column. */
export function columnOf(x: number, x0: number, x1: number, nColumns: number): number {
  const c = Math.floor(((x - x0) / (x1 - x0)) * nColumns);
  return c >= nColumns ? nColumns - 1 : c;
}

/**
 * Min, max, first and last finite y per pixel column, for the samples with
 * x0 <= x <= x1 (x ascending, same unit as x0/x1). NaN y are skipped, so a column
 * with only gaps has count 0. Worth it when the visible points exceed
 * DECIMATE_POINTS_PER_COLUMN * nColumns; below that, draw the points themselves.
 */
export function decimateMinMax(
  x: Float64Array,
  y: Float64Array,
  x0: number,
  x1: number,
  nColumns: number,
): MinMaxColumns {
  const n = Math.max(0, Math.floor(nColumns));
  const out: MinMaxColumns = {
    nColumns: n,
    count: new Uint32Array(n),
    min: new Float64Array(n).fill(NaN),
    max: new Float64Array(n).fill(NaN),
    first: new Float64Array(n).fill(NaN),
    last: new Float64Array(n).fill(NaN),
  };
  if (n === 0 || !(x1 > x0) || x.length !== y.length) return out;
  const i0 = lowerBound(x, x0);
  const i1 = upperBound(x, x1);
  const scale = n / (x1 - x0);
  const { count, min, max, first, last } = out;
  for (let i = i0; i < i1; i++) {
    const v = y[i];
    if (v !== v || v === Infinity || v === -Infinity) continue;
    let c = Math.floor((x[i] - x0) * scale);
    if (c >= n) c = n - 1;
    if (count[c] === 0) {
      min[c] = v;
      max[c] = v;
      first[c] = v;
    } else {
      if (v < min[c]) min[c] = v;
      if (v > max[c]) max[c] = v;
    }
    last[c] = v;
    count[c]++;
  }
  return out;
}

/** Result of smoothBoxcar: smoothed values and the inverse variance of each mean (null when no ivar was given). */
export interface Smoothed {
  y: Float64Array;
  ivar: Float64Array | null;
}

/**
 * Inverse-variance weighted boxcar: y_s[i] = sum(w y) / sum(w) over the window
 * of 2*floor(width/2)+1 pixels centred on i, with w = ivar; the mean's inverse
 * variance is sum(w) (weighted mean of independent samples: Bevington & Robinson
 * 2003, Data Reduction and Error Analysis, 3rd ed., sec. 4.1, from memory). Samples that are NaN,
 * masked, or have ivar <= 0 are ignored; a window with none left gives NaN (and
 * ivar 0). ivar null: equal weights, no ivar out. width <= 1 keeps the samples
 * (still dropping bad ones). Direct O(n * width) sum: exact, and width is small.
 */
export function smoothBoxcar(
  y: Float64Array,
  ivar: Float64Array | null,
  width: number,
  mask?: Uint8Array | null,
): Smoothed {
  const n = y.length;
  const half = Number.isFinite(width) && width > 1 ? Math.floor(width / 2) : 0;
  const w = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const v = y[i];
    const good = Number.isFinite(v) && !(mask && mask[i]);
    const wi = ivar ? ivar[i] : 1;
    w[i] = good && Number.isFinite(wi) && wi > 0 ? wi : 0;
  }
  const ys = new Float64Array(n);
  const is = ivar ? new Float64Array(n) : null;
  for (let i = 0; i < n; i++) {
    const a = Math.max(0, i - half);
    const b = Math.min(n - 1, i + half);
    let sw = 0;
    let swy = 0;
    for (let j = a; j <= b; j++) {
      const wj = w[j];
      if (wj > 0) {
        sw += wj;
        swy += wj * y[j];
      }
    }
    ys[i] = sw > 0 ? swy / sw : NaN;
    if (is) is[i] = sw;
  }
  return { y: ys, ivar: is };
}
