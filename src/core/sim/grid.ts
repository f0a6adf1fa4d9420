/** Observed-frame wavelength grids for simulated spectra (vacuum Angstrom). */

export type GridSpec =
  | { kind: 'log10'; startA: number; endA: number; dLog10: number }
  | { kind: 'linear'; startA: number; endA: number; stepA: number };

/**
 * Default grid: 3600-9200 A observed, uniform in log10 lambda with 1e-4 per
 * pixel (69.03 km/s per pixel; docs/reference.md sec. 3), 4,075 pixels — the
 * kind of grid a typical multi-object fibre spectrograph delivers.
 */
export const DEFAULT_GRID: GridSpec = { kind: 'log10', startA: 3600, endA: 9200, dLog10: 1e-4 };

/** Pixel centres of a grid, Angstrom; the last centre is <= endA. */
export function makeGrid(spec: GridSpec): Float64Array {
  if (spec.kind === 'log10') {
    const l0 = Math.log10(spec.startA);
    const n = Math.floor((Math.log10(spec.endA) - l0) / spec.dLog10 + 1e-9) + 1;
    const out = new Float64Array(n);
    for (let i = 0; i < n; i++) out[i] = Math.pow(10, l0 + i * spec.dLog10);
    return out;
  }
  const n = Math.floor((spec.endA - spec.startA) / spec.stepA + 1e-9) + 1;
  const out = new Float64Array(n);
  for (let i = 0; i < n; i++) out[i] = spec.startA + i * spec.stepA;
  return out;
}

/** Local pixel width at pixel i, Angstrom (centred difference; one-sided at the ends). */
export function pixelWidthA(wl: Float64Array, i: number): number {
  const n = wl.length;
  if (n < 2) return 1;
  if (i <= 0) return wl[1] - wl[0];
  if (i >= n - 1) return wl[n - 1] - wl[n - 2];
  return 0.5 * (wl[i + 1] - wl[i - 1]);
}
