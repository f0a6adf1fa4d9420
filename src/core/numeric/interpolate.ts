/** Lookups in increasing tables. */

/** Index lo of the segment [xs[lo], xs[lo + 1]] holding x (clamped to the table; xs increasing, length >= 2). */
export function segmentIndex(xs: ArrayLike<number>, x: number): number {
  let lo = 0;
  let hi = xs.length - 1;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (xs[mid] <= x) lo = mid;
    else hi = mid;
  }
  return lo;
}

/** Linear interpolation of a table at x; NaN outside it. */
export function interpLinear(xs: ArrayLike<number>, ys: ArrayLike<number>, x: number): number {
  if (!(x >= xs[0] && x <= xs[xs.length - 1])) return NaN;
  const lo = segmentIndex(xs, x);
  const hi = Math.min(lo + 1, xs.length - 1);
  const t = (x - xs[lo]) / (xs[hi] - xs[lo] || 1);
  return ys[lo] + t * (ys[hi] - ys[lo]);
}
