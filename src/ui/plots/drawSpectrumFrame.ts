/**
 * One frame of the spectrum canvas: uncertainty band, masked-pixel strip, flux
 * and model, clipped to the plot rectangle. Budgeted by pixels: when the visible
 * samples exceed DECIMATE_POINTS_PER_COLUMN per device-pixel column, each
 * column is drawn from its first/min/max/last. Pure apart from the context it is
 * handed, so a benchmark can time frames in a real browser.
 */
import { decimateMinMax, DECIMATE_POINTS_PER_COLUMN, lowerBound, upperBound, type MinMaxColumns } from './decimate';
import type { DisplaySeries } from './displaySeries';
import { SPECTRUM_COLOURS } from './palette';

/** The part of a 2-D canvas context the frame uses (a real CanvasRenderingContext2D fits). */
export type Canvas2DLike = Pick<
  CanvasRenderingContext2D,
  | 'setTransform' | 'clearRect' | 'save' | 'restore' | 'beginPath' | 'rect' | 'clip' | 'moveTo' | 'lineTo'
  | 'closePath' | 'stroke' | 'fill' | 'fillRect' | 'setLineDash' | 'fillStyle' | 'strokeStyle' | 'lineWidth'
  | 'globalAlpha' | 'lineJoin'
>;

/** A rectangle in CSS pixels from the canvas' top-left corner. */
export interface PlotRect {
  left: number;
  top: number;
  width: number;
  height: number;
}

export interface SpectrumFrame {
  /** Canvas size, CSS px. */
  widthPx: number;
  heightPx: number;
  /** Device pixels per CSS pixel (window.devicePixelRatio). */
  pixelRatio: number;
  plot: PlotRect;
  /** Visible observed wavelength window, Angstrom. */
  xDomainA: readonly [number, number];
  /** Visible flux window, flux units. */
  yDomain: readonly [number, number];
  series: DisplaySeries;
  /** Model flux on the same wavelength grid, or null. */
  model: Float64Array | null;
  /** A second solution's model for comparison (drawn dashed), or null. */
  compareModel?: Float64Array | null;
  /** Quasar broad-line fits on the same grid, NaN outside their ranges (drawn in short dashes), or null. */
  physicsModel?: Float64Array | null;
  /** 'auto' (default) decimates past DECIMATE_POINTS_PER_COLUMN per column; the others force a path, for tests and benchmarks. */
  decimate?: 'auto' | 'always' | 'never';
}

export interface FrameStats {
  mode: 'points' | 'columns';
  /** Samples in (or bordering) the visible window. */
  visiblePoints: number;
  /** Device-pixel columns across the plot. */
  columns: number;
}

/** Vertices of one column closer than this (CSS px) are merged: they add stroke work but no pixels. */
const SAME_VERTEX_PX = 0.25;

/** Height of the masked-pixel strip along the bottom of the plot, CSS px. */
export const MASK_STRIP_PX = 6;
/** Canvas coordinates are clamped to this many CSS px beyond the frame, so wild values cannot break a path. */
const FAR_PX = 1e5;

export function drawSpectrumFrame(ctx: Canvas2DLike, f: SpectrumFrame): FrameStats {
  const dpr = f.pixelRatio > 0 ? f.pixelRatio : 1;
  const { left, top, width, height } = f.plot;
  ctx.setTransform(dpr, 0, 0, dpr, 0, 0);
  ctx.clearRect(0, 0, f.widthPx, f.heightPx);
  const w = f.series.wavelengthA;
  const [x0, x1] = f.xDomainA;
  const [y0, y1] = f.yDomain;
  const nCols = Math.max(1, Math.round(width * dpr));
  if (!(x1 > x0) || !(y1 > y0) || w.length < 2 || width <= 0 || height <= 0) {
    return { mode: 'points', visiblePoints: 0, columns: nCols };
  }
  // One sample beyond each edge, so the line runs out of the frame instead of stopping short.
  const i0 = Math.max(0, lowerBound(w, x0) - 1);
  const i1 = Math.min(w.length, upperBound(w, x1) + 1);
  const visible = i1 - i0;
  const byColumns = f.decimate === 'always' || (f.decimate !== 'never' && visible > DECIMATE_POINTS_PER_COLUMN * nCols);

  const sx = width / (x1 - x0);
  const sy = height / (y1 - y0);
  const X = (v: number) => left + (v - x0) * sx;
  const Y = (v: number) => {
    const p = top + height - (v - y0) * sy;
    return p < top - FAR_PX ? top - FAR_PX : p > top + height + FAR_PX ? top + height + FAR_PX : p;
  };
  const colX = (c: number) => left + (c + 0.5) / dpr;

  ctx.save();
  ctx.beginPath();
  ctx.rect(left, top, width, height);
  ctx.clip();
  ctx.lineJoin = 'miter';
  ctx.setLineDash([]);

  drawMask(ctx, f, i0, i1, X, dpr);

  const { bandLow, bandHigh } = f.series;
  if (bandLow && bandHigh) {
    ctx.globalAlpha = SPECTRUM_COLOURS.bandAlpha;
    ctx.fillStyle = SPECTRUM_COLOURS.band;
    fillBandColumns(ctx, w, bandLow, bandHigh, x0, x1, nCols, left, dpr, Y);
    ctx.globalAlpha = 1;
  }

  // One way to draw every curve: min/max per column when zoomed out, the points when zoomed in.
  const curve = (y: Float64Array | null | undefined, colour: string, width: number, dash: number[] = []) => {
    if (!y || y.length !== w.length) return;
    ctx.strokeStyle = colour;
    ctx.lineWidth = width;
    ctx.setLineDash(dash);
    ctx.beginPath();
    if (byColumns) traceColumns(ctx, decimateMinMax(w, y, x0, x1, nCols), colX, Y);
    else tracePoints(ctx, w, y, i0, i1, X, Y);
    ctx.stroke();
    ctx.setLineDash([]);
  };
  curve(f.series.flux, SPECTRUM_COLOURS.flux, 1);
  curve(f.compareModel, SPECTRUM_COLOURS.compare, 1.5, [6, 4]);
  curve(f.model, SPECTRUM_COLOURS.model, 1.5);
  curve(f.physicsModel, SPECTRUM_COLOURS.physics, 2.5, [5, 3]);
  ctx.restore();
  return { mode: byColumns ? 'columns' : 'points', visiblePoints: visible, columns: nCols };
}

/** Polyline through finite samples; a NaN lifts the pen (a gap). */
export function tracePoints(
  ctx: Canvas2DLike,
  x: Float64Array,
  y: Float64Array,
  i0: number,
  i1: number,
  X: (v: number) => number,
  Y: (v: number) => number,
): void {
  let pen = false;
  for (let i = i0; i < i1; i++) {
    const v = y[i];
    if (!Number.isFinite(v)) {
      pen = false;
      continue;
    }
    if (pen) ctx.lineTo(X(x[i]), Y(v));
    else ctx.moveTo(X(x[i]), Y(v));
    pen = true;
  }
}

/**
 * Per column: first -> min -> max -> last at the column centre; an empty column
 * lifts the pen. Min and max are skipped when the column is monotonic, and a
 * vertex within SAME_VERTEX_PX of the one before is skipped, so a smooth curve
 * costs at most two vertices per column (a wide stroke pays for every join).
 */
export function traceColumns(ctx: Canvas2DLike, cols: MinMaxColumns, colX: (c: number) => number, Y: (v: number) => number): void {
  let pen = false;
  for (let c = 0; c < cols.nColumns; c++) {
    if (cols.count[c] === 0) {
      pen = false;
      continue;
    }
    const px = colX(c);
    let last = Y(cols.first[c]);
    if (pen) ctx.lineTo(px, last);
    else ctx.moveTo(px, last);
    const first = cols.first[c];
    const lastV = cols.last[c];
    // Monotonic inside the column: first and last are already the extremes.
    const monotonic = (cols.min[c] === first && cols.max[c] === lastV) || (cols.max[c] === first && cols.min[c] === lastV);
    if (!monotonic) {
      const yMin = Y(cols.min[c]);
      const yMax = Y(cols.max[c]);
      if (Math.abs(yMin - last) > SAME_VERTEX_PX) ctx.lineTo(px, (last = yMin));
      if (Math.abs(yMax - last) > SAME_VERTEX_PX) ctx.lineTo(px, (last = yMax));
    }
    const yLast = Y(lastV);
    if (Math.abs(yLast - last) > SAME_VERTEX_PX) ctx.lineTo(px, yLast);
    pen = true;
  }
}

/**
 * The 1-sigma band, one device-pixel-wide rectangle per column from the highest
 * upper edge to the lowest lower edge of the samples in it; a column with no
 * sample (zoomed in past one sample per column) takes the band linearly
 * interpolated at its centre between the samples either side, unless a gap
 * (NaN) lies between them. Rectangles take the fast fill path, where a jagged
 * polygon of thousands of vertices is slow to rasterise in software.
 */
function fillBandColumns(
  ctx: Canvas2DLike,
  w: Float64Array,
  low: Float64Array,
  high: Float64Array,
  x0: number,
  x1: number,
  nCols: number,
  left: number,
  dpr: number,
  Y: (v: number) => number,
): void {
  const lo = decimateMinMax(w, low, x0, x1, nCols);
  const hi = decimateMinMax(w, high, x0, x1, nCols);
  const colW = 1 / dpr;
  const stepA = (x1 - x0) / nCols;
  let j = lowerBound(w, x0);
  for (let c = 0; c < nCols; c++) {
    let top: number;
    let bottom: number;
    if (lo.count[c] > 0 && hi.count[c] > 0) {
      top = Y(hi.max[c]);
      bottom = Y(lo.min[c]);
    } else {
      const xc = x0 + (c + 0.5) * stepA;
      while (j < w.length && w[j] < xc) j++;
      if (j === 0 || j >= w.length) continue;
      const a = j - 1;
      if (!(Number.isFinite(low[a]) && Number.isFinite(high[a]) && Number.isFinite(low[j]) && Number.isFinite(high[j]))) continue;
      const t = (xc - w[a]) / (w[j] - w[a]);
      top = Y(high[a] + t * (high[j] - high[a]));
      bottom = Y(low[a] + t * (low[j] - low[a]));
    }
    ctx.fillRect(left + c * colW, top, colW, Math.max(colW, bottom - top));
  }
}

/** Masked runs: a faint full-height shade plus a solid strip along the bottom edge. */
function drawMask(ctx: Canvas2DLike, f: SpectrumFrame, i0: number, i1: number, X: (v: number) => number, dpr: number): void {
  const { mask, wavelengthA: w } = f.series;
  const { top, height } = f.plot;
  const minW = 1 / dpr;
  let i = i0;
  ctx.fillStyle = SPECTRUM_COLOURS.mask;
  while (i < i1) {
    while (i < i1 && !mask[i]) i++;
    if (i >= i1) break;
    const a = i;
    while (i < i1 && mask[i]) i++;
    const b = i - 1;
    // a pixel covers half-way to its neighbours
    const la = a > 0 ? 0.5 * (w[a - 1] + w[a]) : w[a];
    const lb = b < w.length - 1 ? 0.5 * (w[b] + w[b + 1]) : w[b];
    const pa = X(la);
    const pw = Math.max(minW, X(lb) - pa);
    ctx.globalAlpha = 0.12;
    ctx.fillRect(pa, top, pw, height);
    ctx.globalAlpha = 1;
    ctx.fillRect(pa, top + height - MASK_STRIP_PX, pw, MASK_STRIP_PX);
  }
}
