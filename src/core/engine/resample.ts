/**
 * Flux-conserving resampling onto the shared logarithmic grid (logGrid.ts).
 *
 * Each output pixel's flux density is the overlap-weighted mean of the input
 * flux densities that cover it (pixel-overlap rebinning), so the integral
 * sum(f dlambda) is kept wherever the input is good. The variance of that mean
 * is propagated exactly: var_k = sum_i a_ik^2 var_i with a_ik = o_ik / sum_i o_ik
 * (o_ik the overlap in Angstrom). Masked, non-finite and ivar = 0 input pixels
 * take no part; an output pixel less than half covered by good input gets ivar 0.
 */
import type { Spectrum } from '../types';
import { DLOG10 } from './logGrid';
import { estimateIvar } from './noiseEstimate';

/** A spectrum on the log grid: pixel j sits at absolute index k0 + j. */
export interface LogSpectrum {
  /** Absolute index of the first pixel (log10 lambda of its centre = k0 * dlog10). */
  k0: number;
  /** Pixel size in log10(lambda). */
  dlog10: number;
  /** Flux density (input units, or normalised when stated by the producer). */
  flux: Float64Array;
  /** Inverse variance of flux; 0 = no information. */
  ivar: Float64Array;
  /** True when the input carried no uncertainty and it was estimated from the data. */
  noiseEstimated: boolean;
}

/** Minimum fraction of an output pixel that good input must cover. */
const MIN_COVERAGE = 0.5;

/** Input pixel edges in Angstrom: midpoints between centres, mirrored at the ends. */
export function pixelEdgesA(wl: Float64Array): Float64Array {
  return pixelEdgesInto(wl, new Float64Array(wl.length + 1));
}

/** pixelEdgesA into e (length >= n + 1; entries past n untouched). */
function pixelEdgesInto(wl: Float64Array, e: Float64Array): Float64Array {
  const n = wl.length;
  for (let i = 1; i < n; i++) e[i] = 0.5 * (wl[i - 1] + wl[i]);
  e[0] = wl[0] - 0.5 * (wl[1] - wl[0]);
  e[n] = wl[n - 1] + 0.5 * (wl[n - 1] - wl[n - 2]);
  if (e[0] <= 0) e[0] = wl[0] * 0.5; // keep log10 defined for absurd first pixels
  return e;
}

/** Which input pixels carry information (mask clear, finite flux, positive ivar). */
export function goodPixels(s: Spectrum): Uint8Array {
  return goodPixelsInto(s, new Uint8Array(s.flux.length));
}

/** goodPixels into good (length >= n; entries past n untouched). */
function goodPixelsInto(s: Spectrum, good: Uint8Array): Uint8Array {
  const n = s.flux.length;
  for (let i = 0; i < n; i++) {
    const ok = s.mask[i] === 0 && Number.isFinite(s.flux[i]) && (s.ivar === null || s.ivar[i] > 0);
    good[i] = ok ? 1 : 0;
  }
  return good;
}

/**
 * Resample a spectrum onto the log grid (pixel size dlog10, default DLOG10).
 * When spectrum.ivar is null the noise is estimated (noiseEstimate.ts) and
 * the result says so.
 */
export function resampleToLogGrid(s: Spectrum, dlog10 = DLOG10): LogSpectrum {
  const wl = s.wavelengthA;
  const n = wl.length;
  const good = goodPixelsInto(s, scratchGood(n));
  const noiseEstimated = s.ivar === null;
  const ivarIn = s.ivar ?? estimateIvar(s.flux, good);
  const edges = pixelEdgesInto(wl, scratchEdges(n + 1));
  const k0 = Math.round(Math.log10(wl[0]) / dlog10);
  const k1 = Math.round(Math.log10(wl[n - 1]) / dlog10);
  const m = k1 - k0 + 1;
  const flux = new Float64Array(m);
  const ivar = new Float64Array(m);
  // Output edge e (between absolute pixels e - 1 and e) is 10^((e - 0.5) dlog10): from the thread's table when it covers them.
  const tab = k0 >= 0 ? edgeTable(dlog10, k1 + 1) : null;
  let i = 0;
  let hi = tab ? tab[k0] : Math.pow(10, (k0 - 0.5) * dlog10);
  for (let j = 0; j < m; j++) {
    // Each output edge once: this pixel's lower edge is the last one's upper edge (same expression).
    const lo = hi;
    hi = tab ? tab[k0 + j + 1] : Math.pow(10, (k0 + j + 0.5) * dlog10);
    while (i < n && edges[i + 1] <= lo) i++;
    let sumO = 0;
    let sumOF = 0;
    let sumO2V = 0;
    for (let p = i; p < n && edges[p] < hi; p++) {
      if (!good[p]) continue;
      const o = Math.min(hi, edges[p + 1]) - Math.max(lo, edges[p]);
      if (o <= 0) continue;
      sumO += o;
      sumOF += o * s.flux[p];
      sumO2V += (o * o) / ivarIn[p];
    }
    if (sumO >= MIN_COVERAGE * (hi - lo) && sumO2V > 0) {
      flux[j] = sumOF / sumO;
      ivar[j] = (sumO * sumO) / sumO2V;
    }
  }
  return { k0, dlog10, flux, ivar, noiseEstimated };
}

/**
 * Output pixel edges by absolute index, per pixel size, computed once per
 * thread: entry e = 10^((e - 0.5) dlog10) (the same expression as computing
 * it per spectrum). Grown on demand; null past MAX_EDGE_INDEX (then each
 * spectrum computes its own).
 */
const edgeTables = new Map<number, Float64Array>();
/** Largest absolute index kept in a table (10^(2e5 x 1e-4) A is far beyond any spectrum at the default size). */
const MAX_EDGE_INDEX = 200_000;

function edgeTable(dlog10: number, eMax: number): Float64Array | null {
  if (eMax > MAX_EDGE_INDEX) return null;
  let t = edgeTables.get(dlog10);
  if (!t || t.length <= eMax) {
    const len = Math.min(MAX_EDGE_INDEX + 1, Math.max(eMax + 1, Math.ceil(1.25 * (t?.length ?? 0))));
    const next = new Float64Array(len);
    for (let e = 0; e < len; e++) next[e] = Math.pow(10, (e - 0.5) * dlog10);
    if (edgeTables.size >= 4) edgeTables.delete(edgeTables.keys().next().value as number);
    edgeTables.set(dlog10, next);
    t = next;
  }
  return t;
}

/** Input-side scratch (edges, good-pixel flags) reused between spectra: resampleToLogGrid keeps no reference to them. */
let edgeScratch = new Float64Array(0);
let goodScratch = new Uint8Array(0);
function scratchEdges(len: number): Float64Array {
  if (edgeScratch.length < len) edgeScratch = new Float64Array(len);
  return edgeScratch;
}
function scratchGood(len: number): Uint8Array {
  if (goodScratch.length < len) goodScratch = new Uint8Array(len);
  return goodScratch;
}

/**
 * Combine groups of `factor` neighbouring pixels into one (inverse-variance
 * weighted mean), aligned on absolute indices so that binned pixel K holds
 * fine pixels factor*K .. factor*K + factor - 1. Used for the coarse scan.
 */
export function binLogSpectrum(ls: LogSpectrum, factor: number): LogSpectrum {
  if (factor === 1) return ls;
  const K0 = Math.floor(ls.k0 / factor);
  const K1 = Math.floor((ls.k0 + ls.flux.length - 1) / factor);
  const m = K1 - K0 + 1;
  const flux = new Float64Array(m);
  const ivar = new Float64Array(m);
  for (let j = 0; j < ls.flux.length; j++) {
    const w = ls.ivar[j];
    if (!(w > 0)) continue;
    const J = Math.floor((ls.k0 + j) / factor) - K0;
    flux[J] += w * ls.flux[j];
    ivar[J] += w;
  }
  for (let J = 0; J < m; J++) if (ivar[J] > 0) flux[J] /= ivar[J];
  return { k0: K0, dlog10: ls.dlog10 * factor, flux, ivar, noiseEstimated: ls.noiseEstimated };
}
