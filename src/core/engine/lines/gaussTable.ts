/**
 * exp(-u / 2) for u = t^2 in [0, 16] (a unit Gaussian out to 4 sigma) from a
 * table with linear interpolation: the matched filter evaluates it for every
 * pixel of every trial centre and width, and Math.exp was a quarter of the
 * line measurements' time. Table step 1/512 in u, so the interpolation error
 * is at most step^2 / 8 * max|d^2/du^2 exp(-u/2)| = step^2 / 32 < 1.2e-7
 * (the bound of linear interpolation; tested against Math.exp).
 */
const STEPS_PER_UNIT = 512;
const U_MAX = 16;
const TABLE = (() => {
  const t = new Float64Array(U_MAX * STEPS_PER_UNIT + 2);
  for (let i = 0; i < t.length; i++) t[i] = Math.exp(-0.5 * (i / STEPS_PER_UNIT));
  return t;
})();

/** exp(-u / 2) for u >= 0: from the table up to 16, Math.exp beyond. */
export function gaussOfSquare(u: number): number {
  if (!(u < U_MAX)) return Math.exp(-0.5 * u);
  const x = u * STEPS_PER_UNIT;
  const i = x | 0;
  const f = x - i;
  return TABLE[i] + f * (TABLE[i + 1] - TABLE[i]);
}
