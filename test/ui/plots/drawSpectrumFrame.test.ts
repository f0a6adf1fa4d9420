import { describe, expect, it } from 'vitest';
import { drawSpectrumFrame, MASK_STRIP_PX, type SpectrumFrame } from '../../../src/ui/plots/drawSpectrumFrame';
import { buildDisplaySeries } from '../../../src/ui/plots/displaySeries';
import { SPECTRUM_COLOURS } from '../../../src/ui/plots/palette';
import { RecordingContext, type RecordedPath } from './recordingContext';

function synthetic(n: number) {
  const w = Float64Array.from({ length: n }, (_, i) => 3800 + i * 0.27);
  const flux = Float64Array.from({ length: n }, (_, i) => 5 + Math.sin(i * 0.05) + ((i * 7919) % 13) / 13);
  flux[n >> 1] = 80; // a spike the decimated path must keep
  const ivar = new Float64Array(n).fill(4);
  const mask = new Uint8Array(n);
  return { w, flux, ivar, mask };
}

function frame(n: number, over: Partial<SpectrumFrame> = {}, maskRuns: [number, number][] = []): SpectrumFrame {
  const d = synthetic(n);
  for (const [a, b] of maskRuns) d.mask.fill(1, a, b);
  const series = buildDisplaySeries(d.w, d.flux, d.ivar, d.mask, 1);
  return {
    widthPx: 600,
    heightPx: 300,
    pixelRatio: 1,
    plot: { left: 50, top: 20, width: 500, height: 250 },
    xDomainA: [d.w[0], d.w[n - 1]],
    yDomain: [0, 100],
    series,
    model: null,
    ...over,
  };
}

function strokeOf(ctx: RecordingContext, style: string): RecordedPath {
  const p = ctx.paths.find((q) => q.op === 'stroke' && q.style === style);
  if (!p) throw new Error(`missing stroke ${style}`);
  return p;
}

function yExtent(p: RecordedPath): [number, number] {
  const ys = p.subpaths.flat().map((q) => q[1]);
  return [Math.min(...ys), Math.max(...ys)];
}

describe('drawSpectrumFrame(ctx, frame)', () => {
  it('decimates by columns past 4 points per column, and draws points below that', () => {
    expect(drawSpectrumFrame(new RecordingContext(), frame(20_000)).mode).toBe('columns');
    expect(drawSpectrumFrame(new RecordingContext(), frame(1_000)).mode).toBe('points');
    // device pixels: at pixel ratio 2 there are twice the columns
    expect(drawSpectrumFrame(new RecordingContext(), frame(3_000, { pixelRatio: 2 })).columns).toBe(1000);
  });

  it('the decimated flux path spans the same pixel rows as the full path (slow version vs fast)', () => {
    const f = frame(20_000);
    const fast = new RecordingContext();
    const slow = new RecordingContext();
    drawSpectrumFrame(fast, { ...f, decimate: 'always' });
    drawSpectrumFrame(slow, { ...f, decimate: 'never' });
    const a = yExtent(strokeOf(fast, SPECTRUM_COLOURS.flux));
    const b = yExtent(strokeOf(slow, SPECTRUM_COLOURS.flux));
    expect(a[0]).toBeCloseTo(b[0], 9);
    expect(a[1]).toBeCloseTo(b[1], 9);
    // and costs at most 4 vertices per column
    expect(strokeOf(fast, SPECTRUM_COLOURS.flux).subpaths.flat().length).toBeLessThanOrEqual(4 * 500);
  });

  it('keeps the per-column extremes of a zoomed view equal to a scan of the samples in each column', () => {
    const f = frame(20_000, { xDomainA: [5000, 5400] }); // about 1480 samples over 500 columns
    const ctx = new RecordingContext();
    drawSpectrumFrame(ctx, { ...f, decimate: 'always' });
    const path = strokeOf(ctx, SPECTRUM_COLOURS.flux).subpaths.flat();
    const byCol = new Map<number, number[]>();
    for (const [x, y] of path) {
      const c = Math.floor(x - 50);
      byCol.set(c, [...(byCol.get(c) ?? []), y]);
    }
    const Y = (v: number) => 20 + 250 - (v / 100) * 250;
    const w = f.series.wavelengthA;
    for (const c of [0, 77, 250, 499]) {
      const inCol: number[] = [];
      for (let i = 0; i < w.length; i++) {
        const px = 50 + ((w[i] - 5000) / 400) * 500;
        if (px >= 50 + c && px < 51 + c) inCol.push(Y(f.series.flux[i]));
      }
      const drawn = byCol.get(c)!;
      // vertices closer than 0.25 px within a column are merged (SAME_VERTEX_PX), so allow that much
      expect(Math.abs(Math.min(...drawn) - Math.min(...inCol))).toBeLessThanOrEqual(0.25);
      expect(Math.abs(Math.max(...drawn) - Math.max(...inCol))).toBeLessThanOrEqual(0.25);
    }
  });

  it('leaves a gap in the flux line over masked pixels and marks them along the bottom', () => {
    const ctx = new RecordingContext();
    drawSpectrumFrame(ctx, frame(1_000, {}, [[100, 120], [500, 503]]));
    expect(strokeOf(ctx, SPECTRUM_COLOURS.flux).subpaths.length).toBe(3);
    const strip = ctx.rects.filter((r) => r.style === SPECTRUM_COLOURS.mask && r.h === MASK_STRIP_PX);
    expect(strip.length).toBe(2);
    expect(strip[0].y).toBe(20 + 250 - MASK_STRIP_PX);
  });

  it('draws the 1-sigma band when ivar is known and the model when given', () => {
    const f = frame(1_000);
    const ctx = new RecordingContext();
    drawSpectrumFrame(ctx, { ...f, model: f.series.flux.map((v) => v + 1) });
    expect(ctx.rects.some((r) => r.style === SPECTRUM_COLOURS.band)).toBe(true);
    expect(ctx.paths.some((p) => p.op === 'stroke' && p.style === SPECTRUM_COLOURS.model)).toBe(true);
    const noBand = new RecordingContext();
    drawSpectrumFrame(noBand, { ...f, series: { ...f.series, bandLow: null, bandHigh: null } });
    expect(noBand.rects.some((r) => r.style === SPECTRUM_COLOURS.band)).toBe(false);
  });

  it('draws a compared model in its own colour, beneath the shown model, and only when its length matches', () => {
    const f = frame(1_000);
    const ctx = new RecordingContext();
    drawSpectrumFrame(ctx, { ...f, model: f.series.flux.map((v) => v + 1), compareModel: f.series.flux.map((v) => v - 1) });
    const styles = ctx.paths.filter((p) => p.op === 'stroke').map((p) => p.style);
    expect(styles).toContain(SPECTRUM_COLOURS.compare);
    expect(styles.indexOf(SPECTRUM_COLOURS.compare)).toBeLessThan(styles.indexOf(SPECTRUM_COLOURS.model));
    const wrong = new RecordingContext();
    drawSpectrumFrame(wrong, { ...f, compareModel: new Float64Array(10) });
    expect(wrong.paths.some((p) => p.style === SPECTRUM_COLOURS.compare)).toBe(false);
  });

  it('fills the band per column from the lowest lower edge to the highest upper edge of its samples', () => {
    const f = frame(20_000);
    const ctx = new RecordingContext();
    drawSpectrumFrame(ctx, f);
    const band = ctx.rects.filter((r) => r.style === SPECTRUM_COLOURS.band);
    expect(band.length).toBe(500);
    const Y = (v: number) => 20 + 250 - (v / 100) * 250;
    const w = f.series.wavelengthA;
    const [x0, x1] = f.xDomainA;
    for (const c of [3, 200, 431]) {
      let top = Infinity;
      let bottom = -Infinity;
      for (let i = 0; i < w.length; i++) {
        const px = ((w[i] - x0) / (x1 - x0)) * 500;
        if (px >= c && px < c + 1) {
          top = Math.min(top, Y(f.series.bandHigh![i]));
          bottom = Math.max(bottom, Y(f.series.bandLow![i]));
        }
      }
      const r = band.find((q) => Math.abs(q.x - (50 + c)) < 1e-9)!;
      expect(r.y).toBeCloseTo(top, 9);
      expect(r.y + r.h).toBeCloseTo(bottom, 9);
    }
  });

  it('zoomed past one sample per column, the band is interpolated with no holes', () => {
    const f = frame(1_000, { xDomainA: [3900, 3920] }); // about 74 samples over 500 columns
    const ctx = new RecordingContext();
    drawSpectrumFrame(ctx, f);
    expect(ctx.rects.filter((r) => r.style === SPECTRUM_COLOURS.band).length).toBe(500);
  });

  it('a smooth model costs at most two vertices per column', () => {
    const f = frame(20_000);
    const ctx = new RecordingContext();
    const model = f.series.wavelengthA.map((l) => 30 + 5 * Math.sin(l / 300));
    drawSpectrumFrame(ctx, { ...f, model });
    const vertices = strokeOf(ctx, SPECTRUM_COLOURS.model).subpaths.flat().length;
    // 4 per column without the shortcuts; a monotonic column needs only first and last
    expect(vertices).toBeLessThanOrEqual(2 * 500);
  });

  it('draws nothing but a clear for an empty window', () => {
    const ctx = new RecordingContext();
    const s = drawSpectrumFrame(ctx, frame(100, { xDomainA: [5000, 5000] }));
    expect(s.visiblePoints).toBe(0);
    expect(ctx.clears).toBe(1);
    expect(ctx.paths.length).toBe(0);
  });
});
