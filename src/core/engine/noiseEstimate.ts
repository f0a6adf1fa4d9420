/**
 * Inverse variance estimated from the data when a file carries no uncertainty.
 *
 * For white noise of standard deviation sigma, first differences d_i = f_(i+1) - f_i
 * have standard deviation sigma sqrt(2); a robust scale of d (1.4826 x median
 * absolute deviation, the Gaussian consistency factor, common practice) over a
 * running block therefore estimates the local sigma while ignoring smooth
 * continuum and most of a line's steep sides.
 */
import { median } from '../numeric/median';

/** Pixels per block over which the local noise is taken as constant. */
const BLOCK_PIX = 64;
/** Half-width, in blocks, of the window each block's estimate uses. */
const HALF_WINDOW_BLOCKS = 2;
/** Gaussian consistency factor of the median absolute deviation. */
const MAD_TO_SIGMA = 1.4826;


/** Robust sigma of first differences divided by sqrt(2); NaN when too few values. */
function diffSigma(d: number[]): number {
  if (d.length < 5) return NaN;
  const med = median(d);
  const dev = d.map((x) => Math.abs(x - med));
  return (MAD_TO_SIGMA * median(dev)) / Math.SQRT2;
}

/**
 * Estimated inverse variance per pixel (same units as flux^-2); pixels where
 * `good[i]` is 0 get 0. Falls back to the global estimate where a block has
 * too few good neighbours, and to a tiny floor when the data are constant.
 */
export function estimateIvar(flux: Float64Array, good: Uint8Array): Float64Array {
  const n = flux.length;
  const out = new Float64Array(n);
  const diffs: number[] = new Array(n).fill(NaN);
  const all: number[] = [];
  for (let i = 0; i + 1 < n; i++) {
    if (good[i] && good[i + 1]) {
      diffs[i] = flux[i + 1] - flux[i];
      all.push(diffs[i]);
    }
  }
  let globalSigma = diffSigma(all);
  if (!(globalSigma > 0)) {
    // Constant (or nearly) data: fall back to a small fraction of the flux level.
    const levels: number[] = [];
    for (let i = 0; i < n; i++) if (good[i]) levels.push(Math.abs(flux[i]));
    globalSigma = 1e-3 * (median(levels) || 1);
  }
  const nBlocks = Math.ceil(n / BLOCK_PIX);
  const blockSigma = new Float64Array(nBlocks);
  for (let b = 0; b < nBlocks; b++) {
    const from = Math.max(0, (b - HALF_WINDOW_BLOCKS) * BLOCK_PIX);
    const to = Math.min(n - 1, (b + 1 + HALF_WINDOW_BLOCKS) * BLOCK_PIX);
    const d: number[] = [];
    for (let i = from; i < to; i++) if (!Number.isNaN(diffs[i])) d.push(diffs[i]);
    const s = d.length >= 20 ? diffSigma(d) : NaN;
    blockSigma[b] = s > 0 ? s : globalSigma;
  }
  for (let i = 0; i < n; i++) {
    if (!good[i]) continue;
    const s = blockSigma[Math.floor(i / BLOCK_PIX)];
    out[i] = 1 / (s * s);
  }
  return out;
}
