/**
 * Widths of a broad-line profile made of Gaussians in velocity: the FWHM of
 * the summed profile (its outermost half-maximum crossings, bracketed on a
 * grid and bisected) and the line dispersion, the square root of the profile's second
 * moment (Peterson et al. 2004, ApJ 613, 682, sec. 3.1 define both measures).
 */
import { FWHM_PER_SIGMA } from '../engine/gaussFit';

export interface VelocityGaussian {
  /** Peak height (any unit). */
  amp: number;
  /** Centre, km/s. */
  vel: number;
  /** Sigma, km/s (> 0). */
  sig: number;
}

/** Sum of the Gaussians at velocity u, km/s. */
export function profileAt(g: readonly VelocityGaussian[], u: number): number {
  let f = 0;
  for (const c of g) {
    const t = (u - c.vel) / c.sig;
    f += c.amp * Math.exp(-0.5 * t * t);
  }
  return f;
}

function liveOf(g: readonly VelocityGaussian[]): VelocityGaussian[] {
  return g.filter((c) => c.amp > 0 && c.sig > 0);
}

/**
 * The profile's highest point (velocity, value). A sum of positive Gaussians
 * peaks between its lowest and highest centre: a grid of a quarter of the
 * narrowest sigma finds the highest cell, golden-section search refines it.
 */
function peakOf(live: readonly VelocityGaussian[]): { u: number; f: number } {
  let minSig = Infinity;
  let lo = Infinity;
  let hi = -Infinity;
  for (const c of live) {
    minSig = Math.min(minSig, c.sig);
    lo = Math.min(lo, c.vel);
    hi = Math.max(hi, c.vel);
  }
  const step = minSig / 4;
  let bestU = lo;
  let bestF = -Infinity;
  for (let u = lo - step; u <= hi + step; u += step) {
    const f = profileAt(live, u);
    if (f > bestF) {
      bestF = f;
      bestU = u;
    }
  }
  let a = bestU - step;
  let b = bestU + step;
  const r = (Math.sqrt(5) - 1) / 2;
  let x1 = b - r * (b - a);
  let x2 = a + r * (b - a);
  let f1 = profileAt(live, x1);
  let f2 = profileAt(live, x2);
  while (b - a > 1e-6 * minSig) {
    if (f1 > f2) {
      b = x2;
      x2 = x1;
      f2 = f1;
      x1 = b - r * (b - a);
      f1 = profileAt(live, x1);
    } else {
      a = x1;
      x1 = x2;
      f1 = f2;
      x2 = a + r * (b - a);
      f2 = profileAt(live, x2);
    }
  }
  const u = (a + b) / 2;
  const f = profileAt(live, u);
  return f >= bestF ? { u, f } : { u: bestU, f: bestF };
}

/**
 * Outermost crossing of `level` met walking from `from` toward the peak in
 * steps of `step` (signed), then bisected to a millionth of the step.
 */
function crossing(live: readonly VelocityGaussian[], from: number, step: number, level: number, maxSteps: number): number {
  let prev = from;
  for (let i = 1; i <= maxSteps; i++) {
    const u = from + i * step;
    if (profileAt(live, u) >= level) {
      let out = prev;
      let inside = u;
      while (Math.abs(inside - out) > 1e-6 * Math.abs(step)) {
        const mid = (out + inside) / 2;
        if (profileAt(live, mid) >= level) inside = mid;
        else out = mid;
      }
      return (out + inside) / 2;
    }
    prev = u;
  }
  return NaN;
}

/** FWHM of the summed profile, km/s (NaN when it has no positive peak). One Gaussian gives 2 sqrt(2 ln 2) sigma. */
export function profileFwhmKms(g: readonly VelocityGaussian[]): number {
  const live = liveOf(g);
  if (live.length === 0) return NaN;
  if (live.length === 1) return FWHM_PER_SIGMA * live[0].sig;
  const peak = peakOf(live);
  const half = peak.f / 2;
  // Beyond 6 sigma of every component the sum is far below half its peak.
  const lo = Math.min(...live.map((c) => c.vel - 6 * c.sig));
  const hi = Math.max(...live.map((c) => c.vel + 6 * c.sig));
  const step = Math.min(...live.map((c) => c.sig)) / 4;
  const left = crossing(live, lo, step, half, Math.ceil((peak.u - lo) / step) + 1);
  const right = crossing(live, hi, -step, half, Math.ceil((hi - peak.u) / step) + 1);
  return right - left;
}

/** Line dispersion (second-moment width), km/s: each Gaussian weighs by its area amp * sig. */
export function profileDispersionKms(g: readonly VelocityGaussian[]): number {
  const live = g.filter((c) => c.amp > 0 && c.sig > 0);
  let s0 = 0, s1 = 0, s2 = 0;
  for (const c of live) {
    const wgt = c.amp * c.sig;
    s0 += wgt;
    s1 += wgt * c.vel;
    s2 += wgt * (c.sig * c.sig + c.vel * c.vel);
  }
  if (!(s0 > 0)) return NaN;
  const mean = s1 / s0;
  return Math.sqrt(Math.max(0, s2 / s0 - mean * mean));
}

/** Velocity of the profile's peak, km/s. */
export function profilePeakKms(g: readonly VelocityGaussian[]): number {
  const live = liveOf(g);
  if (live.length === 0) return NaN;
  return peakOf(live).u;
}
