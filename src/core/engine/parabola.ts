/**
 * Three-point parabola through chi2 at x - h, x, x + h (docs/reference.md sec. 5):
 *   x0 = x - h (c+ - c-) / (2 (c+ - 2 c0 + c-)),  d2chi2/dx2 = (c+ - 2 c0 + c-) / h^2,
 * and the 1-sigma error sqrt(2 / d2chi2/dx2) (the Delta chi2 = 1 rule for one parameter).
 */
export interface ParabolaVertex {
  x0: number;
  /** chi2 at the vertex. */
  chi2: number;
  /** Second derivative d2chi2/dx2 (<= 0 means no minimum). */
  d2: number;
  /** sqrt(2 / d2), NaN when d2 <= 0. */
  sigma: number;
}

export function parabolaVertex(x: number, h: number, cMinus: number, c0: number, cPlus: number): ParabolaVertex {
  const curv = cPlus - 2 * c0 + cMinus;
  const d2 = curv / (h * h);
  if (!(curv > 0)) return { x0: x, chi2: c0, d2, sigma: NaN };
  const off = (h * (cPlus - cMinus)) / (2 * curv);
  const chi2 = c0 - ((cPlus - cMinus) * (cPlus - cMinus)) / (8 * curv);
  return { x0: x - off, chi2, d2, sigma: Math.sqrt(2 / d2) };
}
