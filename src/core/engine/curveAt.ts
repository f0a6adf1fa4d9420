import type { ChiSquareCurve } from '../types';

/**
 * The lowest delta chi-square of any family's curve at redshift z (linear
 * interpolation between curve points), or NaN when z lies outside every
 * family's range. Used to rank a reviewer's line identifications by how well
 * the templates fit at the redshift each implies.
 */
export function deltaChi2At(curves: readonly ChiSquareCurve[], z: number): number {
  let best = NaN;
  for (const c of curves) {
    const zs = c.z;
    const n = zs.length;
    if (n === 0 || !(z >= zs[0] && z <= zs[n - 1])) continue;
    let lo = 0;
    let hi = n - 1;
    while (hi - lo > 1) {
      const mid = (lo + hi) >> 1;
      if (zs[mid] <= z) lo = mid;
      else hi = mid;
    }
    const t = zs[hi] > zs[lo] ? (z - zs[lo]) / (zs[hi] - zs[lo]) : 0;
    const v = c.deltaChi2[lo] + t * (c.deltaChi2[hi] - c.deltaChi2[lo]);
    if (Number.isFinite(v) && !(v >= best)) best = v;
  }
  return best;
}
