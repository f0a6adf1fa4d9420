/**
 * The sums a scan needs at every shift, as FFT correlations (correlation
 * theorem; Tonry & Davis 1979, AJ 84, 1511 for the redshift use):
 *   TT_jl(s) = sum_i w_i t_j(i - s) t_l(i - s)   = corr(t_j t_l, w)
 *   Tf_j(s)  = sum_i w_i f_i t_j(i - s)          = corr(t_j, w f)
 *   TQ_ja(s) = sum_i w_i q_a(i) t_j(i - s)       = corr(t_j, w q_a)
 * Tricks: two real correlations per complex FFT (CorrelationPlan); the
 * template side is transformed once per family, binning and window and kept
 * in the FitWorkspace; each template is cut to the part that can meet the
 * data, which sets the smallest FFT size without wrap-around.
 */
import { CorrelationPlan, nextPow2, type HalfSpectrum } from '../fftCorrelate';
import type { FitWorkspace } from '../workspace';

/** Data side of a scan: pixel i of each array sits at absolute (binned) index d0 + i. */
export interface ScanData {
  d0: number;
  /** w, w f, and w q_a per pixel. */
  w: Float64Array;
  wf: Float64Array;
  wq: Float64Array[];
}

/** Sums over shifts s = sLo .. sHi (index s - sLo); from correlationSums, views of the workspace's buffer, valid until its next scan. */
export interface ShiftSums {
  nShift: number;
  /** [j * K + l] (both orders point at the same array). */
  tt: Float64Array[];
  tf: Float64Array[];
  /** [j * P + a]. */
  tq: Float64Array[];
}

/** Geometry of one scan: which template slice meets the data, and the FFT size. */
interface ScanGeometry {
  t0: number;
  len: number;
  /** Lag of shift sLo in the sliced correlation. */
  mLo: number;
  L: number;
}

function geometry(kStart: number, nT: number, d0: number, nD: number, sLo: number, sHi: number): ScanGeometry | null {
  const mLo = kStart + sLo - d0;
  const mHi = kStart + sHi - d0;
  const t0 = Math.max(0, -mHi);
  const t1 = Math.min(nT - 1, nD - 1 - mLo);
  if (t1 < t0) return null;
  const len = t1 - t0 + 1;
  const a = mLo + t0;
  const b = mHi + t0;
  const L = nextPow2(Math.max(len + Math.max(b, 0) + 1, nD - Math.min(a, 0), len, nD));
  return { t0, len, mLo: a, L };
}

export function correlationSums(
  ws: FitWorkspace,
  familyKey: string,
  vectors: Float64Array[],
  kStart: number,
  data: ScanData,
  sLo: number,
  sHi: number,
): ShiftSums {
  const K = vectors.length;
  const P = data.wq.length;
  const nShift = sHi - sLo + 1;
  // every destination is a slice of the workspace's sums buffer (valid until the next scan)
  const buf = ws.sumsBuffer((K * (K + 1)) / 2 * nShift + K * nShift + K * P * nShift);
  let used = 0;
  const zero = () => {
    const d = buf.subarray(used, used + nShift);
    used += nShift;
    return d;
  };
  const geo = geometry(kStart, vectors[0].length, data.d0, data.w.length, sLo, sHi);
  const tt: Float64Array[] = new Array(K * K);
  const tf: Float64Array[] = [];
  const tq: Float64Array[] = [];
  if (!geo) {
    buf.fill(0, 0, ((K * (K + 1)) / 2 + K + K * P) * nShift);
    for (let j = 0; j < K; j++) for (let l = 0; l <= j; l++) tt[j * K + l] = tt[l * K + j] = zero();
    for (let j = 0; j < K; j++) tf.push(zero());
    for (let j = 0; j < K * P; j++) tq.push(zero());
    return { nShift, tt, tf, tq };
  }
  const plan = ws.plan(geo.L);
  const tmpl = ws.templateSpectra(`${familyKey}|${geo.L}|${geo.t0}|${geo.len}`, () => templateSpectra(plan, vectors, geo));
  const dat = ws.dataSpectra(data, geo.L, () => dataSpectra(ws, plan, data));
  // Every correlation to take: [template spectrum, data spectrum, destination].
  const jobs: [HalfSpectrum, HalfSpectrum, Float64Array][] = [];
  let p = 0;
  for (let j = 0; j < K; j++) {
    for (let l = 0; l <= j; l++) {
      const dest = zero();
      tt[j * K + l] = tt[l * K + j] = dest;
      jobs.push([tmpl.products[p++], dat.w, dest]);
    }
  }
  for (let j = 0; j < K; j++) {
    const dest = zero();
    tf.push(dest);
    jobs.push([tmpl.vectors[j], dat.wf, dest]);
  }
  for (let j = 0; j < K; j++) {
    for (let a = 0; a < P; a++) {
      const dest = zero();
      tq.push(dest);
      jobs.push([tmpl.vectors[j], dat.wq[a], dest]);
    }
  }
  for (let q = 0; q < jobs.length; q += 2) {
    const [x1, y1, d1] = jobs[q];
    const second = jobs[q + 1];
    if (second) plan.correlatePairRun(x1, y1, d1, geo.mLo, nShift, second[0], second[1], second[2]);
    else plan.correlatePairRun(x1, y1, d1, geo.mLo, nShift);
  }
  return { nShift, tt, tf, tq };
}

export interface TemplateSpectra {
  /** Half spectra of t_j t_l for j >= l in row order, then of t_j. */
  products: HalfSpectrum[];
  vectors: HalfSpectrum[];
}

function templateSpectra(plan: CorrelationPlan, vectors: Float64Array[], geo: ScanGeometry): TemplateSpectra {
  const sliced = vectors.map((v) => v.subarray(geo.t0, geo.t0 + geo.len));
  const prods: Float64Array[] = [];
  for (let j = 0; j < sliced.length; j++) {
    for (let l = 0; l <= j; l++) {
      const a = sliced[j];
      const b = sliced[l];
      prods.push(a.map((x, i) => x * b[i]));
    }
  }
  return { products: transformAll(plan, prods), vectors: transformAll(plan, sliced) };
}

export interface DataSpectra {
  w: HalfSpectrum;
  wf: HalfSpectrum;
  wq: HalfSpectrum[];
}

/** The data side's half spectra, written into arrays the workspace lends per FFT size (they live as long as the spectrum's fit). */
function dataSpectra(ws: FitWorkspace, plan: CorrelationPlan, data: ScanData): DataSpectra {
  const signals = [data.w, data.wf, ...data.wq];
  const all = transformAll(plan, signals, ws.halfSpectra(plan.size, signals.length + 1));
  return { w: all[0], wf: all[1], wq: all.slice(2) };
}

/** Half spectra of real signals, two per complex FFT; into `into` when given (one more array than signals, for an odd count). */
function transformAll(plan: CorrelationPlan, signals: Float64Array[], into?: HalfSpectrum[]): HalfSpectrum[] {
  const out: HalfSpectrum[] = [];
  for (let i = 0; i < signals.length; i += 2) {
    const [a, b] = plan.forwardPair(signals[i], signals[i + 1], into?.[i], into?.[i + 1]);
    out.push(a);
    if (i + 1 < signals.length) out.push(b);
  }
  return out;
}
