/**
 * The fast scan: chi2 of one family's scan vectors (plus the continuum
 * polynomial) at every shift of its redshift range on the binned data, from
 * FFT correlation sums (kernels/correlationSums.ts) and one small solve per
 * shift (kernels/shiftSolve.ts). Only a guide to where the minima are: every
 * candidate is then scored with the family's full model (model.ts).
 */
import { correlationSums } from './kernels/correlationSums';
import { makeShiftSolver, solveShift } from './kernels/shiftSolve';
import type { Family } from './family';
import { binVectors } from './family';
import { DLOG10, shiftOfZ } from './logGrid';
import type { WeightedData } from './scanData';
import type { FitWorkspace } from './workspace';

export interface FamilyScan {
  family: Family;
  /** Binning of the scan data (fine pixels per scan pixel). */
  binning: number;
  /** Scan shifts sLo..sHi (binned pixels); chi2[s - sLo]. */
  sLo: number;
  sHi: number;
  chi2: Float64Array;
}

/** Binned shift range of a family, optionally capped at zMax; null when empty. */
export function shiftRange(f: Family, binning: number, zMax = Infinity): [number, number] | null {
  const lo = Math.ceil(shiftOfZ(f.zMin, DLOG10 * binning) - 1e-9);
  const hi = Math.floor(shiftOfZ(Math.min(f.zMax, zMax), DLOG10 * binning) + 1e-9);
  return hi >= lo ? [lo, hi] : null;
}

export function scanFamily(ws: FitWorkspace, data: WeightedData, family: Family, binning: number, range: [number, number]): FamilyScan {
  const [sLo, sHi] = range;
  const { kStart, vectors } = ws.binnedVectors(family, 'scan', binning, () => binVectors(family.scanVectors, family.kStart, binning));
  const sums = correlationSums(ws, `${family.id}|scan|${binning}`, vectors, kStart, data, sLo, sHi);
  const K = vectors.length;
  const P = data.wq.length;
  const solver = makeShiftSolver(K, P);
  const chi2 = new Float64Array(sums.nShift);
  const { tt, tf, tq } = solver;
  for (let s = 0; s < sums.nShift; s++) {
    for (let j = 0; j < K; j++) {
      for (let l = 0; l <= j; l++) tt[j * K + l] = sums.tt[j * K + l][s];
      tf[j] = sums.tf[j][s];
      for (let a = 0; a < P; a++) tq[j * P + a] = sums.tq[j * P + a][s];
    }
    chi2[s] = solveShift(solver, data.g, data.F, family.scanNonNegative);
  }
  return { family, binning, sLo, sHi, chi2 };
}
