/**
 * Candidates: the distinct local minima of each family's scan, each scored
 * with the family's full model on the common scoring data (so chi2 values of
 * all families compare), the best few then refined on the fine grid.
 * Distinct means separated by more than a velocity (the runner-up is taken
 * > 1000 km/s from the best, as in Bolton et al. 2012, AJ 144, 144;
 * docs/reference.md sec. 5).
 */
import type { SpectrumClass } from '../types';
import type { Family } from './family';
import { binVectors } from './family';
import { evaluateAt, combination, type ModelFit } from './model';
import { dzPerPixel, pixelsOfVelocity, shiftOfZ, zOfShift, DLOG10 } from './logGrid';
import { parabolaVertex } from './parabola';
import { refineOnFine } from './refine';
import type { FamilyScan } from './scan';
import type { WeightedData } from './scanData';
import { restWavelengthA } from '../lines/catalogue';

const LYA_A = restWavelengthA('LyA');
import type { FitWorkspace } from './workspace';

/** Minimum velocity separation of distinct solutions, km/s: broad quasar valleys are thousands of km/s wide. */
export function distinctKms(cls: SpectrumClass): number {
  return cls === 'qso' ? 2000 : 1000;
}

/**
 * Indices of local minima of y between from and to (endpoints count when
 * lower than their one neighbour), best first, each more than minSep from
 * every better one kept; at most maxCount.
 */
export function localMinima(y: Float64Array, minSep: number, maxCount: number, from = 0, to = y.length - 1): number[] {
  const idx: number[] = [];
  for (let i = from; i <= to; i++) {
    const left = i > from ? y[i - 1] : Infinity;
    const right = i < to ? y[i + 1] : Infinity;
    if ((y[i] <= left && y[i] < right) || from === to) idx.push(i);
  }
  idx.sort((a, b) => y[a] - y[b]);
  const kept: number[] = [];
  for (const i of idx) {
    if (kept.every((k) => Math.abs(k - i) > minSep)) kept.push(i);
    if (kept.length >= maxCount) break;
  }
  return kept;
}

export interface ScoredCandidate {
  family: Family;
  z: number;
  zErr: number;
  /** Full-model fit on the scoring data at the candidate's shift. */
  fit: ModelFit;
  /** Fine-grid shift (fractional) of the solution. */
  fineShift: number;
  atEdge: boolean;
  /** True once refined on the fine grid (else z and zErr come from the scan's parabola). */
  refined: boolean;
  /** Fine shift range the solution was searched in, and whether its ends are true range edges. */
  range: { lo: number; hi: number; edgeLo: boolean; edgeHi: boolean };
}

/** Scan minima of one family within fine shifts [lo, hi], best first (scan shifts). */
export function scanMinima(scan: FamilyScan, count: number, lo: number, hi: number): number[] {
  const b = scan.binning;
  const sep = Math.max(1, Math.floor(pixelsOfVelocity(distinctKms(scan.family.class)) / b));
  const from = Math.max(0, Math.ceil(lo / b) - scan.sLo);
  const to = Math.min(scan.chi2.length - 1, Math.floor(hi / b) - scan.sLo);
  if (to < from) return [];
  return localMinima(scan.chi2, sep, count, from, to).map((i) => scan.sLo + i);
}

/** The scan's own estimate near scan shift s: parabola vertex (fine shift) and its sigma (fine pixels, NaN when flat). */
function scanVertex(scan: FamilyScan, s: number): { fineShift: number; sigma: number } {
  const b = scan.binning;
  const i = s - scan.sLo;
  if (i <= 0 || i >= scan.chi2.length - 1) return { fineShift: s * b, sigma: NaN };
  const v = parabolaVertex(i, 1, scan.chi2[i - 1], scan.chi2[i], scan.chi2[i + 1]);
  if (!(v.d2 > 0)) return { fineShift: s * b, sigma: NaN };
  return { fineShift: (scan.sLo + Math.max(i - 0.5, Math.min(i + 0.5, v.x0))) * b, sigma: v.sigma * b };
}

/**
 * Score one scan minimum: the full model on the scoring data (binning
 * `scoreBinning`) at the scoring shift nearest the scan's vertex.
 */
export function scoreMinimum(
  ws: FitWorkspace, scoring: WeightedData, scoreBinning: number, scan: FamilyScan, s: number,
  range: { lo: number; hi: number; edgeLo: boolean; edgeHi: boolean },
): ScoredCandidate {
  const f = scan.family;
  const full = ws.binnedVectors(f, 'full', scoreBinning, () => binVectors(f.vectors, f.kStart, scoreBinning));
  const v = scanVertex(scan, s);
  const fit = evaluateAt(scoring, full.vectors, full.kStart, f.nonNegative, Math.round(v.fineShift / scoreBinning), f.polynomialFromA, ws);
  const z = zOfShift(v.fineShift, DLOG10);
  const zErr = v.sigma * dzPerPixel(z, DLOG10) * Math.sqrt(reducedChi2(fit, scoring.nGood));
  const atEdge = (range.edgeLo && v.fineShift <= range.lo + scan.binning) || (range.edgeHi && v.fineShift >= range.hi - scan.binning);
  return { family: f, z, zErr, fit, fineShift: v.fineShift, atEdge, refined: false, range };
}

/** max(1, chi2 / dof) of a fit. */
function reducedChi2(fit: ModelFit, nGood: number): number {
  return Math.max(1, fit.chi2 / Math.max(1, nGood - fit.nParams));
}

/**
 * Refine on a finer grid than the scan's: the family's best combination at
 * the candidate, held as one vector, walked to the chi2 minimum (refine.ts).
 * `data` is on `binning` fine pixels per pixel (the engine refines on the
 * fine grid: on the 3-pixel grid, 130 of 160 simulated quasars came out
 * right against 136 on the fine one). z error from the curvature,
 * scaled by the square root of the reduced chi2 when above 1.
 */
export function refineCandidate(ws: FitWorkspace, data: WeightedData, binning: number, c: ScoredCandidate): ScoredCandidate {
  const f = c.family;
  const vec = binning === 1 ? { kStart: f.kStart, vectors: f.vectors } : ws.binnedVectors(f, 'full', binning, () => binVectors(f.vectors, f.kStart, binning));
  const combined = combination(vec.vectors, c.fit.amplitudes);
  // the forest's variance needs the gated evaluation (see withForestVariance), which quasars use
  const forest = f.class === 'qso' && f.polynomialFromA !== undefined;
  const dataAt = forest ? (s: number) => withForestVariance(data, combined, vec.kStart, s) : () => data;
  const lo = Math.ceil(c.range.lo / binning);
  const hi = Math.floor(c.range.hi / binning);
  const m = refineOnFine(dataAt, combined, vec.kStart, c.fineShift / binning, lo, hi, f.polynomialFromA, ws);
  if (!Number.isFinite(m.sigmaShift)) return c; // no curvature: keep the scan's estimate
  const shift = m.shift * binning;
  const z = zOfShift(shift, DLOG10);
  const red = Math.max(1, m.chi2 / Math.max(1, data.nGood - c.fit.nParams));
  const zErr = m.sigmaShift * binning * dzPerPixel(z, DLOG10) * Math.sqrt(red);
  const atEdge = (c.range.edgeLo && m.shift <= lo + 1) || (c.range.edgeHi && m.shift >= hi - 1);
  return { ...c, z, zErr, fineShift: shift, atEdge, refined: true };
}

/**
 * RMS of the Lyman-alpha forest's transmitted flux about its mean, as a
 * fraction of the continuum, at the resolution of survey spectra (~0.3 at
 * z ~ 2-3; from memory of forest flux statistics). Blueward of Ly-alpha the
 * forest is noise the template cannot follow: without this term its pixels
 * dominate a quasar's chi2 and pull z by about 1000 km/s.
 */
export const FOREST_FLUX_RMS = 0.3;

/**
 * Fine data with the forest's variance added blueward of Ly-alpha for a
 * quasar template at shift s. Only the weights change: valid for the gated
 * evaluation (model.ts), which solves the polynomial as ordinary columns and
 * so needs neither orthonormal polynomials nor the precomputed sums.
 */
function withForestVariance(fine: WeightedData, combined: Float64Array, kStart: number, s: number): WeightedData {
  const kLya = Math.log10(LYA_A) / fine.dlog10;
  const w = Float64Array.from(fine.w);
  const f2 = FOREST_FLUX_RMS * FOREST_FLUX_RMS;
  for (let i = 0; i < w.length; i++) {
    const t = fine.d0 + i - s - kStart;
    if (t + kStart >= kLya) break;
    if (!(w[i] > 0) || t < 0 || t >= combined.length) continue;
    const c = Math.max(0, combined[t]);
    w[i] = 1 / (1 / w[i] + f2 * c * c);
  }
  return { ...fine, w };
}

/** Fine shift range of a family (whole pixels), capped at zMax. */
export function fineRange(f: Family, zMax = Infinity): [number, number] {
  return [Math.ceil(shiftOfZ(f.zMin) - 1e-9), Math.floor(shiftOfZ(Math.min(f.zMax, zMax)) + 1e-9)];
}
