/**
 * A candidate's redshift on the fine grid: the family's best template
 * combination at the candidate (amplitudes from the full model) is held as
 * one vector, re-fitted with its own amplitude and the polynomial at whole
 * fine-pixel shifts walking downhill from the scan's estimate; a parabola
 * through the lowest three gives z and the curvature its error
 * (sigma = sqrt(2 / d2chi2/dz2), docs/reference.md sec. 5).
 */
import { evaluateAt } from './model';
import { parabolaVertex } from './parabola';
import type { WeightedData } from './scanData';
import type { FitWorkspace } from './workspace';

/** Most fine-pixel steps the walk takes from its start. */
const MAX_WALK = 12;

export interface FineMinimum {
  /** Fractional fine shift of the vertex. */
  shift: number;
  chi2: number;
  /** sigma of the shift from the curvature (fine pixels), NaN when flat. */
  sigmaShift: number;
  /** The walk stopped at lo or hi (a range edge). */
  atEdge: boolean;
}

/** dataAt(shift): the fine data with the weights that hold at that shift (the same object for most families). */
export function refineOnFine(dataAt: (shift: number) => WeightedData, combined: Float64Array, kStart: number, start: number, lo: number, hi: number, polyFromA?: number, ws?: FitWorkspace): FineMinimum {
  const cache = new Map<number, number>();
  const at = (s: number): number => {
    if (s < lo || s > hi) return Infinity;
    let c = cache.get(s);
    if (c === undefined) {
      c = evaluateAt(dataAt(s), [combined], kStart, [false], s, polyFromA, ws).chi2;
      cache.set(s, c);
    }
    return c;
  };
  let s = Math.min(hi, Math.max(lo, Math.round(start)));
  for (let step = 0; step < MAX_WALK; step++) {
    const c = at(s);
    if (at(s - 1) < c) s--;
    else if (at(s + 1) < c) s++;
    else break;
  }
  const atEdge = s === lo || s === hi;
  const cm = at(s - 1);
  const c0 = at(s);
  const cp = at(s + 1);
  if (!Number.isFinite(cm) || !Number.isFinite(cp)) return { shift: s, chi2: c0, sigmaShift: NaN, atEdge };
  const v = parabolaVertex(s, 1, cm, c0, cp);
  const shift = Math.min(s + 0.5, Math.max(s - 0.5, v.x0));
  return { shift, chi2: v.d2 > 0 ? v.chi2 : c0, sigmaShift: v.sigma, atEdge };
}
