/**
 * Widths of a broad-line profile made of Gaussians in velocity: the FWHM of
 * the summed profile (its outermost half-maximum crossings, found on a fine
 * grid) and the line dispersion, the square root of the profile's second
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

/** FWHM of the summed profile, km/s (NaN when it has no positive peak). One Gaussian gives 2 sqrt(2 ln 2) sigma. */
export function profileFwhmKms(g: readonly VelocityGaussian[]): number {
  const live = g.filter((c) => c.amp > 0 && c.sig > 0);
  if (live.length === 0) return NaN;
  if (live.length === 1) return FWHM_PER_SIGMA * live[0].sig;
  const lo = Math.min(...live.map((c) => c.vel - 6 * c.sig));
  const hi = Math.max(...live.map((c) => c.vel + 6 * c.sig));
  const step = Math.min(...live.map((c) => c.sig)) / 50;
  const n = Math.ceil((hi - lo) / step) + 1;
  let peak = 0;
  for (let i = 0; i < n; i++) peak = Math.max(peak, profileAt(live, lo + i * step));
  const half = peak / 2;
  // Outermost crossings: walk in from each end, interpolate linearly inside the step.
  let left = NaN;
  let prev = profileAt(live, lo);
  for (let i = 1; i < n; i++) {
    const u = lo + i * step;
    const f = profileAt(live, u);
    if (f >= half) {
      left = u - step * ((f - half) / (f - prev));
      break;
    }
    prev = f;
  }
  let right = NaN;
  prev = profileAt(live, hi);
  for (let i = 1; i < n; i++) {
    const u = hi - i * step;
    const f = profileAt(live, u);
    if (f >= half) {
      right = u + step * ((f - half) / (f - prev));
      break;
    }
    prev = f;
  }
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
  const live = g.filter((c) => c.amp > 0 && c.sig > 0);
  if (live.length === 0) return NaN;
  const lo = Math.min(...live.map((c) => c.vel - 3 * c.sig));
  const hi = Math.max(...live.map((c) => c.vel + 3 * c.sig));
  const step = Math.min(...live.map((c) => c.sig)) / 50;
  let best = lo;
  let bestF = -Infinity;
  for (let u = lo; u <= hi; u += step) {
    const f = profileAt(live, u);
    if (f > bestF) {
      bestF = f;
      best = u;
    }
  }
  return best;
}
