/**
 * Spectrum -> FitResult, in the order the steps run:
 *   1. prepare.ts      mask artifacts, resample to the log grid, weights, bin for the scan
 *   2. scan.ts         every family's scan vectors at every shift (FFT sums: kernels/)
 *   3. candidates.ts   each family's distinct minima, scored with the full model (model.ts)
 *                      and refined on the fine grid (refine.ts)
 *   4. classify.ts     families compared on one footing (BIC on the scaled chi2)
 *   5. measureLines.ts line table at the best solution; its detections drive
 *   6. confidence.ts   the machine score and grade
 * Every step is a function of its inputs and the caller's FitWorkspace.
 * Over 300 lines because it holds the whole order of the steps and the two
 * entry points (free fit and a reviewer's refit) that share them.
 */
import type { Candidate, ChiSquareCurve, FitResult, LineMeasurement, Spectrum, SpectrumClass } from '../types';
import { failedResult } from '../failedResult';
import { publishedFamilies } from '../templates';
import { distinctKms, fineRange, refineCandidate, scanMinima, scoreMinimum, type ScoredCandidate } from './candidates';
import { chargedParams, chi2Scale, rankingScore } from './classify';
import { confidenceFeatures, confidenceScore, gradeOf } from './confidence';
import { familyFromBasis, type Family } from './family';
import { countFeatures } from './features';
import { DLOG10, pixelsOfVelocity, shiftOfZ, velocitySeparationKms, zOfShift } from './logGrid';
import { measureLines } from './measureLines';
import { prepareData, SCAN_BINNING, type PreparedData } from './prepare';
import { binLogSpectrum } from './resample';
import { scanFamily, shiftRange, type FamilyScan } from './scan';
import { weightedData, type WeightedData } from './scanData';
import { TEMPLATE_SET_ID, ENGINE_VERSION } from './version';
import { FitWorkspace } from './workspace';
import { withFloor } from './errorFloor';

/** Continuum polynomial terms in the observed frame: 5 absorb real flux-calibration errors (the former engine measured 3 vs 5 on the real set: 46/58 vs 50/58). */
export const DEFAULT_POLY_TERMS = 5;
/**
 * The scan's polynomial terms: 3 for galaxies and stars, whose scans have
 * several vectors and long FFTs (each term costs one correlation per vector);
 * 5 for quasars, whose three scan vectors need the polynomial for the
 * continuum's shape (on the project simulator 146 of 160 quasars right with
 * 5, 136 with 3) and whose 552 km/s scan is cheap. The scan only proposes
 * minima; every one is scored with DEFAULT_POLY_TERMS.
 */
export function scanPolyTerms(cls: SpectrumClass): number {
  return cls === 'qso' ? 5 : 3;
}
/** Scan minima scored per family: the best and the family's runner-up (stars: the best; their +-1000 km/s holds one solution). */
export const MINIMA_PER_FAMILY = 2;
/**
 * Candidates refined on the fine grid: the solution only. The others keep
 * the scan's parabola (z good to tens of km/s); a reviewer who picks one
 * gets it refined by refitNear.
 */
export const REFINE_TOP = 1;
/**
 * Fine pixels per scan pixel by class: quasars 8 (552 km/s; broad lines are
 * >= 2000 km/s wide, and 8 keeps their long 0 < z < 6.5 scan in 2048-point
 * FFTs), the others SCAN_BINNING. Every candidate is then scored on the
 * SCAN_BINNING data.
 */
export function scanBinningOf(cls: SpectrumClass): number {
  return cls === 'qso' ? 8 : SCAN_BINNING;
}
/** Largest number of points per chi-square curve. */
export const CURVE_MAX_POINTS = 1500;
/** Half-width of the refitNear window, km/s. */
export const REFIT_HALF_WIDTH_KMS = 3000;
/** The best solution must beat the polynomial alone by this much (scaled chi2) or the class is 'unknown': 5 sigma for one parameter (common practice). */
export const UNKNOWN_DCHI2 = 25;

export interface FitOptions {
  /** Family ids to try (default: all). */
  families?: readonly string[];
  /** Upper limit on redshift for every family. */
  zMax?: number;
  polyTerms?: number;
  /** Measure catalogue lines at the best solution (default true). */
  measureLines?: boolean;
  /** The thread's workspace: the browser worker and the CLI thread each make one; without it, one kept per module instance (i.e. per thread) is used. */
  workspace?: FitWorkspace;
  /** Families to fit instead of the published ones (held-out tests, calibration). */
  templateFamilies?: readonly Family[];
}

let defaultFamilies: Family[] | null = null;
/** The engine's families from the published templates (decoded once). */
export function engineFamilies(): Family[] {
  defaultFamilies ??= publishedFamilies().map(familyFromBasis);
  return defaultFamilies;
}

let defaultWs: FitWorkspace | null = null;
function workspaceOf(o: FitOptions): FitWorkspace {
  if (o.workspace) return o.workspace;
  defaultWs ??= new FitWorkspace();
  return defaultWs;
}

interface Prepared {
  data: PreparedData;
  scanData: WeightedData;
  /** The fine-grid data (built on first use). */
  fine: () => WeightedData;
  scans: FamilyScan[];
  ws: FitWorkspace;
  input: FitResult['input'];
}

function prepare(spectrum: Spectrum, o: FitOptions, ws: FitWorkspace): Prepared | string {
  const data = prepareData(spectrum);
  if (typeof data === 'string') return data;
  const P = o.polyTerms ?? DEFAULT_POLY_TERMS;
  const scanData = weightedData(data.binned, SCAN_BINNING, P, true);
  let fineData: WeightedData | null = null;
  const fine = () => (fineData ??= weightedData(data.fine, 1, P, false));
  const wanted = o.families ? new Set(o.families) : null;
  const scans: FamilyScan[] = [];
  const dataAt = new Map<string, WeightedData>();
  for (const f of o.templateFamilies ?? engineFamilies()) {
    if (wanted && !wanted.has(f.id)) continue;
    const b = scanBinningOf(f.class);
    const Pscan = Math.min(P, scanPolyTerms(f.class));
    let d = dataAt.get(`${b}|${Pscan}`);
    if (!d) {
      if (b === SCAN_BINNING) {
        // Gram-Schmidt is sequential: the first Pscan orthonormal polynomials of the scoring data are the scan's
        d = { ...scanData, q: scanData.q.slice(0, Pscan), wq: scanData.wq.slice(0, Pscan), g: scanData.g.slice(0, Pscan) };
      } else {
        const bl = binLogSpectrum({ ...data.fine, dlog10: DLOG10, noiseEstimated: data.noiseEstimated }, b);
        d = weightedData({ k0: bl.k0, flux: bl.flux, ivar: bl.ivar }, b, Pscan, true);
      }
      dataAt.set(`${b}|${Pscan}`, d);
    }
    const range = shiftRange(f, b, o.zMax);
    if (range) scans.push(scanFamily(ws, d, f, b, range));
  }
  if (scans.length === 0) return 'no template family covers the requested redshift range';
  const wl = spectrum.wavelengthA;
  return {
    data,
    scanData,
    fine,
    scans,
    ws,
    input: { nPix: wl.length, lambdaMinA: wl[0], lambdaMaxA: wl[wl.length - 1], meta: spectrum.meta, format: spectrum.format, medianSnr: data.medianSnr },
  };
}

/** Candidates of every family within fine shifts [lo, hi] (default: each family's range). */
function candidatesOf(p: Prepared, ws: FitWorkspace, o: FitOptions, window?: [number, number]): ScoredCandidate[] {
  const out: ScoredCandidate[] = [];
  for (const scan of p.scans) {
    const [fLo, fHi] = fineRange(scan.family, o.zMax);
    const lo = window ? Math.max(fLo, window[0]) : fLo;
    const hi = window ? Math.min(fHi, window[1]) : fHi;
    if (hi - lo < 2) continue;
    const range = { lo, hi, edgeLo: window ? true : lo === fLo, edgeHi: window ? true : hi === fHi };
    for (const s of scanMinima(scan, window || scan.family.class === 'star' ? 1 : MINIMA_PER_FAMILY, lo, hi)) out.push(scoreMinimum(ws, p.scanData, SCAN_BINNING, scan, s, range));
  }
  return out;
}

/** Refine the best REFINE_TOP candidates (candidates is ranked). */
function refineBest(p: Prepared, ranked: Ranked[]): Ranked[] {
  return ranked.map((r, i) => (i < REFINE_TOP ? { c: refineCandidate(p.ws, p.fine(), 1, r.c), rank: r.rank } : r));
}

interface Ranked {
  c: ScoredCandidate;
  rank: number;
}

/** Rank by the family-comparison rule; a minimum on a range edge goes after every interior one. */
function rankAll(cands: ScoredCandidate[], nGood: number): { ranked: Ranked[]; scale: number } {
  if (cands.length === 0) return { ranked: [], scale: 1 };
  const byChi2 = [...cands].sort((a, b) => a.fit.chi2 - b.fit.chi2);
  const scale = chi2Scale(byChi2[0].fit, nGood);
  const ranked = cands.map((c) => ({ c, rank: rankingScore({ chi2: c.fit.chi2, nParams: chargedParams(c.family, c.fit) }, scale, nGood) }));
  ranked.sort((a, b) => Number(a.c.atEdge) - Number(b.c.atEdge) || a.rank - b.rank);
  return { ranked, scale };
}

/** Refinement can move a solution onto a range edge: such solutions go after every interior one. */
function reorderEdges(r: Ranked[]): Ranked[] {
  return [...r].sort((a, b) => Number(a.c.atEdge) - Number(b.c.atEdge) || a.rank - b.rank);
}

function distinct(a: ScoredCandidate, b: ScoredCandidate): boolean {
  return Math.abs(velocitySeparationKms(a.z, b.z)) >= Math.max(distinctKms(a.family.class), distinctKms(b.family.class));
}

/** Curves: each family's scan chi2 minus the lowest scan chi2 of any family, down-sampled. */
function curvesOf(scans: FamilyScan[]): ChiSquareCurve[] {
  let best = Infinity;
  for (const s of scans) for (const v of s.chi2) best = Math.min(best, v);
  return scans.map((s) => {
    const n = s.chi2.length;
    const m = Math.min(n, CURVE_MAX_POINTS);
    const z = new Float64Array(m);
    const y = new Float64Array(m);
    for (let q = 0; q < m; q++) {
      const i0 = Math.floor((q * n) / m);
      const i1 = Math.floor(((q + 1) * n) / m);
      let k = i0;
      for (let i = i0 + 1; i < i1; i++) if (s.chi2[i] < s.chi2[k]) k = i;
      z[q] = zOfShift((s.sLo + k) * s.binning, DLOG10);
      y[q] = s.chi2[k] - best;
    }
    return { family: s.family.id, z, deltaChi2: y };
  });
}

function failed(spectrum: Spectrum, message: string): FitResult {
  const wl = spectrum.wavelengthA;
  return {
    ...failedResult(spectrum.file, message),
    noiseEstimated: spectrum.ivar === null,
    input: { nPix: wl.length, lambdaMinA: wl[0], lambdaMaxA: wl[wl.length - 1], medianSnr: NaN, meta: spectrum.meta, format: spectrum.format },
  };
}

/** A fit plus what its grade was computed from (calibration, diagnostics). */
export interface DetailedFit {
  result: FitResult;
  featureSnrs: number[];
  /** Scaled chi2 improvement of the best solution over the polynomial alone. */
  dPoly: number;
}

type FitMode = 'free' | 'refit';

function assemble(spectrum: Spectrum, p: Prepared, ranked: Ranked[], scale: number, o: FitOptions, mode: FitMode): DetailedFit {
  if (ranked.length === 0) return { result: failed(spectrum, 'no chi-square minimum found in the redshift range'), featureSnrs: [], dPoly: 0 };
  const best = ranked[0];
  const runner = ranked.slice(1).find((r) => distinct(r.c, best.c));
  const chi2Gap = runner ? runner.rank - best.rank : Infinity;
  const chi2Poly = p.scanData.F - p.scanData.g.reduce((s, x) => s + x * x, 0);
  const dPoly = (chi2Poly - best.c.fit.chi2) / scale;
  let cls: SpectrumClass = best.c.family.class;
  if (mode === 'free' ? dPoly < UNKNOWN_DCHI2 : !(dPoly > 0)) cls = 'unknown';
  let lines: LineMeasurement[] = [];
  if (o.measureLines !== false && cls !== 'unknown') {
    try {
      lines = measureLines(spectrum, best.c.z, cls);
    } catch {
      lines = [];
    }
  }
  const feats = countFeatures(lines);
  const confIn = { cls, chi2Gap, nFeatures: feats.n, featureSnrs: feats.snrs, atEdge: best.c.atEdge, medianSnr: p.data.medianSnr };
  const score = confidenceScore(confIn);
  const bestC = withFloor(best.c, p.input.lambdaMinA, p.input.lambdaMaxA);
  const dofOf = (c: ScoredCandidate) => Math.max(1, p.scanData.nGood - c.fit.nParams);
  const candidates: Candidate[] = ranked.map((r) => {
    const c = r === best ? bestC : withFloor(r.c, p.input.lambdaMinA, p.input.lambdaMaxA);
    return { z: c.z, zErr: c.zErr, family: c.family.id, class: c.family.class, chi2: c.fit.chi2, dof: dofOf(c), deltaChi2: r.rank - best.rank, atEdge: c.atEdge };
  });
  const result: FitResult = {
    file: spectrum.file,
    status: 'ok',
    candidates,
    z: bestC.z,
    zErr: bestC.zErr,
    class: cls,
    score,
    confidence: gradeOf(score, confidenceFeatures(confIn)),
    chi2Gap,
    nFeatures: feats.n,
    curves: curvesOf(p.scans),
    lines,
    noiseEstimated: p.data.noiseEstimated,
    templateSet: TEMPLATE_SET_ID,
    engineVersion: ENGINE_VERSION,
    input: p.input,
    masked: p.data.masked,
  };
  return { result, featureSnrs: feats.snrs, dPoly };
}

function guarded(spectrum: Spectrum, ws: FitWorkspace, run: () => DetailedFit): DetailedFit {
  try {
    return run();
  } catch (e) {
    return { result: failed(spectrum, `internal fitting error: ${(e as Error)?.message ?? String(e)}`), featureSnrs: [], dPoly: 0 };
  } finally {
    ws.releaseData();
  }
}

/** fitSpectrum plus what its grade was computed from. */
export function fitSpectrumDetailed(spectrum: Spectrum, o: FitOptions = {}): DetailedFit {
  const ws = workspaceOf(o);
  return guarded(spectrum, ws, () => {
    const p = prepare(spectrum, o, ws);
    if (typeof p === 'string') return { result: failed(spectrum, p), featureSnrs: [], dPoly: 0 };
    const { ranked, scale } = rankAll(candidatesOf(p, ws, o), p.scanData.nGood);
    return assemble(spectrum, p, reorderEdges(refineBest(p, ranked)), scale, o, 'free');
  });
}

/** Fit every template family over its redshift range. Never throws on a valid Spectrum. */
export function fitSpectrum(spectrum: Spectrum, o: FitOptions = {}): FitResult {
  return fitSpectrumDetailed(spectrum, o).result;
}

/**
 * Fit again with the best solution restricted to +-REFIT_HALF_WIDTH_KMS of
 * zCentre, across all families (a reviewer clicking the curve or naming a
 * line). The candidates list starts with the best solution in the window,
 * then the free fit's distinct solutions outside it; chi2Gap is negative when
 * the free fit found a better solution elsewhere.
 */
export function refitNear(spectrum: Spectrum, zCentre: number, o: FitOptions = {}): FitResult {
  const ws = workspaceOf(o);
  return guarded(spectrum, ws, () => {
    const fail = (m: string): DetailedFit => ({ result: failed(spectrum, m), featureSnrs: [], dPoly: 0 });
    if (!Number.isFinite(zCentre) || zCentre <= -1) return fail(`cannot refit near z = ${zCentre}`);
    const p = prepare(spectrum, o, ws);
    if (typeof p === 'string') return fail(p);
    const centre = shiftOfZ(zCentre, DLOG10);
    const half = pixelsOfVelocity(REFIT_HALF_WIDTH_KMS, DLOG10);
    const inside = candidatesOf(p, ws, o, [Math.ceil(centre - half), Math.floor(centre + half)]);
    if (inside.length === 0) return fail(`no template family covers z = ${zCentre.toFixed(4)}`);
    const free = candidatesOf(p, ws, o);
    const { ranked, scale } = rankAll([...inside, ...free], p.scanData.nGood);
    const chosen = ranked.find((r) => inside.includes(r.c))!;
    const others = ranked.filter((r) => free.includes(r.c) && distinct(r.c, chosen.c));
    const [c0, ...rest] = refineBest(p, [chosen, ...others]);
    return assemble(spectrum, p, [c0, ...reorderEdges(rest)], scale, o, 'refit');
  }).result;
}
