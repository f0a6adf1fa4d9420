/**
 * Adaptive Simpson quadrature with Richardson correction (Lyness 1969,
 * J. ACM 16, 483). The interval is first cut into 16 panels so that a
 * coincidentally flat-looking first sample cannot end the refinement early.
 */

/** Default relative tolerance; three decades below the 1e-7 the module promises. */
export const DEFAULT_REL_TOL = 1e-10;

const FIRST_PANELS = 16;
const MAX_DEPTH = 48;

/**
 * Integral of f over [a, b] to relative tolerance relTol (of the integral's
 * magnitude). Throws if the refinement runs out of depth, which for the
 * smooth integrands of this module means a non-finite integrand.
 */
export function integrate(f: (x: number) => number, a: number, b: number, relTol = DEFAULT_REL_TOL): number {
  if (a === b) return 0;
  const h = (b - a) / FIRST_PANELS;
  const panels: Array<[number, number, number, number, number, number]> = [];
  let crude = 0;
  for (let i = 0; i < FIRST_PANELS; i++) {
    const x0 = a + i * h;
    const x1 = i === FIRST_PANELS - 1 ? b : x0 + h;
    const f0 = f(x0);
    const f1 = f(x1);
    const fm = f((x0 + x1) / 2);
    const s = ((x1 - x0) / 6) * (f0 + 4 * fm + f1);
    crude += s;
    panels.push([x0, x1, f0, fm, f1, s]);
  }
  if (!Number.isFinite(crude)) throw new RangeError(`integrand is not finite on [${a}, ${b}]`);
  const eps = relTol * Math.max(Math.abs(crude), Number.MIN_VALUE) / FIRST_PANELS;
  let total = 0;
  for (const [x0, x1, f0, fm, f1, s] of panels) total += refine(f, x0, x1, f0, fm, f1, s, eps, MAX_DEPTH);
  return total;
}

function refine(
  f: (x: number) => number,
  a: number, b: number, fa: number, fm: number, fb: number, whole: number,
  eps: number, depth: number,
): number {
  const m = (a + b) / 2;
  const flm = f((a + m) / 2);
  const frm = f((m + b) / 2);
  const left = ((m - a) / 6) * (fa + 4 * flm + fm);
  const right = ((b - m) / 6) * (fm + 4 * frm + fb);
  const delta = left + right - whole;
  if (Math.abs(delta) <= 15 * eps) return left + right + delta / 15;
  if (depth <= 0 || !Number.isFinite(delta)) {
    throw new RangeError(`quadrature did not converge on [${a}, ${b}]`);
  }
  return refine(f, a, m, fa, flm, fm, left, eps / 2, depth - 1) + refine(f, m, b, fm, frm, fb, right, eps / 2, depth - 1);
}
