/**
 * Candidates: the distinct local minima of chi-square against redshift across
 * template families, refined on the fine grid with the full model.
 * Distinct means separated by more than a velocity (cf. Bolton et al. 2012,
 * AJ 144, 144, where the runner-up is taken > 1000 km/s from the best); the
 * z error comes from the curvature of chi-square, sigma_z = sqrt(2 / d2chi2/dz2),
 * scaled by sqrt(reduced chi2) when that exceeds 1 (reference sheet sec. 5).
 */
import type { SpectrumClass } from '../types';
import { dzPerPixel, velocitySeparationKms, zOfShift, C_KMS } from './logGrid';
import { parabolaVertex } from './parabola';
import { evaluateFull, type FullFit, type RefineContext } from './refine';
import type { TemplateFamily } from './templates';

/** Minimum velocity separation of distinct solutions, km/s, by family class. */
export function distinctKms(cls: SpectrumClass): number {
  // Broad quasar lines give chi2 valleys thousands of km/s wide; 2000 km/s
  // keeps one valley one candidate. Narrow-line and stellar solutions: 1000 km/s.
  return cls === 'qso' ? 2000 : 1000;
}

/**
 * Indices of local minima of y (endpoints count when lower than their one
 * neighbour) between from and to inclusive, best first, each more than
 * minSep indices from every better one kept; at most maxCount.
 */
export function localMinima(y: Float64Array, minSep: number, maxCount: number, from = 0, to = y.length - 1): number[] {
  const idx: number[] = [];
  for (let i = from; i <= to; i++) {
    const left = i > from ? y[i - 1] : Infinity;
    const right = i < to ? y[i + 1] : Infinity;
    if (y[i] <= left && y[i] < right) idx.push(i);
    else if (from === to) idx.push(i);
  }
  idx.sort((a, b) => y[a] - y[b]);
  const kept: number[] = [];
  for (const i of idx) {
    if (kept.every((k) => Math.abs(k - i) > minSep)) kept.push(i);
    if (kept.length >= maxCount) break;
  }
  return kept;
}

export interface RefinedCandidate {
  family: TemplateFamily;
  /** Fine-grid shift at the vertex (fractional pixels). */
  shift: number;
  z: number;
  zErr: number;
  chi2: number;
  dof: number;
  atEdge: boolean;
  fit: FullFit;
}

/** Largest number of one-pixel steps the fine search walks from the scan's minimum. */
const MAX_WALK = 8;

/**
 * Refine one scan minimum: walk downhill on the fine grid (full model,
 * non-negative amplitudes) within [lo, hi], then a parabola through the best
 * pixel and its neighbours with the template set held fixed.
 * `edgeLo`/`edgeHi` say whether lo/hi are true range edges (a minimum there is flagged).
 */
export function refineMinimum(
  ctx: RefineContext, family: TemplateFamily, start: number, lo: number, hi: number, edgeLo = true, edgeHi = true, known?: FullFit,
): RefinedCandidate {
  const cache = new Map<number, FullFit>();
  // `known`: an evaluation already made at some shift (the screening one), reused.
  if (known) cache.set(known.shift, known);
  const at = (s: number) => {
    let f = cache.get(s);
    if (!f) {
      f = evaluateFull(ctx, family, s);
      cache.set(s, f);
    }
    return f;
  };
  let s = Math.min(hi, Math.max(lo, start));
  for (let step = 0; step < MAX_WALK; step++) {
    const c = at(s).chi2;
    const l = s > lo ? at(s - 1).chi2 : Infinity;
    const r = s < hi ? at(s + 1).chi2 : Infinity;
    if (l < c && l <= r) s--;
    else if (r < c) s++;
    else break;
  }
  const best = at(s);
  const reduced = best.chi2 / best.dof;
  const scale = Math.sqrt(Math.max(1, reduced));
  const atEdge = (s === lo && edgeLo) || (s === hi && edgeHi);
  let u0 = s;
  let sigmaU = NaN;
  if (s > lo && s < hi) {
    for (const h of [1, 2, 4]) {
      if (s - h < lo || s + h > hi) break;
      // Neighbours already solved with the same template set need no new solve.
      const same = (f: FullFit | undefined) => f !== undefined && f.active.every((a, j) => a === best.active[j]);
      const fm = cache.get(s - h);
      const fp = cache.get(s + h);
      const cm = same(fm) ? fm!.chi2 : evaluateFull(ctx, family, s - h, best.active).chi2;
      const cp = same(fp) ? fp!.chi2 : evaluateFull(ctx, family, s + h, best.active).chi2;
      const v = parabolaVertex(s, h, cm, best.chi2, cp);
      if (v.d2 > 0) {
        u0 = Math.min(s + h, Math.max(s - h, v.x0));
        sigmaU = v.sigma;
        break;
      }
    }
  } else {
    // One-sided curvature at an edge: second difference over s, s -+ 1, s -+ 2.
    const dir = s === lo ? 1 : -1;
    if ((dir > 0 && s + 2 <= hi) || (dir < 0 && s - 2 >= lo)) {
      const c1 = evaluateFull(ctx, family, s + dir, best.active).chi2;
      const c2 = evaluateFull(ctx, family, s + 2 * dir, best.active).chi2;
      const d2 = best.chi2 - 2 * c1 + c2;
      if (d2 > 0) sigmaU = Math.sqrt(2 / d2);
    }
  }
  const z = zOfShift(u0, dlogOf(ctx));
  // No curvature (flat chi2): quote a conservative 1000 km/s.
  const zErr = Number.isFinite(sigmaU) ? sigmaU * dzPerPixel(z, dlogOf(ctx)) * scale : ((1 + z) * 1000) / C_KMS;
  return { family, shift: u0, z, zErr, chi2: best.chi2, dof: best.dof, atEdge, fit: best };
}

function dlogOf(ctx: RefineContext): number {
  return ctx.dlog10;
}

/**
 * Drop any candidate within the distinct velocity of a better one (whatever
 * its family; non-edge minima are kept in preference to edge ones), sort by chi2.
 */
export function mergeDistinct(cands: RefinedCandidate[]): RefinedCandidate[] {
  // Non-edge minima first: an edge minimum never hides a proper one nearby.
  const sorted = cands.slice().sort((a, b) => Number(a.atEdge) - Number(b.atEdge) || a.chi2 - b.chi2);
  const kept: RefinedCandidate[] = [];
  for (const c of sorted) {
    const clash = kept.some((k) => Math.abs(velocitySeparationKms(k.z, c.z)) < Math.max(distinctKms(k.family.class), distinctKms(c.family.class)));
    if (!clash) kept.push(c);
  }
  return kept.sort((a, b) => a.chi2 - b.chi2);
}

/**
 * Order for reporting: the best non-edge candidate first (an edge minimum is
 * refused as best when any non-edge minimum exists), then the rest by chi2.
 */
export function orderCandidates(merged: RefinedCandidate[]): RefinedCandidate[] {
  const firstInside = merged.findIndex((c) => !c.atEdge);
  if (firstInside <= 0) return merged;
  const best = merged[firstInside];
  return [best, ...merged.filter((_, i) => i !== firstInside)];
}
