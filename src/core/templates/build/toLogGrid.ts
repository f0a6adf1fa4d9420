/**
 * A tabulated rest-frame spectrum onto the engine's absolute log grid
 * (engine/logGrid.ts): each pixel gets the mean of the piecewise-linear
 * interpolant over the pixel (exact flux conservation whether the table is
 * finer or coarser than the grid). Pixels not fully covered are NaN.
 */
import { DLOG10 } from '../../engine/logGrid';
import { segmentIndex } from '../../numeric/interpolate';

export function toLogGrid(wavelengthA: Float64Array, flux: Float64Array, kLo: number, kHi: number): Float64Array {
  const n = kHi - kLo + 1;
  const out = new Float64Array(n).fill(NaN);
  // Cumulative integral of the interpolant at each table point.
  const cum = new Float64Array(wavelengthA.length);
  for (let i = 1; i < wavelengthA.length; i++) cum[i] = cum[i - 1] + 0.5 * (flux[i] + flux[i - 1]) * (wavelengthA[i] - wavelengthA[i - 1]);
  const integralTo = (x: number): number => {
    const lo = segmentIndex(wavelengthA, x);
    const hi = lo + 1;
    const x0 = wavelengthA[lo];
    const t = x - x0;
    const slope = (flux[hi] - flux[lo]) / (wavelengthA[hi] - x0);
    return cum[lo] + t * (flux[lo] + 0.5 * slope * t);
  };
  const first = wavelengthA[0];
  const last = wavelengthA[wavelengthA.length - 1];
  for (let j = 0; j < n; j++) {
    const k = kLo + j;
    const a = Math.pow(10, (k - 0.5) * DLOG10);
    const b = Math.pow(10, (k + 0.5) * DLOG10);
    if (a < first || b > last) continue;
    out[j] = (integralTo(b) - integralTo(a)) / (b - a);
  }
  return out;
}

/** Gaussian convolution of a log-grid array (a velocity broadening: sigma in pixels = sigma_v / 69.03 km/s); NaN stays NaN. */
export function broadenLog(values: Float64Array, sigmaPix: number): Float64Array {
  if (!(sigmaPix > 0)) return values;
  const h = Math.ceil(4 * sigmaPix);
  const kern = Float64Array.from({ length: 2 * h + 1 }, (_, i) => Math.exp(-0.5 * ((i - h) / sigmaPix) ** 2));
  const out = new Float64Array(values.length).fill(NaN);
  for (let j = 0; j < values.length; j++) {
    if (!Number.isFinite(values[j])) continue;
    let s = 0;
    let w = 0;
    for (let i = -h; i <= h; i++) {
      const v = values[j + i];
      if (v === undefined || !Number.isFinite(v)) continue;
      s += kern[i + h] * v;
      w += kern[i + h];
    }
    out[j] = s / w;
  }
  return out;
}

/** Replace NaN runs inside the array by linear interpolation between their finite neighbours (ends stay NaN). */
export function interpolateGaps(values: Float64Array): Float64Array {
  const out = Float64Array.from(values);
  let j = 0;
  while (j < out.length) {
    if (Number.isFinite(out[j])) {
      j++;
      continue;
    }
    let e = j;
    while (e < out.length && !Number.isFinite(out[e])) e++;
    if (j > 0 && e < out.length) {
      const a = out[j - 1];
      const b = out[e];
      for (let i = j; i < e; i++) out[i] = a + ((b - a) * (i - j + 1)) / (e - j + 1);
    }
    j = e;
  }
  return out;
}
