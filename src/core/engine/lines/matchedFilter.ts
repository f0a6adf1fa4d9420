/**
 * Quick local tools shared by the line measurements and the feature finder:
 * a straight-line continuum from chosen pixels, and a Gaussian matched filter
 * that gives, at each trial centre, the least-squares amplitude of a fixed-width
 * Gaussian and its signal-to-noise.
 */

export interface LineFit {
  /** Continuum at xRef, flux unit. */
  a: number;
  /** Slope, flux unit per Angstrom. */
  b: number;
  xRef: number;
  /** Points used. */
  n: number;
}

/**
 * Weighted least-squares straight line y = a + b (x - xRef) through the points
 * with use(k) true and w > 0 (ordinary normal equations). Falls back to a
 * constant with one distinct x; null with no points.
 */
export function fitStraightLine(
  xA: ArrayLike<number>, y: ArrayLike<number>, w: ArrayLike<number>, use: (k: number) => boolean, xRef: number,
): LineFit | null {
  let s = 0, sx = 0, sy = 0, sxx = 0, sxy = 0, n = 0;
  for (let k = 0; k < xA.length; k++) {
    if (!(w[k] > 0) || !use(k)) continue;
    const dx = xA[k] - xRef;
    s += w[k];
    sx += w[k] * dx;
    sy += w[k] * y[k];
    sxx += w[k] * dx * dx;
    sxy += w[k] * dx * y[k];
    n++;
  }
  if (n === 0) return null;
  const det = s * sxx - sx * sx;
  if (n < 2 || !(det > 1e-12 * s * sxx)) return { a: sy / s, b: 0, xRef, n };
  return { a: (sxx * sy - sx * sxy) / det, b: (s * sxy - sx * sy) / det, xRef, n };
}

/**
 * Straight line with iterative clipping: refit three times dropping points more
 * than clipSigma normalised residuals away (common practice), so that lines
 * and spikes do not drag the continuum.
 */
export function fitClippedLine(
  xA: ArrayLike<number>, y: ArrayLike<number>, w: ArrayLike<number>, use: (k: number) => boolean, xRef: number,
  clipSigma = 2.5,
): LineFit | null {
  let fit = fitStraightLine(xA, y, w, use, xRef);
  let current = use;
  for (let round = 0; round < 3 && fit; round++) {
    const f = fit;
    const limit = clipSigma * noiseScale(xA, y, w, current, f);
    const keep = (k: number): boolean => use(k) && Math.abs(y[k] - f.a - f.b * (xA[k] - xRef)) * Math.sqrt(w[k]) <= limit;
    const next = fitStraightLine(xA, y, w, keep, xRef);
    if (!next || next.n < Math.max(3, 0.5 * f.n)) break;
    fit = next;
    current = keep;
  }
  return fit;
}

/**
 * Square root of the reduced chi-square of a continuum line over its points,
 * at least 1: the factor by which the stated noise understates the real
 * scatter (used to inflate matched-filter errors).
 */
export function noiseScale(
  xA: ArrayLike<number>, y: ArrayLike<number>, w: ArrayLike<number>, use: (k: number) => boolean, fit: LineFit,
): number {
  let c = 0;
  let n = 0;
  for (let k = 0; k < xA.length; k++) {
    if (!(w[k] > 0) || !use(k)) continue;
    const r = y[k] - fit.a - fit.b * (xA[k] - fit.xRef);
    c += w[k] * r * r;
    n++;
  }
  return n > 2 ? Math.max(1, Math.sqrt(c / (n - 2))) : 1;
}

export interface FilterHit {
  /** Index into the arrays given. */
  k: number;
  centreA: number;
  /** Least-squares peak height, flux unit (negative for a trough). */
  amplitude: number;
  /** amplitude / its error. */
  snr: number;
  sigmaA: number;
}

/**
 * Matched filter with a Gaussian of fixed sigma centred on pixel k, against
 * residuals r (continuum removed): amplitude a = sum(w r g) / sum(w g^2),
 * error 1 / sqrt(sum(w g^2)), so snr = sum(w r g) / sqrt(sum(w g^2))
 * (weighted linear least squares for one amplitude). Pixels within 4 sigma.
 */
export function filterAt(
  xA: ArrayLike<number>, r: ArrayLike<number>, w: ArrayLike<number>, k: number, sigmaA: number,
): FilterHit {
  const c = xA[k];
  let srg = 0;
  let sgg = 0;
  for (let j = k; j >= 0 && c - xA[j] <= 4 * sigmaA; j--) {
    const t = (xA[j] - c) / sigmaA;
    const g = Math.exp(-0.5 * t * t);
    srg += w[j] * r[j] * g;
    sgg += w[j] * g * g;
  }
  for (let j = k + 1; j < xA.length && xA[j] - c <= 4 * sigmaA; j++) {
    const t = (xA[j] - c) / sigmaA;
    const g = Math.exp(-0.5 * t * t);
    srg += w[j] * r[j] * g;
    sgg += w[j] * g * g;
  }
  if (!(sgg > 0)) return { k, centreA: c, amplitude: 0, snr: 0, sigmaA };
  return { k, centreA: c, amplitude: srg / sgg, snr: srg / Math.sqrt(sgg), sigmaA };
}

/**
 * Best matched-filter hit over trial centres kFrom..kTo (inclusive) and the
 * given sigmas. sign +1 keeps peaks, -1 troughs, 0 either (largest |snr|).
 * Returns null when no trial has the requested sign.
 */
export function bestFilterHit(
  xA: ArrayLike<number>, r: ArrayLike<number>, w: ArrayLike<number>,
  kFrom: number, kTo: number, sigmasA: readonly number[], sign: 1 | -1 | 0,
): FilterHit | null {
  let best: FilterHit | null = null;
  let bestScore = 0;
  for (let k = Math.max(0, kFrom); k <= Math.min(xA.length - 1, kTo); k++) {
    for (const s of sigmasA) {
      const h = filterAt(xA, r, w, k, s);
      const score = sign === 0 ? Math.abs(h.snr) : sign * h.snr;
      if (score > bestScore) {
        bestScore = score;
        best = h;
      }
    }
  }
  return best;
}
