/**
 * Quick local tools shared by the line measurements and the feature finder:
 * a low-order polynomial continuum from chosen pixels, and a Gaussian matched filter
 * that gives, at each trial centre, the least-squares amplitude of a fixed-width
 * Gaussian and its signal-to-noise. The exhaustive matched filter (the test
 * reference) sits beside its strided fast version so the two are read together.
 */
import { choleskySolve } from '../../numeric/cholesky';
import { gaussOfSquare } from './gaussTable';

export interface ContinuumFit {
  /** Polynomial coefficients in (x - xRef): flux unit, flux unit / A, flux unit / A^2. */
  coef: number[];
  xRef: number;
  /** Points used. */
  n: number;
}

/** Value of a continuum fit at x (Angstrom). */
export function continuumValue(f: ContinuumFit, x: number): number {
  const d = x - f.xRef;
  let v = 0;
  for (let i = f.coef.length - 1; i >= 0; i--) v = v * d + f.coef[i];
  return v;
}

/** Solve small normal equations (symmetric positive definite) with the project's Cholesky; null if singular. */
function solveSmall(a: number[][], b: number[]): number[] | null {
  const n = b.length;
  const M = Float64Array.from(a.flat());
  const x = new Float64Array(n);
  const explained = choleskySolve(M, Float64Array.from(b), n, x, new Float64Array(n * n), new Int32Array(n));
  return Number.isFinite(explained) ? Array.from(x) : null;
}

/**
 * Weighted least-squares polynomial (degree 0, 1 or 2) in (x - xRef) through
 * the points with use(k) true and w > 0 (normal equations; x is scaled by the
 * half-span internally for conditioning). Lowers the degree when the points
 * cannot carry it; null with no points.
 */
export function fitContinuum(
  xA: ArrayLike<number>, y: ArrayLike<number>, w: ArrayLike<number>, use: (k: number) => boolean, xRef: number,
  degree: 0 | 1 | 2 = 1,
): ContinuumFit | null {
  const idx: number[] = [];
  let span = 0;
  for (let k = 0; k < xA.length; k++) {
    if (w[k] > 0 && use(k)) {
      idx.push(k);
      span = Math.max(span, Math.abs(xA[k] - xRef));
    }
  }
  if (idx.length === 0) return null;
  span = span || 1;
  for (let deg = Math.min(degree, idx.length - 1); deg >= 0; deg--) {
    const m = deg + 1;
    // Sums of w t^p (p = 0..4) and w t^p y (p = 0..2), formed term by term as w * t^i * t^j.
    let a00 = 0, a01 = 0, a02 = 0, a11 = 0, a12 = 0, a22 = 0, b0 = 0, b1 = 0, b2 = 0;
    for (const k of idx) {
      const t = (xA[k] - xRef) / span;
      const t2 = t * t;
      const wk = w[k];
      const yk = y[k];
      b0 += wk * 1 * yk;
      a00 += wk * 1 * 1;
      if (m > 1) {
        b1 += wk * t * yk;
        a01 += wk * 1 * t;
        a11 += wk * t * t;
      }
      if (m > 2) {
        b2 += wk * t2 * yk;
        a02 += wk * 1 * t2;
        a12 += wk * t * t2;
        a22 += wk * t2 * t2;
      }
    }
    const full = [
      [a00, a01, a02],
      [a01, a11, a12],
      [a02, a12, a22],
    ];
    const a = full.slice(0, m).map((row) => row.slice(0, m));
    const b = [b0, b1, b2].slice(0, m);
    // Reject a nearly singular system (all points at one x, say) and try a lower degree.
    const sol = solveSmall(a, b);
    if (sol && sol.every(Number.isFinite) && (deg === 0 || a[m - 1][m - 1] > 1e-10 * a[0][0])) {
      return { coef: sol.map((c, i) => c / span ** i), xRef, n: idx.length };
    }
  }
  return null;
}

/**
 * Continuum with iterative clipping: refit three times dropping points more
 * than clipSigma normalised residuals away (common practice), so that lines
 * and spikes do not drag the continuum.
 */
export function fitClippedContinuum(
  xA: ArrayLike<number>, y: ArrayLike<number>, w: ArrayLike<number>, use: (k: number) => boolean, xRef: number,
  degree: 0 | 1 | 2 = 1, clipSigma = 2.5,
): ContinuumFit | null {
  let fit = fitContinuum(xA, y, w, use, xRef, degree);
  let current = use;
  for (let round = 0; round < 3 && fit; round++) {
    const f = fit;
    const limit = clipSigma * noiseScale(xA, y, w, current, f);
    const keep = (k: number): boolean => use(k) && Math.abs(y[k] - continuumValue(f, xA[k])) * Math.sqrt(w[k]) <= limit;
    const next = fitContinuum(xA, y, w, keep, xRef, degree);
    if (!next || next.n < Math.max(3, 0.5 * f.n)) break;
    fit = next;
    current = keep;
  }
  return fit;
}

/**
 * Square root of the reduced chi-square of a continuum over its points, at
 * least 1: the factor by which the stated noise understates the real scatter
 * (used to set the continuum's clipping limit).
 */
export function noiseScale(
  xA: ArrayLike<number>, y: ArrayLike<number>, w: ArrayLike<number>, use: (k: number) => boolean, fit: ContinuumFit,
): number {
  let c = 0;
  let n = 0;
  for (let k = 0; k < xA.length; k++) {
    if (!(w[k] > 0) || !use(k)) continue;
    const r = y[k] - continuumValue(fit, xA[k]);
    c += w[k] * r * r;
    n++;
  }
  const dof = n - fit.coef.length;
  return dof > 0 ? Math.max(1, Math.sqrt(c / dof)) : 1;
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
    const g = gaussOfSquare(t * t);
    srg += w[j] * r[j] * g;
    sgg += w[j] * g * g;
  }
  for (let j = k + 1; j < xA.length && xA[j] - c <= 4 * sigmaA; j++) {
    const t = (xA[j] - c) / sigmaA;
    const g = gaussOfSquare(t * t);
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

/**
 * bestFilterHit for wide filters, fast: per sigma, trial centres every
 * max(1, sigma/2 pixels) (the response of a filter of width sigma is smooth
 * on that scale), then a one-pixel hill climb from the best of them.
 * Equal to bestFilterHit when the response has one peak per stride; may stop
 * on a neighbouring local peak in noise. Tested against bestFilterHit.
 */
export function bestFilterHitStrided(
  xA: ArrayLike<number>, r: ArrayLike<number>, w: ArrayLike<number>,
  kFrom: number, kTo: number, sigmasA: readonly number[], sign: 1 | -1 | 0,
): FilterHit | null {
  const lo = Math.max(0, kFrom);
  const hi = Math.min(xA.length - 1, kTo);
  if (hi < lo) return null;
  const pixA = xA.length > 1 ? (xA[xA.length - 1] - xA[0]) / (xA.length - 1) : 1;
  const scoreOf = (h: FilterHit) => (sign === 0 ? Math.abs(h.snr) : sign * h.snr);
  let best: FilterHit | null = null;
  let bestScore = 0;
  for (const s of sigmasA) {
    const stride = Math.max(1, Math.floor(s / pixA / 2));
    let top: FilterHit | null = null;
    let topScore = -Infinity;
    const ks: number[] = [];
    const scores: number[] = [];
    for (let k = lo; ; k = Math.min(hi, k + stride)) {
      const h = filterAt(xA, r, w, k, s);
      const sc = scoreOf(h);
      ks.push(k);
      scores.push(sc);
      if (sc > topScore) {
        topScore = sc;
        top = h;
      }
      if (k === hi) break;
    }
    if (!top) continue;
    // Jump to the vertex of the parabola through the best sample and its two
    // strided neighbours (the response is smooth on that scale), so the hill
    // climb below starts within a pixel or two of the peak.
    const b = ks.indexOf(top.k);
    if (stride > 2 && b > 0 && b < ks.length - 1) {
      const kv = Math.round(parabolaPeak(ks[b - 1], scores[b - 1], ks[b], scores[b], ks[b + 1], scores[b + 1]));
      if (kv !== top.k && kv > ks[b - 1] && kv < ks[b + 1]) {
        const h = filterAt(xA, r, w, kv, s);
        const sc = scoreOf(h);
        if (sc > topScore) {
          topScore = sc;
          top = h;
        }
      }
    }
    // Hill climb to the local peak (at most one stride each way).
    for (const dir of [1, -1]) {
      for (let step = 0; step < stride; step++) {
        const k = top.k + dir;
        if (k < lo || k > hi) break;
        const h = filterAt(xA, r, w, k, s);
        const sc = scoreOf(h);
        if (!(sc > topScore)) break;
        topScore = sc;
        top = h;
      }
    }
    if (topScore > bestScore) {
      bestScore = topScore;
      best = top;
    }
  }
  return best;
}

/** Abscissa of the extremum of the parabola through three points (x1 < x2 < x3); x2 when they are collinear. */
function parabolaPeak(x1: number, y1: number, x2: number, y2: number, x3: number, y3: number): number {
  const a = (x2 - x1) * (y2 - y3);
  const c = (x2 - x3) * (y2 - y1);
  const den = a - c;
  if (!(Math.abs(den) > 0)) return x2;
  return x2 - 0.5 * ((x2 - x1) * a - (x2 - x3) * c) / den;
}
