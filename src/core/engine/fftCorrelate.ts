/**
 * Circular cross-correlation of real signals with FFTs (fft.js, radix-4,
 * power-of-two sizes): c(m) = sum_i x(i) y(i + m mod L), computed as the
 * inverse transform of conj(X) Y (correlation theorem; Tonry & Davis 1979,
 * AJ 84, 1511 for its use on redshifts). Two real signals share one complex
 * transform each way (x + i y packing), halving the work.
 */
import FFT from 'fft.js';

/** Half spectrum: complex values k = 0 .. L/2, interleaved (re, im). */
export type HalfSpectrum = Float64Array;

export class CorrelationPlan {
  readonly size: number;
  private readonly fft: FFT;
  private readonly bufIn: Float64Array;
  private readonly bufOut: Float64Array;

  constructor(size: number) {
    if (size < 4 || (size & (size - 1)) !== 0) throw new Error(`FFT size must be a power of two >= 4, got ${size}`);
    this.size = size;
    this.fft = new FFT(size);
    this.bufIn = new Float64Array(2 * size);
    this.bufOut = new Float64Array(2 * size);
  }

  /**
   * Half spectra of two real signals (each zero-padded to the plan size;
   * `b` may be omitted). Element i of a signal sits at position i. The
   * results go into outA/outB when given (length L + 2 each; reused buffers
   * spare the garbage collector), else into new arrays.
   */
  forwardPair(a: Float64Array, b?: Float64Array, outA?: HalfSpectrum, outB?: HalfSpectrum): [HalfSpectrum, HalfSpectrum] {
    const L = this.size;
    const zin = this.bufIn;
    zin.fill(0);
    for (let i = 0; i < a.length && i < L; i++) zin[2 * i] = a[i];
    if (b) for (let i = 0; i < b.length && i < L; i++) zin[2 * i + 1] = b[i];
    this.fft.transform(this.bufOut, zin);
    const Z = this.bufOut;
    const h = L / 2 + 1;
    const A = outA ?? new Float64Array(2 * h);
    const B = outB ?? new Float64Array(2 * h);
    for (let k = 0; k < h; k++) {
      const kk = k === 0 ? 0 : L - k;
      const zr = Z[2 * k];
      const zi = Z[2 * k + 1];
      const wr = Z[2 * kk];
      const wi = Z[2 * kk + 1];
      A[2 * k] = 0.5 * (zr + wr);
      A[2 * k + 1] = 0.5 * (zi - wi);
      B[2 * k] = 0.5 * (zi + wi);
      B[2 * k + 1] = 0.5 * (wr - zr);
    }
    return [A, B];
  }

  /**
   * Two correlations at once: c1 = corr(x1, y1), c2 = corr(x2, y2) (second
   * pair optional), each of length L, written into out1/out2.
   */
  correlatePair(X1: HalfSpectrum, Y1: HalfSpectrum, out1: Float64Array, X2?: HalfSpectrum, Y2?: HalfSpectrum, out2?: Float64Array): void {
    this.inversePair(X1, Y1, X2, Y2);
    const L = this.size;
    const V = this.bufOut;
    const inv = 1 / L;
    for (let m = 0; m < L; m++) out1[m] = V[2 * m] * inv;
    if (out2) for (let m = 0; m < L; m++) out2[m] = -V[2 * m + 1] * inv;
  }

  /**
   * correlatePair writing only the lags a scan needs: c((mFrom + i) mod L)
   * for i = 0 .. count - 1 into dest1[i] (and dest2[i]), in shift order.
   */
  correlatePairRun(
    X1: HalfSpectrum, Y1: HalfSpectrum, dest1: Float64Array, mFrom: number, count: number,
    X2?: HalfSpectrum, Y2?: HalfSpectrum, dest2?: Float64Array,
  ): void {
    this.inversePair(X1, Y1, X2, Y2);
    const L = this.size;
    const V = this.bufOut;
    const inv = 1 / L;
    let m = ((mFrom % L) + L) % L;
    for (let i = 0; i < count; i++) {
      dest1[i] = V[2 * m] * inv;
      if (dest2) dest2[i] = -V[2 * m + 1] * inv;
      if (++m === L) m = 0;
    }
  }

  /** bufOut = fft(conj(W)), W_k = C1_k + i C2_k; c1 = Re / L, c2 = -Im / L. */
  private inversePair(X1: HalfSpectrum, Y1: HalfSpectrum, X2?: HalfSpectrum, Y2?: HalfSpectrum): void {
    const L = this.size;
    const h = L / 2;
    const W = this.bufIn;
    // W_k = C1_k + i C2_k, C = conj(X) Y; we fill conj(W) and use a forward
    // transform: ifft(W) = conj(fft(conj(W))) / L.
    for (let k = 0; k <= h; k++) {
      const xr = X1[2 * k], xi = X1[2 * k + 1], yr = Y1[2 * k], yi = Y1[2 * k + 1];
      const a = xr * yr + xi * yi;
      const bb = xr * yi - xi * yr;
      let c = 0;
      let d = 0;
      if (X2 && Y2) {
        const ur = X2[2 * k], ui = X2[2 * k + 1], vr = Y2[2 * k], vi = Y2[2 * k + 1];
        c = ur * vr + ui * vi;
        d = ur * vi - ui * vr;
      }
      // conj(W_k) for k <= L/2
      W[2 * k] = a - d;
      W[2 * k + 1] = -(bb + c);
      if (k > 0 && k < h) {
        // k' = L - k: C(k') = conj(C(k)) -> conj(W_k') = (a + d, bb - c)
        const kk = L - k;
        W[2 * kk] = a + d;
        W[2 * kk + 1] = bb - c;
      }
    }
    this.fft.transform(this.bufOut, W);
  }
}

/** Smallest power of two >= n (and >= 4). */
export function nextPow2(n: number): number {
  let p = 4;
  while (p < n) p *= 2;
  return p;
}

/** The slow obvious version, for tests: c(m) = sum_i x(i) y((i + m) mod L). */
export function correlateDirect(x: Float64Array, y: Float64Array, L: number): Float64Array {
  const c = new Float64Array(L);
  for (let m = 0; m < L; m++) {
    let s = 0;
    for (let i = 0; i < x.length; i++) s += x[i] * (y[(i + m) % L] ?? 0);
    c[m] = s;
  }
  return c;
}
