/**
 * Spectrum -> FitResult: resample onto the log grid, scan every template
 * family over its redshift range with FFT correlations (on pixels binned by
 * SCAN_BINNING for speed), refine the best few minima of each family with the
 * full model on the fine grid, pick the best distinct candidate, count the
 * features that support it and grade it.
 *
 * The chi-square curves in the result come from the fast scan (binned data,
 * reduced model), as chi2 minus the lowest scan chi2 of any family; candidate
 * chi2 values come from the full model on the fine grid. The two are not on
 * the same scale and are never subtracted from each other.
 */
import type { Candidate, ChiSquareCurve, FitResult, LineMeasurement, Spectrum, SpectrumClass } from '../types';
import { candidateToContract } from './contract';
import { localMinima, mergeDistinct, orderCandidates, refineMinimum, distinctKms, type RefinedCandidate } from './candidates';
import { confidenceFeatures, confidenceScore, gradeOf } from './confidence';
import { countFeatures, lineSignificances } from './features';
import { DLOG10, pixelsOfVelocity, shiftOfZ, velocitySeparationKms, zOfShift } from './logGrid';
import { measureLines } from './measureLines';
import { evaluateFull, makeRefineContext, type FullFit, type RefineContext } from './refine';
import { binLogSpectrum } from './resample';
import { fineData } from './fineData';
import { withFloor } from './errorFloor';
import { binRest, type RestArray } from './restArray';
import { dataSpectra, fftSizeFor, scanConstants, scanSmall, scanFFT, weightedOrthonormalBasis, type DataSpectra, type ScanConstants, type ScanData } from './scan';
import { TEMPLATE_SET_ID, templateFamilies, type TemplateFamily } from './templates';
import { ENGINE_VERSION } from './version';
import { failedResult } from '../failedResult';
import { parabolaVertex } from './parabola';

/**
 * Continuum polynomial terms in the observed frame when not given: 5 (3 gave
 * 93.8% correct on simulations at S/N >= 3 and 46/58 on the real set, 5
 * gives 96.9% and 50/58: real fluxing errors and template shapes need the
 * freedom). The scan needs them too: with 3 terms in the scan and 5 in the
 * refinement, four real galaxies lose their right minimum before refinement.
 */
export const DEFAULT_POLY_TERMS = 5;

export interface FitOptions {
  /** Family ids to try (default: all; see FAMILY_IDS). */
  families?: readonly string[];
  /** Upper limit on redshift for every family (default: each family's own). */
  zMax?: number;
  /** Continuum polynomial terms in the observed frame (default 3). */
  polyTerms?: number;
  /** Measure catalogue lines at the best solution (default true). */
  measureLines?: boolean;
}

/**
 * Fine pixels combined into one for the scan: 3 (207 km/s) for narrow-line and
 * stellar families; 8 (552 km/s) for quasars, whose lines are >= 2000 km/s wide
 * (4 gave 95.9% correct at S/N >= 3 on the seed-7 simulations, 8 gives 96.1%,
 * with half the shifts and FFTs of half the size; the refinement walks on the
 * fine grid from the scan's parabola vertex either way).
 */
export const SCAN_BINNING = 3;
export const QSO_SCAN_BINNING = 8;

/**
 * Stars: also 8. Their range is +-1000 km/s, so the scan only ranks the
 * stellar solution against the others and gives the refinement a start (3
 * shifts by plain sums on the quasars' binned data instead of 9 by FFT).
 */
export const STAR_SCAN_BINNING = 8;

export function scanBinningOf(f: TemplateFamily): number {
  return f.class === 'qso' ? QSO_SCAN_BINNING : f.class === 'star' ? STAR_SCAN_BINNING : SCAN_BINNING;
}

/** Scans of at most this many shifts use plain sums instead of FFTs (scanSumsSmall; same numbers, scan.test.ts). The stellar scan (9 shifts of 4 vectors) is already cheaper by FFT (0.9-1.5 ms against 1.5-1.9 ms, measured). */
export const DIRECT_SCAN_MAX_SHIFTS = 4;

/** Scan minima refined in all, and at most per family. */
export const REFINE_TOTAL = 5;
export const REFINE_PER_FAMILY = 3;
/**
 * Of those, the best few by scan gain are always refined; the others only
 * when one evaluation at their start shift comes within SCREEN_DCHI2 of the
 * distinct runner-up. On 600 simulations the best solution came from scan
 * rank 0-2 in 597 cases and the runner-up from rank 3-4 in 61 (measured).
 */
export const REFINE_ALWAYS = 3;
export const SCREEN_DCHI2 = 25;
/** Largest number of points per chi-square curve. */
export const CURVE_MAX_POINTS = 1500;
/** Half-width of the refitNear window, km/s. */
export const REFIT_HALF_WIDTH_KMS = 3000;
/**
 * The best solution must beat a polynomial-only fit by this much chi2 (and so
 * must at least one template feature) or the class is 'unknown'. A Delta chi2
 * of 25 is a 5-sigma improvement for one parameter (common practice).
 */
export const UNKNOWN_DCHI2 = 25;

interface FamilyScan {
  family: TemplateFamily;
  /** Fine-grid shift range of the family (after options). */
  lo: number;
  hi: number;
  /** Scan binning (fine pixels per scan pixel) and the scan shift of chi2[0]. */
  binning: number;
  sMin: number;
  chi2: Float64Array;
  /** chi2 of the polynomial alone on the scan data: chi2 improvements are comparable across binnings. */
  chi2Poly: number;
}

interface Prepared {
  fine: ScanData;
  ctx: RefineContext;
  scans: FamilyScan[];
  noiseEstimated: boolean;
  input: FitResult['input'];
}

const binnedCache = new WeakMap<TemplateFamily, RestArray[]>();

/** A family's scan vectors binned like its scan data (built once per family). */
function binnedScanVectors(f: TemplateFamily): RestArray[] {
  let v = binnedCache.get(f);
  if (!v) {
    v = f.scanVectors.map((r) => binRest(r, scanBinningOf(f)));
    binnedCache.set(f, v);
  }
  return v;
}

function prepare(spectrum: Spectrum, options: FitOptions): Prepared | string {
  const wl = spectrum.wavelengthA;
  const fd = fineData(spectrum);
  if (typeof fd === 'string') return fd;
  const fine = fd.data;
  const ls = { k0: fine.k0, dlog10: DLOG10, flux: fine.flux, ivar: fine.ivar, noiseEstimated: fd.noiseEstimated };
  const P = options.polyTerms ?? DEFAULT_POLY_TERMS;
  const binned = new Map<number, ScanData>();
  const dataAt = (b: number): ScanData => {
    let d = binned.get(b);
    if (!d) {
      const bl = binLogSpectrum(ls, b);
      d = { k0: bl.k0, flux: bl.flux, ivar: bl.ivar };
      binned.set(b, d);
    }
    return d;
  };
  // Per binning: the continuum polynomials orthonormal under the weights (scan.ts), and the shift-free sums.
  const basisCache = new Map<number, Float64Array[] | undefined>();
  const basisAt = (b: number): Float64Array[] | undefined => {
    if (!basisCache.has(b)) basisCache.set(b, P > 0 ? (weightedOrthonormalBasis(dataAt(b), P) ?? undefined) : undefined);
    return basisCache.get(b);
  };
  const constCache = new Map<number, ScanConstants>();
  const constsAt = (b: number): ScanConstants => {
    let c = constCache.get(b);
    if (!c) {
      c = scanConstants(dataAt(b), P, basisAt(b));
      constCache.set(b, c);
    }
    return c;
  };
  const wanted = options.families ? new Set(options.families) : null;
  const dsCache = new Map<string, DataSpectra>();
  const scans: FamilyScan[] = [];
  for (const family of templateFamilies()) {
    if (wanted && !wanted.has(family.id)) continue;
    const zMax = Math.min(family.zMax, options.zMax ?? Infinity);
    const lo = Math.ceil(shiftOfZ(family.zMin) - 1e-9);
    const hi = Math.floor(shiftOfZ(zMax) + 1e-9);
    const b = scanBinningOf(family);
    const sLo = Math.ceil(lo / b);
    const sHi = Math.floor(hi / b);
    if (sHi < sLo) continue;
    const data = dataAt(b);
    if (sHi - sLo + 1 <= DIRECT_SCAN_MAX_SHIFTS) {
      // Stars: a few shifts; direct sums beat FFTs of the whole spectrum.
      const r = scanSmall(data, binnedScanVectors(family), sLo, sHi, P, DLOG10 * b, constsAt(b), basisAt(b));
      scans.push({ family, lo, hi, binning: b, sMin: sLo, chi2: r.chi2, chi2Poly: polyOnlyChi2(constsAt(b), P) });
      continue;
    }
    const L = fftSizeFor(data.flux.length, sHi - sLo + 1);
    let ds = dsCache.get(`${b}|${L}`);
    if (!ds) {
      ds = dataSpectra(data, P, L, basisAt(b), `fit@${b}`);
      dsCache.set(`${b}|${L}`, ds);
    }
    const r = scanFFT(data, binnedScanVectors(family), sLo, sHi, P, `${family.id}@${b}`, ds, DLOG10 * b, constsAt(b));
    scans.push({ family, lo, hi, binning: b, sMin: sLo, chi2: r.chi2, chi2Poly: polyOnlyChi2(constsAt(b), P) });
  }
  if (scans.length === 0) return 'no template family covers the requested redshift range';
  const ctx = makeRefineContext(fine, P, DLOG10);
  return {
    fine,
    ctx,
    scans,
    noiseEstimated: fd.noiseEstimated,
    input: { nPix: wl.length, lambdaMinA: wl[0], lambdaMaxA: wl[wl.length - 1], meta: spectrum.meta, format: spectrum.format, medianSnr: fd.medianSnr },
  };
}

interface ScanMinimum {
  fs: FamilyScan;
  /** Index into fs.chi2. */
  index: number;
  /** chi2 improvement over the polynomial alone (comparable across families). */
  gain: number;
}

/** Distinct scan minima of one family between fine shifts lo..hi, best first. */
function scanMinima(fs: FamilyScan, lo: number, hi: number, count: number): ScanMinimum[] {
  const b = fs.binning;
  const from = Math.max(0, Math.ceil(lo / b) - fs.sMin);
  const to = Math.min(fs.chi2.length - 1, Math.floor(hi / b) - fs.sMin);
  if (to < from) return [];
  const sep = Math.max(1, Math.floor(pixelsOfVelocity(distinctKms(fs.family.class)) / b));
  return localMinima(fs.chi2, sep, count, from, to).map((index) => ({ fs, index, gain: fs.chi2Poly - fs.chi2[index] }));
}

/** Refine one scan minimum on the fine grid between lo..hi. */
function refineScanMinimum(p: Prepared, m: ScanMinimum, lo: number, hi: number, windowEdges: boolean, known?: FullFit): RefinedCandidate {
  const { fs } = m;
  const c = refineMinimum(p.ctx, fs.family, startShift(fs, m.index), lo, hi, windowEdges || lo === fs.lo, windowEdges || hi === fs.hi, known);
  return withFloor(c, p.input.lambdaMinA, p.input.lambdaMaxA);
}

/**
 * Fine-grid shift to start refining from: the vertex of the parabola through
 * the scan minimum and its two neighbours (within half a scan pixel), which
 * saves walking steps when the scan pixel spans several fine ones.
 */
function startShift(fs: FamilyScan, index: number): number {
  const y = fs.chi2;
  const centre = (fs.sMin + index) * fs.binning;
  if (index <= 0 || index >= y.length - 1) return centre;
  const v = parabolaVertex(index, 1, y[index - 1], y[index], y[index + 1]);
  if (!(v.d2 > 0)) return centre;
  const off = Math.max(-0.5, Math.min(0.5, v.x0 - index));
  return Math.round(centre + off * fs.binning);
}

/** The free fit: the best REFINE_TOTAL scan minima across families (at most REFINE_PER_FAMILY each), refined. */
function freeCandidates(p: Prepared): RefinedCandidate[] {
  const pool: ScanMinimum[] = [];
  for (const fs of p.scans) pool.push(...scanMinima(fs, fs.lo, fs.hi, REFINE_PER_FAMILY));
  pool.sort((a, b) => b.gain - a.gain);
  const picked = pool.slice(0, REFINE_TOTAL);
  const out: RefinedCandidate[] = picked.slice(0, REFINE_ALWAYS).map((m) => refineScanMinimum(p, m, m.fs.lo, m.fs.hi, false));
  // Lower-ranked minima: one full-model evaluation at the start shift first.
  // The walk can only lower chi2 from there, but rarely by much; refine only
  // those within SCREEN_DCHI2 of the current distinct runner-up (they could
  // become the runner-up or the best), drop the rest (they would be listed
  // below the runner-up and change neither z, gap nor grade).
  for (const m of picked.slice(REFINE_ALWAYS)) {
    const start = startShift(m.fs, m.index);
    const s0 = Math.min(m.fs.hi, Math.max(m.fs.lo, start));
    const first = evaluateFull(p.ctx, m.fs.family, s0);
    const merged = mergeDistinct(out);
    const bar = merged.length > 1 ? merged[1].chi2 : Infinity;
    if (first.chi2 < bar + SCREEN_DCHI2) out.push(refineScanMinimum(p, m, m.fs.lo, m.fs.hi, false, first));
  }
  return out;
}

/** chi2 of the continuum polynomial alone. */
function polyOnlyChi2(consts: ScanConstants, P: number): number {
  if (P === 0) return consts.fwf;
  // Solve pp c = pf by Gaussian elimination (P is tiny).
  const A = Array.from({ length: P }, (_, a) => Array.from({ length: P }, (_, b) => consts.pp[a * P + b]));
  const y = Array.from(consts.pf);
  for (let c = 0; c < P; c++) {
    const piv = A[c][c];
    if (!(Math.abs(piv) > 0)) return consts.fwf;
    for (let r = c + 1; r < P; r++) {
      const f = A[r][c] / piv;
      for (let k = c; k < P; k++) A[r][k] -= f * A[c][k];
      y[r] -= f * y[c];
    }
  }
  const x = new Array(P).fill(0);
  for (let r = P - 1; r >= 0; r--) {
    let s = y[r];
    for (let k = r + 1; k < P; k++) s -= A[r][k] * x[k];
    x[r] = s / A[r][r];
  }
  let ex = 0;
  for (let a = 0; a < P; a++) ex += consts.pf[a] * x[a];
  return consts.fwf - ex;
}

/** Down-sample a curve to at most maxPts points, keeping the minimum of each bucket. */
export function decimateCurve(z: Float64Array, y: Float64Array, maxPts: number): { z: Float64Array; y: Float64Array } {
  const n = y.length;
  if (n <= maxPts) return { z, y };
  const zo = new Float64Array(maxPts);
  const yo = new Float64Array(maxPts);
  for (let b = 0; b < maxPts; b++) {
    const i0 = Math.floor((b * n) / maxPts);
    const i1 = Math.floor(((b + 1) * n) / maxPts);
    let best = i0;
    for (let i = i0 + 1; i < i1; i++) if (y[i] < y[best]) best = i;
    zo[b] = z[best];
    yo[b] = y[best];
  }
  return { z: zo, y: yo };
}

/** Redshifts of scan shifts (sMin + i) * binning, i < n: the same for every spectrum of a batch, so computed once. */
const zGridCache = new Map<string, Float64Array>();
function scanRedshifts(sMin: number, binning: number, n: number): Float64Array {
  const key = `${sMin}|${binning}|${n}`;
  let z = zGridCache.get(key);
  if (!z) {
    z = new Float64Array(n);
    for (let i = 0; i < n; i++) z[i] = zOfShift((sMin + i) * binning, DLOG10);
    if (zGridCache.size >= 32) zGridCache.delete(zGridCache.keys().next().value as string);
    zGridCache.set(key, z);
  }
  return z;
}

/** Indices decimateCurve keeps (the lowest y of each bucket), or null when nothing is dropped. */
function decimatedIndices(y: Float64Array, maxPts: number): Int32Array | null {
  const n = y.length;
  if (n <= maxPts) return null;
  const out = new Int32Array(maxPts);
  for (let b = 0; b < maxPts; b++) {
    const i0 = Math.floor((b * n) / maxPts);
    const i1 = Math.floor(((b + 1) * n) / maxPts);
    let best = i0;
    for (let i = i0 + 1; i < i1; i++) if (y[i] < y[best]) best = i;
    out[b] = best;
  }
  return out;
}

/**
 * Curves as the best chi2 improvement over the polynomial (any family) minus
 * this family's improvement at z: 0 at the deepest scan minimum, and
 * comparable between families scanned at different binnings.
 */
function curvesOf(scans: FamilyScan[]): ChiSquareCurve[] {
  let bestGain = -Infinity;
  for (const s of scans) for (const v of s.chi2) bestGain = Math.max(bestGain, s.chi2Poly - v);
  return scans.map((s) => {
    const n = s.chi2.length;
    const keep = decimatedIndices(s.chi2, CURVE_MAX_POINTS);
    const m = keep ? keep.length : n;
    const z = new Float64Array(m);
    const y = new Float64Array(m);
    // z only for the points kept (one power each), the same numbers as decimateCurve gives.
    const zs = scanRedshifts(s.sMin, s.binning, n);
    for (let q = 0; q < m; q++) {
      const i = keep ? keep[q] : q;
      z[q] = zs[i];
      y[q] = bestGain - (s.chi2Poly - s.chi2[i]);
    }
    return { family: s.family.id, z, deltaChi2: y };
  });
}

/** A failed fit that still carries what was read (size, range, header facts). */
function failed(spectrum: Spectrum, message: string): FitResult {
  const wl = spectrum.wavelengthA;
  return {
    ...failedResult(spectrum.file, message),
    noiseEstimated: spectrum.ivar === null,
    input: { nPix: wl.length, lambdaMinA: wl[0], lambdaMaxA: wl[wl.length - 1], medianSnr: NaN, meta: spectrum.meta, format: spectrum.format },
  };
}

/** A fit plus the feature S/Ns behind its confidence. */
export interface DetailedFit {
  result: FitResult;
  featureSnrs: number[];
}

/**
 * 'free': the best solution over every family's full range; 'refit': the
 * first candidate was chosen inside a reviewer's window, so the gap to the
 * other candidates says nothing about whether a template fits there.
 */
type FitMode = 'free' | 'refit';

function assemble(spectrum: Spectrum, p: Prepared, ordered: RefinedCandidate[], options: FitOptions, mode: FitMode): DetailedFit {
  if (ordered.length === 0) return { result: failed(spectrum, 'no chi-square minimum found in the redshift range'), featureSnrs: [] };
  const best = ordered[0];
  const chi2Gap = ordered.length > 1 ? ordered[1].chi2 - best.chi2 : Infinity;
  const sig = lineSignificances(p.fine, DLOG10, best.family, best.z);
  const feats = countFeatures(sig);
  const dPoly = polyOnlyChi2(p.ctx.consts, p.ctx.P) - best.chi2;
  let cls: SpectrumClass = best.family.class;
  // Free fit: unknown when the templates do not beat the continuum alone by
  // UNKNOWN_DCHI2, or when no feature is seen and another solution is as good.
  // Refit: the reviewer chose the redshift, so the class is that of the best
  // family there whenever it improves on the continuum at all (its weakness
  // shows in the score and grade, not in the class).
  if (mode === 'free' ? dPoly < UNKNOWN_DCHI2 || (feats.n === 0 && chi2Gap < 1) : !(dPoly > 0)) cls = 'unknown';
  const confIn = { cls, chi2Gap, nFeatures: feats.n, featureSnrs: feats.snrs, atEdge: best.atEdge };
  const score = confidenceScore(confIn);
  const candidates: Candidate[] = ordered.map((c) => candidateToContract(c, best.chi2));
  let lines: LineMeasurement[] = [];
  if (options.measureLines !== false && cls !== 'unknown') {
    try {
      lines = measureLines(spectrum, best.z, cls);
    } catch {
      lines = [];
    }
  }
  const result: FitResult = {
    file: spectrum.file,
    status: 'ok',
    candidates,
    z: best.z,
    zErr: best.zErr,
    class: cls,
    score,
    confidence: gradeOf(score, confidenceFeatures(confIn)),
    chi2Gap,
    nFeatures: feats.n,
    curves: curvesOf(p.scans),
    lines,
    noiseEstimated: p.noiseEstimated,
    templateSet: TEMPLATE_SET_ID,
    engineVersion: ENGINE_VERSION,
    input: p.input,
  };
  return { result, featureSnrs: feats.snrs };
}

function guarded(spectrum: Spectrum, run: () => DetailedFit): DetailedFit {
  try {
    return run();
  } catch (e) {
    return { result: failed(spectrum, `internal fitting error: ${(e as Error)?.message ?? String(e)}`), featureSnrs: [] };
  }
}

/** fitSpectrum plus the feature S/Ns behind its confidence (calibration, diagnostics). */
export function fitSpectrumDetailed(spectrum: Spectrum, options: FitOptions = {}): DetailedFit {
  return guarded(spectrum, () => {
    const p = prepare(spectrum, options);
    if (typeof p === 'string') return { result: failed(spectrum, p), featureSnrs: [] };
    return assemble(spectrum, p, orderCandidates(mergeDistinct(freeCandidates(p))), options, 'free');
  });
}

/** Fit every template family over its full redshift range. Never throws on a valid Spectrum. */
export function fitSpectrum(spectrum: Spectrum, options: FitOptions = {}): FitResult {
  return fitSpectrumDetailed(spectrum, options).result;
}

/**
 * Fit again with the best solution restricted to within +-REFIT_HALF_WIDTH_KMS
 * of zCentre, across all families (a reviewer clicking the curve or naming a
 * line). The candidates list starts with the best solution in the window,
 * followed by the distinct solutions of the free fit outside it; chi2Gap is
 * the next candidate's chi2 minus the chosen one's, and is negative when the
 * free fit found a better solution elsewhere. A minimum on the window's edge
 * is flagged atEdge. The class is the best family's in the window unless no
 * template improves on the continuum there at all.
 */
export function refitNear(spectrum: Spectrum, zCentre: number, options: FitOptions = {}): FitResult {
  const fail = (m: string): DetailedFit => ({ result: failed(spectrum, m), featureSnrs: [] });
  return guarded(spectrum, () => {
    if (!Number.isFinite(zCentre) || zCentre <= -1) return fail(`cannot refit near z = ${zCentre}`);
    const p = prepare(spectrum, options);
    if (typeof p === 'string') return fail(p);
    const centre = shiftOfZ(zCentre, DLOG10);
    const half = pixelsOfVelocity(REFIT_HALF_WIDTH_KMS, DLOG10);
    const wLo = Math.ceil(centre - half);
    const wHi = Math.floor(centre + half);
    const inside: RefinedCandidate[] = [];
    for (const fs of p.scans) {
      const lo = Math.max(fs.lo, wLo);
      const hi = Math.min(fs.hi, wHi);
      if (hi - lo < 2) continue;
      for (const m of scanMinima(fs, lo, hi, 1)) inside.push(refineScanMinimum(p, m, lo, hi, true));
    }
    if (inside.length === 0) return fail(`no template family covers z = ${zCentre.toFixed(4)}`);
    const chosen = orderCandidates(mergeDistinct(inside))[0];
    const free = freeCandidates(p);
    const others = mergeDistinct(free).filter(
      (c) => Math.abs(velocitySeparationKms(c.z, chosen.z)) >= Math.max(distinctKms(c.family.class), distinctKms(chosen.family.class)),
    );
    return assemble(spectrum, p, [chosen, ...others], options, 'refit');
  }).result;
}
