/**
 * GridData -> the weighted arrays every least-squares sum uses: w, w f and
 * w q_a for the continuum polynomials q_a orthonormal under w, over a window
 * that is the same for most spectra of a survey (so the template transforms
 * in the FitWorkspace are reused), plus the shift-free sums F and g.
 */
import type { ScanData } from './kernels/correlationSums';
import { weightedOrthonormalPolys } from './polynomial';
import type { GridData } from './prepare';
import { DLOG10 } from './logGrid';

/** Observed window every scan covers at least, Angstrom: the usual optical range, so equal windows share cached transforms. */
export const WINDOW_A: readonly [number, number] = [3400, 10500];

export interface WeightedData extends ScanData {
  /** The data itself (flux, and the polynomials for building model curves). */
  flux: Float64Array;
  q: Float64Array[];
  /** sum w f^2, and g_a = sum w f q_a. */
  F: number;
  g: Float64Array;
  /** Pixels with w > 0. */
  nGood: number;
  /** Pixel size in log10(lambda) of this data. */
  dlog10: number;
}

/** `windowed`: pad to WINDOW_A (scan data); otherwise the data's own span (fine refinement). */
export function weightedData(d: GridData, binning: number, P: number, windowed: boolean): WeightedData {
  let d0 = d.k0;
  let end = d.k0 + d.flux.length - 1;
  if (windowed) {
    d0 = Math.min(d0, Math.floor(Math.log10(WINDOW_A[0]) / (DLOG10 * binning)));
    end = Math.max(end, Math.ceil(Math.log10(WINDOW_A[1]) / (DLOG10 * binning)));
  }
  const n = end - d0 + 1;
  const off = d.k0 - d0;
  const w = new Float64Array(n);
  const flux = new Float64Array(n);
  for (let i = 0; i < d.flux.length; i++) {
    const wi = d.ivar[i] > 0 && Number.isFinite(d.flux[i]) ? d.ivar[i] : 0;
    w[off + i] = wi;
    flux[off + i] = wi > 0 ? d.flux[i] : 0;
  }
  // polynomials over the data's own span (the window's padding has w = 0 anyway)
  const qData = weightedOrthonormalPolys(w.subarray(off, off + d.flux.length), P);
  const q: Float64Array[] = [];
  for (const v of qData) {
    if (off === 0 && v.length === n) q.push(v);
    else {
      const full = new Float64Array(n);
      full.set(v, off);
      q.push(full);
    }
  }
  const wf = new Float64Array(n);
  let F = 0;
  let nGood = 0;
  for (let i = 0; i < n; i++) {
    wf[i] = w[i] * flux[i];
    F += wf[i] * flux[i];
    if (w[i] > 0) nGood++;
  }
  const wq: Float64Array[] = [];
  const g = new Float64Array(q.length);
  for (let a = 0; a < q.length; a++) {
    const qa = q[a];
    const v = new Float64Array(n);
    let s = 0;
    for (let i = 0; i < n; i++) {
      v[i] = qa[i] * w[i];
      s += v[i] * flux[i];
    }
    wq.push(v);
    g[a] = s;
  }
  return { d0, w, wf, wq, flux, q, F, g, nGood, dlog10: DLOG10 * binning };
}
