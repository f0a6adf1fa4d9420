/**
 * Rest-frame template vectors sampled on the shared log grid (logGrid.ts).
 * values[j] is the rest-frame flux density at absolute pixel kStart + j; the
 * vector is zero outside [kStart, kStart + values.length). `lo`/`hi` bound the
 * non-zero part (absolute, inclusive), so sparse line vectors cost little.
 */
import { DLOG10 } from './logGrid';

export interface RestArray {
  kStart: number;
  values: Float64Array;
  /** First and last absolute pixel with a non-zero value (lo > hi when all zero). */
  lo: number;
  hi: number;
  /**
   * Rest wavelengths (Angstrom) of the line centres an emission vector carries;
   * such a vector is only used at shifts that put one of them inside the data
   * (a line wing hanging off the end of a spectrum must not fit its edge).
   */
  peaksA?: number[];
}

/** Rest-frame span every template covers, Angstrom: far-UV to near-IR. */
export const REST_MIN_A = 300;
export const REST_MAX_A = 30000;

/** Sample f(lambda_rest in A) at every fine-grid pixel centre of [REST_MIN_A, REST_MAX_A]. */
export function sampleRest(f: (lambdaA: number) => number): RestArray {
  const { kStart, lambdaA } = restGrid();
  const values = new Float64Array(lambdaA.length);
  for (let j = 0; j < values.length; j++) values[j] = f(lambdaA[j]);
  return withSupport(kStart, values);
}

let grid: { kStart: number; lambdaA: Float64Array } | null = null;

/** The rest-frame pixel centres, Angstrom (computed once: every template samples the same grid). */
function restGrid(): { kStart: number; lambdaA: Float64Array } {
  if (!grid) {
    const d = DLOG10;
    const kStart = Math.floor(Math.log10(REST_MIN_A) / d);
    const kEnd = Math.ceil(Math.log10(REST_MAX_A) / d);
    const lambdaA = new Float64Array(kEnd - kStart + 1);
    for (let j = 0; j < lambdaA.length; j++) lambdaA[j] = Math.pow(10, (kStart + j) * d);
    grid = { kStart, lambdaA };
  }
  return grid;
}

/** Build a RestArray and find its non-zero span. */
export function withSupport(kStart: number, values: Float64Array): RestArray {
  let a = 0;
  while (a < values.length && values[a] === 0) a++;
  let b = values.length - 1;
  while (b >= 0 && values[b] === 0) b--;
  return { kStart, values, lo: kStart + a, hi: kStart + b };
}

/** Value at absolute pixel k (0 outside). */
export function valueAt(r: RestArray, k: number): number {
  const j = k - r.kStart;
  return j >= 0 && j < r.values.length ? r.values[j] : 0;
}

/** Scale so the largest |value| is 1 (keeps normal equations well conditioned). */
export function normalisePeak(r: RestArray): RestArray {
  let m = 0;
  for (let j = 0; j < r.values.length; j++) m = Math.max(m, Math.abs(r.values[j]));
  if (m === 0) return r;
  const v = r.values.map((x) => x / m);
  return { ...r, values: v };
}

/** Weighted sum of rest arrays sharing kStart and length. */
export function combine(parts: { r: RestArray; weight: number }[]): RestArray {
  const base = parts[0].r;
  const v = new Float64Array(base.values.length);
  for (const { r, weight } of parts) {
    if (r.kStart !== base.kStart || r.values.length !== v.length) throw new Error('combine: arrays on different spans');
    for (let j = 0; j < v.length; j++) v[j] += weight * r.values[j];
  }
  const out = withSupport(base.kStart, v);
  if (parts.every((p) => p.r.peaksA)) out.peaksA = parts.flatMap((p) => p.r.peaksA!);
  return out;
}

/**
 * Bin by `factor` on absolute indices (binned pixel K = mean of fine pixels
 * factor*K .. factor*K + factor - 1), the same alignment binLogSpectrum uses.
 */
export function binRest(r: RestArray, factor: number): RestArray {
  if (factor === 1) return r;
  const K0 = Math.floor(r.kStart / factor);
  const K1 = Math.floor((r.kStart + r.values.length - 1) / factor);
  const v = new Float64Array(K1 - K0 + 1);
  for (let j = 0; j < r.values.length; j++) v[Math.floor((r.kStart + j) / factor) - K0] += r.values[j] / factor;
  const out = withSupport(K0, v);
  if (r.peaksA) out.peaksA = r.peaksA;
  return out;
}
