import { describe, expect, it } from 'vitest';
import { evaluateFull, evaluateFullSlow, makeRefineContext } from '../../../src/core/engine/refine';
import { polyBasis, type ScanData } from '../../../src/core/engine/scan';
import { templateFamilies } from '../../../src/core/engine/templates';
import { valueAt } from '../../../src/core/engine/restArray';
import { forestDepth } from '../../../src/core/engine/forest';
import { DLOG10 } from '../../../src/core/engine/logGrid';
import { makeRng } from './synth';

/** Slow obvious chi2: explicit design matrix (polynomial times the forest multiplier, modulated template columns), normal equations by elimination. */
function slowChi2(data: ScanData, P: number, s: number, K: number): number {
  const fam = templateFamilies().find((f) => f.id === 'qso')!;
  const n = data.flux.length;
  const poly = polyBasis(n, P);
  const cols: Float64Array[] = [];
  const lyaK = Math.log10(1215.67) / DLOG10 + s;
  const llK = Math.log10(911.75) / DLOG10 + s;
  for (let a = 0; a < P; a++)
    cols.push(poly[a].map((p, i) => {
      const k = data.k0 + i;
      const lam = Math.pow(10, k * DLOG10);
      return p * (k >= lyaK ? 1 : k < llK ? 0 : 1 - forestDepth(lam));
    }));
  for (let j = 0; j < K; j++) {
    const v = new Float64Array(n);
    for (const piece of fam.vectors[j].pieces)
      for (let i = 0; i < n; i++) {
        const k = data.k0 + i;
        const lam = Math.pow(10, k * DLOG10);
        const m = piece.modulation === 'forestTransmission' ? 1 - forestDepth(lam) : piece.modulation === 'forestDepth' ? forestDepth(lam) : 1;
        v[i] += valueAt(piece.rest, k - s) * m;
      }
    cols.push(v);
  }
  const m = cols.length;
  const A = Array.from({ length: m }, () => new Array(m + 1).fill(0));
  for (let a = 0; a < m; a++) {
    for (let b = 0; b < m; b++) for (let i = 0; i < n; i++) A[a][b] += data.ivar[i] * cols[a][i] * cols[b][i];
    for (let i = 0; i < n; i++) A[a][m] += data.ivar[i] * cols[a][i] * data.flux[i];
  }
  for (let c = 0; c < m; c++)
    for (let r = 0; r < m; r++) {
      if (r === c) continue;
      const f = A[r][c] / A[c][c];
      for (let k = c; k <= m; k++) A[r][k] -= f * A[c][k];
    }
  const x = A.map((row, a) => row[m] / row[a]);
  let chi2 = 0;
  for (let i = 0; i < n; i++) {
    let model = 0;
    for (let a = 0; a < m; a++) model += x[a] * cols[a][i];
    chi2 += data.ivar[i] * (data.flux[i] - model) ** 2;
  }
  return chi2;
}

describe('evaluateFull (quasar, forest on the continuum by prefix sums)', () => {
  it('equals the explicit least-squares chi2 with the forest multiplier on every pixel', () => {
    const rng = makeRng(21);
    const n = 2800;
    const k0 = Math.round(Math.log10(3600) / DLOG10);
    const data: ScanData = {
      k0,
      flux: Float64Array.from({ length: n }, () => 1 + 0.3 * rng.gauss()),
      ivar: Float64Array.from({ length: n }, () => (rng.next() < 0.05 ? 0 : 0.5 + rng.next())),
    };
    const P = 5;
    const ctx = makeRefineContext(data, P, DLOG10);
    const fam = templateFamilies().find((f) => f.id === 'qso')!;
    // z ~ 2.9 and ~ 3.3: Ly-alpha, C IV and (at 3.3) the Lyman limit inside these 2800 pixels (3600-6900 A)
    for (const s of [5910, 6350]) {
      // Ly-alpha (both wing pieces), C IV near and far: inside; amplitudes unconstrained.
      const K = 3;
      const active = fam.vectors.map((_, j) => j < K);
      const fast = evaluateFull(ctx, fam, s, active).chi2;
      const slow = slowChi2(data, P, s, K);
      // round-off only (keep-the-slow-version rule)
      expect(Math.abs(fast - slow) / slow).toBeLessThan(1e-9);
    }
  });
});

describe('evaluateFull (scratch columns over their spans) against evaluateFullSlow (explicit columns)', () => {
  it('gives the same chi2 and amplitudes for every family at shifts across its range', () => {
    const rng = makeRng(5);
    const n = 3000;
    const k0 = Math.round(Math.log10(3800) / DLOG10);
    const data: ScanData = {
      k0,
      flux: Float64Array.from({ length: n }, () => 1 + 0.3 * rng.gauss()),
      ivar: Float64Array.from({ length: n }, () => (rng.next() < 0.05 ? 0 : 0.5 + rng.next())),
    };
    const ctx = makeRefineContext(data, 5, DLOG10);
    for (const fam of templateFamilies()) {
      const lo = Math.ceil(Math.log10(1 + fam.zMin) / DLOG10);
      const hi = Math.floor(Math.log10(1 + fam.zMax) / DLOG10);
      // Random shifts, plus (quasar) z ~ 3.6-5.1, where the Lyman-limit vector lies wholly below the limit's pixel.
      const extra = fam.forestOnContinuum ? [6630, 7000, 7404, 7850] : [];
      for (let t = 0; t < 6 + extra.length; t++) {
        const s = t < 6 ? lo + Math.floor(rng.next() * (hi - lo + 1)) : extra[t - 6];
        const a = evaluateFull(ctx, fam, s);
        const b = evaluateFullSlow(ctx, fam, s);
        // same sums in another order: round-off only (keep-the-slow-version rule)
        expect(Math.abs(a.chi2 - b.chi2) / b.chi2, `${fam.id} s=${s}`).toBeLessThan(1e-10);
        expect(a.active, `${fam.id} s=${s}`).toEqual(b.active);
      }
    }
  });
});
