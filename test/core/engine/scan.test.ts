import { describe, expect, it } from 'vitest';
import {
  chi2FromSums, chi2FromSumsGeneral, dataSpectra, fftSizeFor, polyBasis, scanConstants, scanDirect, scanFFT, scanSmall, scanSumsDirect, scanSumsFFT, scanSumsSmall,
  weightedOrthonormalBasis, type ScanData,
} from '../../../src/core/engine/scan';
import { binRest, withSupport } from '../../../src/core/engine/restArray';
import { templateFamilies } from '../../../src/core/engine/templates';
import { makeRng } from './synth';

function randomData(n: number, k0: number, seed: number): ScanData {
  const r = makeRng(seed);
  const flux = Float64Array.from({ length: n }, () => 1 + r.gauss());
  const ivar = Float64Array.from({ length: n }, () => (r.next() < 0.05 ? 0 : 0.5 + r.next()));
  return { k0, flux, ivar };
}

describe('scan', () => {
  it('FFT sums equal the direct sums to 1e-9 relative (quasar scan vectors, binned by 2)', () => {
    const fam = templateFamilies().find((f) => f.id === 'qso')!;
    const vecs = fam.scanVectors.map((v) => binRest(v, 2));
    const data = randomData(700, 17790, 3);
    const sMin = 0;
    const sMax = 1800;
    const fft = scanSumsFFT(data, vecs, sMin, sMax, 3, 'test-qso@2');
    const dir = scanSumsDirect(data, vecs, sMin, sMax, 3);
    const all = (s: typeof fft) => [...s.tf, ...s.tp, ...s.tt.filter((a): a is Float64Array => a !== null)];
    const A = all(fft);
    const B = all(dir);
    expect(A.length).toBe(B.length);
    let scale = 0;
    for (const arr of B) for (const v of arr) scale = Math.max(scale, Math.abs(v));
    let worst = 0;
    for (let q = 0; q < A.length; q++) for (let s = 0; s < A[q].length; s++) worst = Math.max(worst, Math.abs(A[q][s] - B[q][s]));
    // FFT round-off relative to the largest sum (keep-the-slow-version rule)
    expect(worst / scale).toBeLessThan(1e-9);
    const c = scanConstants(data, 3);
    const chiF = chi2FromSums(fft, c).chi2;
    const chiD = chi2FromSums(dir, c).chi2;
    for (let s = 0; s < chiF.length; s += 37) expect(chiF[s]).toBeCloseTo(chiD[s], 5);
  });

  it('scanSumsSmall (stars, short ranges) equals the direct sums to 1e-12 relative', () => {
    const fam = templateFamilies().find((f) => f.id === 'galaxy-sf')!;
    const vecs = fam.scanVectors.map((v) => binRest(v, 3));
    const data = randomData(900, 11870, 5);
    const a = scanSumsSmall(data, vecs, -12, 40, 3);
    const b = scanSumsDirect(data, vecs, -12, 40, 3);
    const all = (s: typeof a) => [...s.tf, ...s.tp, ...s.tt.filter((x): x is Float64Array => x !== null)];
    const A = all(a);
    const B = all(b);
    expect(A.length).toBe(B.length);
    let scale = 0;
    let worst = 0;
    for (const arr of B) for (const v of arr) scale = Math.max(scale, Math.abs(v));
    for (let q = 0; q < A.length; q++) for (let s = 0; s < A[q].length; s++) worst = Math.max(worst, Math.abs(A[q][s] - B[q][s]));
    expect(scale).toBeGreaterThan(0);
    // same sums in a different order: round-off only (keep-the-slow-version rule)
    expect(worst / scale).toBeLessThan(1e-12);
  });

  it('scanDirect with one template and no polynomial is the linear-amplitude formula of the reference sheet (sec. 5)', () => {
    // f = (1,3,2), t = (1,2,3), sigma = (1,1,2): chi2_min = 1.0344827586 [C]
    const t = withSupport(100, Float64Array.from([1, 2, 3]));
    const data: ScanData = { k0: 100, flux: Float64Array.from([1, 3, 2]), ivar: Float64Array.from([1, 1, 0.25]) };
    const r = scanDirect(data, [t], 0, 0, 0);
    expect(r.chi2[0]).toBeCloseTo(1.0344827586, 9);
  });

  it('finds the shift of an injected template (FFT and direct agree on the minimum)', () => {
    const line = new Float64Array(300);
    for (let j = 0; j < 300; j++) line[j] = Math.exp(-0.5 * ((j - 150) / 3) ** 2) + 0.6 * Math.exp(-0.5 * ((j - 60) / 3) ** 2);
    const t = withSupport(1000, line);
    const r = makeRng(11);
    const n = 400;
    const trueShift = 137;
    const flux = new Float64Array(n);
    for (let i = 0; i < n; i++) {
      const k = 1200 + i - trueShift - 1000;
      flux[i] = 3 + 0.001 * i + (k >= 0 && k < 300 ? 2 * line[k] : 0) + 0.2 * r.gauss();
    }
    const data: ScanData = { k0: 1200, flux, ivar: new Float64Array(n).fill(25) };
    const a = scanFFT(data, [t], 0, 300, 2, 'test-inject');
    const b = scanDirect(data, [t], 0, 300, 2);
    const argmin = (x: Float64Array) => x.indexOf(Math.min(...x));
    expect(a.sMin + argmin(a.chi2)).toBe(trueShift);
    expect(argmin(a.chi2)).toBe(argmin(b.chi2));
  });

  it('the weighted-orthonormal basis gives the chi2 of the Legendre basis (FFT and small-range sums)', () => {
    const fam = templateFamilies().find((f) => f.id === 'galaxy-sf')!;
    const vecs = fam.scanVectors.map((v) => binRest(v, 3));
    const data = randomData(900, 11870, 9);
    const P = 5;
    const q = weightedOrthonormalBasis(data, P)!;
    const cq = scanConstants(data, P, q);
    // sum w q_a q_b = delta_ab (definition of the basis)
    expect(cq.orthonormal).toBe(true);
    const cl = scanConstants(data, P);
    expect(cl.orthonormal).toBe(false);
    const sMin = 0;
    const sMax = 1300;
    const ds = dataSpectra(data, P, fftSizeFor(data.flux.length, sMax - sMin + 1), q);
    const fast = chi2FromSums(scanSumsFFT(data, vecs, sMin, sMax, P, 'test-ortho', ds), cq).chi2;
    // slow reference: direct sums in the Legendre basis, full NNLS at every shift
    const slow = chi2FromSumsGeneral(scanSumsDirect(data, vecs, sMin, sMax, P), cl).chi2;
    let worst = 0;
    for (let s = 0; s < fast.length; s++) worst = Math.max(worst, Math.abs(fast[s] - slow[s]) / slow[s]);
    // round-off only (keep-the-slow-version rule)
    expect(worst).toBeLessThan(1e-9);
    const small = scanSmall(data, vecs, 400, 440, P, 3e-4, cq, q).chi2;
    const smallRef = scanDirect(data, vecs, 400, 440, P, 3e-4, cl).chi2;
    for (let s = 0; s < small.length; s++) expect(Math.abs(small[s] - smallRef[s]) / smallRef[s]).toBeLessThan(1e-9);
  });

  it('dataSpectra with a reuse slot gives the same spectra as fresh arrays, and the slot is overwritten by the next call', () => {
    const P = 5;
    const a = randomData(700, 11870, 21);
    const b = randomData(700, 11900, 22);
    const L = fftSizeFor(a.flux.length, 600);
    const qa = weightedOrthonormalBasis(a, P)!;
    const qb = weightedOrthonormalBasis(b, P)!;
    const fresh = dataSpectra(a, P, L, qa);
    const pooled = dataSpectra(a, P, L, qa, 'test-slot');
    // the same arithmetic into other buffers: bit for bit equal (self-consistency)
    expect(Array.from(pooled.wf)).toEqual(Array.from(fresh.wf));
    expect(Array.from(pooled.w)).toEqual(Array.from(fresh.w));
    for (let k = 0; k < P; k++) expect(Array.from(pooled.wp[k])).toEqual(Array.from(fresh.wp[k]));
    const wfA = Array.from(pooled.wf);
    const again = dataSpectra(b, P, L, qb, 'test-slot');
    expect(again.wf).toBe(pooled.wf);
    expect(Array.from(again.wf)).toEqual(Array.from(dataSpectra(b, P, L, qb).wf));
    expect(Array.from(again.wf)).not.toEqual(wfA);
  });

  it('one template in the orthonormal basis (the passive-galaxy scan) equals the general NNLS at every shift', () => {
    const fam = templateFamilies().find((f) => f.id === 'galaxy-passive')!;
    const vecs = fam.scanVectors.map((v) => binRest(v, 3));
    expect(vecs.length).toBe(1);
    const data = randomData(900, 11870, 13);
    const q = weightedOrthonormalBasis(data, 5)!;
    const cq = scanConstants(data, 5, q);
    const sums = scanSumsDirect(data, vecs, 0, 400, 5, q);
    const fast = chi2FromSums(sums, cq);
    const slow = chi2FromSumsGeneral(scanSumsDirect(data, vecs, 0, 400, 5), scanConstants(data, 5));
    for (let s = 0; s < fast.chi2.length; s++) {
      // round-off only (keep-the-slow-version rule)
      expect(Math.abs(fast.chi2[s] - slow.chi2[s]) / slow.chi2[s]).toBeLessThan(1e-9);
      expect(fast.nActive[s]).toBe(slow.nActive[s]);
    }
  });

  it('polyBasis gives Legendre P0..P2 at the ends and middle', () => {
    // P2(x) = (3x^2 - 1)/2 (Legendre, standard)
    const p = polyBasis(5, 3);
    expect(Array.from(p[1])).toEqual([-1, -0.5, 0, 0.5, 1]);
    expect(p[2][0]).toBeCloseTo(1, 14);
    expect(p[2][2]).toBeCloseTo(-0.5, 14);
  });
});
