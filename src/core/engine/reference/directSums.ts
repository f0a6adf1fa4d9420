/**
 * The slow, obvious version of kernels/correlationSums.ts: every sum at every
 * shift by a plain loop. Imported only by tests, which check the FFT kernel
 * against it.
 */
import type { ScanData, ShiftSums } from '../kernels/correlationSums';

export function directSums(vectors: Float64Array[], kStart: number, data: ScanData, sLo: number, sHi: number): ShiftSums {
  const K = vectors.length;
  const P = data.wq.length;
  const nShift = sHi - sLo + 1;
  const tt: Float64Array[] = [];
  for (let q = 0; q < K * K; q++) tt.push(new Float64Array(nShift));
  const tf = Array.from({ length: K }, () => new Float64Array(nShift));
  const tq = Array.from({ length: K * P }, () => new Float64Array(nShift));
  for (let s = sLo; s <= sHi; s++) {
    for (let i = 0; i < data.w.length; i++) {
      const t = data.d0 + i - s - kStart;
      if (t < 0 || t >= vectors[0].length) continue;
      for (let j = 0; j < K; j++) {
        const vj = vectors[j][t];
        for (let l = 0; l < K; l++) tt[j * K + l][s - sLo] += data.w[i] * vj * vectors[l][t];
        tf[j][s - sLo] += data.wf[i] * vj;
        for (let a = 0; a < P; a++) tq[j * P + a][s - sLo] += data.wq[a][i] * vj;
      }
    }
  }
  return { nShift, tt, tf, tq };
}
