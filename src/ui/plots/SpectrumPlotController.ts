/**
 * The inside of the spectrum plot: owns the canvas pixels, the SVG overlay and
 * the zoom state, so React (which owns the container) never re-renders on a pan
 * or a pointer move. Inputs mark dirty flags; flush() redraws only the layers
 * whose inputs changed (uPlot-style commit). Zoom and pointer events schedule one
 * flush per animation frame.
 * Over 300 lines: the layers share one set of dirty flags and one flush; the
 * drawing, marker layout and view actions are in their own files.
 */
import * as d3 from 'd3';
import { lowerBound, upperBound } from './decimate';
import type { DisplaySeries } from './displaySeries';
import { drawSpectrumFrame, type FrameStats, type PlotRect } from './drawSpectrumFrame';
import { placeMarkerLabels, shiftedMarkersInRange, type LineMarker } from './markerLayout';
import { SPECTRUM_COLOURS } from './palette';
import { robustYRange } from './robustYRange';
import { applyViewAction, clampDomain, keyToViewAction, zoomTransformFor } from './viewActions';

/** Space around the plot rectangle for axes, titles and label rows, CSS px. */
export const SPECTRUM_MARGINS = { top: 42, right: 16, bottom: 38, left: 62 } as const;
/** Rows of line labels inside the top of the plot, and their spacing, CSS px. */
export const LABEL_ROWS = 3;
export const LABEL_ROW_PX = 12;
/** Height at the top of the plot kept free of data for the line labels and glyphs, CSS px. */
export const LABEL_BAND_PX = LABEL_ROWS * LABEL_ROW_PX + 8;
/** Height of the comparison solution's marker ticks, CSS px. */
export const COMPARE_TICK_PX = 22;
/** Narrowest view, in median pixel steps of the spectrum. */
export const MIN_VIEW_PIXELS = 10;

export interface SkyRegion {
  label: string;
  fromA: number;
  toA: number;
}

export interface SpectrumOverlays {
  z: number | null;
  markers: readonly LineMarker[];
  skyRegions: readonly SkyRegion[];
  highlightA: number | null;
  /** Flux unit string for the axis title, as the file gives it. */
  fluxUnit?: string;
  /** A second solution to compare: its markers are drawn as ticks up from the bottom, labelled there. */
  compare?: { z: number; markers: readonly LineMarker[] } | null;
}

const DIRTY_DATA = 1;
const DIRTY_SIZE = 2;
const DIRTY_VIEW = 4;
const DIRTY_Z = 8;
const DIRTY_MARKERS = 16;
const DIRTY_SKY = 32;
const DIRTY_HIGHLIGHT = 64;

const fmtFlux = d3.format('.3~g');
const fmtA = d3.format('.1f');

export class SpectrumPlotController {
  private readonly canvas: HTMLCanvasElement;
  private readonly svg: d3.Selection<SVGSVGElement, unknown, null, undefined>;
  private readonly readout: HTMLElement | null;
  private readonly zoom: d3.ZoomBehavior<SVGSVGElement, unknown>;
  private readonly layers: Record<
    'sky' | 'highlight' | 'markers' | 'compare' | 'axisBottom' | 'axisTop' | 'axisLeft' | 'titles' | 'crosshair' | 'note',
    d3.Selection<SVGGElement, unknown, null, undefined>
  >;
  private readonly clipRect: d3.Selection<SVGRectElement, unknown, null, undefined>;

  private series: DisplaySeries | null = null;
  private model: Float64Array | null = null;
  private compareModel: Float64Array | null = null;
  private physicsModel: Float64Array | null = null;
  private widthPx = 0;
  private heightPx = 0;
  private pixelRatio = 1;
  private overlays: SpectrumOverlays = { z: null, markers: [], skyRegions: [], highlightA: null };
  private full: [number, number] = [0, 1];
  private minSpanA = 1;
  /** Visible observed wavelength window, Angstrom. */
  private viewA: [number, number] = [0, 1];
  private yDomain: [number, number] = [0, 1];
  private dirty = 0;
  private pending: number | null = null;
  private syncingZoom = false;
  private onFeatureClick: ((lambdaA: number) => void) | undefined;
  /** Stats of the last canvas frame, and how many frames were drawn (for tests and benchmarks). */
  lastFrame: FrameStats | null = null;
  framesDrawn = 0;

  constructor(canvas: HTMLCanvasElement, svgEl: SVGSVGElement, readout: HTMLElement | null, clipId: string) {
    this.canvas = canvas;
    this.readout = readout;
    this.svg = d3.select(svgEl);
    this.svg.selectAll('*').remove();
    this.clipRect = this.svg.append('defs').append('clipPath').attr('id', clipId).append('rect');
    const layer = (cls: string, clipped: boolean) => {
      const g = this.svg.append('g').attr('class', cls);
      if (clipped) g.attr('clip-path', `url(#${clipId})`);
      return g;
    };
    this.layers = {
      sky: layer('sm-sky', true),
      highlight: layer('sm-highlight', true),
      markers: layer('sm-markers', true),
      compare: layer('sm-compare', true),
      axisBottom: layer('sm-axis-bottom', false),
      axisTop: layer('sm-axis-top', false),
      axisLeft: layer('sm-axis-left', false),
      titles: layer('sm-titles', false),
      crosshair: layer('sm-crosshair', false).style('pointer-events', 'none'),
      note: layer('sm-note', false).style('pointer-events', 'none'),
    };
    this.layers.crosshair
      .append('line')
      .attr('stroke', SPECTRUM_COLOURS.crosshair)
      .attr('stroke-width', 1)
      .attr('stroke-dasharray', '3 3')
      .style('display', 'none');

    this.zoom = d3
      .zoom<SVGSVGElement, unknown>()
      .clickDistance(3)
      .on('zoom', (event: d3.D3ZoomEvent<SVGSVGElement, unknown>) => {
        if (this.syncingZoom) return;
        this.viewA = clampDomain(...(event.transform.rescaleX(this.baseX()).domain() as [number, number]), this.full, this.minSpanA);
        this.mark(DIRTY_VIEW);
        this.schedule();
      });
    this.svg.call(this.zoom).on('dblclick.zoom', null);
    this.svg
      .on('click.sm', (event: MouseEvent) => this.handleClick(event))
      .on('mousemove.sm', (event: MouseEvent) => this.handlePointer(event))
      .on('mouseleave.sm', () => this.hideCrosshair())
      .on('keydown.sm', (event: KeyboardEvent) => this.handleKey(event));
  }

  // ---- inputs -------------------------------------------------------------

  /** The second solution's model for comparison (null = none). */
  setCompareModel(model: Float64Array | null): void {
    const m = model && this.series && model.length === this.series.wavelengthA.length ? model : null;
    if (m === this.compareModel) return;
    this.compareModel = m;
    this.mark(DIRTY_DATA);
  }

  /** Quasar broad-line fits to draw (NaN outside their ranges; null = none). */
  setPhysicsModel(model: Float64Array | null): void {
    const m = model && this.series && model.length === this.series.wavelengthA.length ? model : null;
    if (m === this.physicsModel) return;
    this.physicsModel = m;
    this.mark(DIRTY_DATA);
  }

  setData(series: DisplaySeries, model: Float64Array | null): void {
    if (series === this.series && model === this.model) return;
    const w = series.wavelengthA;
    const hadData = this.series !== null;
    this.series = series;
    this.model = model && model.length === w.length ? model : null;
    if (w.length >= 2) {
      this.full = [w[0], w[w.length - 1]];
      this.minSpanA = (MIN_VIEW_PIXELS * (w[w.length - 1] - w[0])) / (w.length - 1);
    } else {
      this.full = [0, 1];
      this.minSpanA = 1;
    }
    // Same object, new arrays (e.g. smoothing changed): keep the window, clamped.
    this.viewA = hadData ? clampDomain(this.viewA[0], this.viewA[1], this.full, this.minSpanA) : [...this.full];
    this.mark(DIRTY_DATA | DIRTY_VIEW);
    this.syncZoom();
  }

  setSize(widthPx: number, heightPx: number, pixelRatio: number): void {
    if (widthPx === this.widthPx && heightPx === this.heightPx && pixelRatio === this.pixelRatio) return;
    this.widthPx = Math.max(0, widthPx);
    this.heightPx = Math.max(0, heightPx);
    this.pixelRatio = pixelRatio > 0 ? pixelRatio : 1;
    this.canvas.width = Math.round(this.widthPx * this.pixelRatio);
    this.canvas.height = Math.round(this.heightPx * this.pixelRatio);
    this.svg.attr('width', this.widthPx).attr('height', this.heightPx);
    const p = this.plotRect();
    this.clipRect.attr('x', p.left).attr('y', p.top).attr('width', Math.max(0, p.width)).attr('height', Math.max(0, p.height));
    this.mark(DIRTY_SIZE);
    this.syncZoom();
  }

  setOverlays(next: SpectrumOverlays): void {
    const prev = this.overlays;
    if (next.z !== prev.z) this.mark(DIRTY_Z);
    if (next.markers !== prev.markers) this.mark(DIRTY_MARKERS);
    if (next.skyRegions !== prev.skyRegions) this.mark(DIRTY_SKY);
    if (next.highlightA !== prev.highlightA) this.mark(DIRTY_HIGHLIGHT);
    if (next.fluxUnit !== prev.fluxUnit) this.mark(DIRTY_Z);
    if (next.compare?.z !== prev.compare?.z || next.compare?.markers !== prev.compare?.markers) this.mark(DIRTY_MARKERS);
    this.overlays = next;
  }

  setOnFeatureClick(cb: ((lambdaA: number) => void) | undefined): void {
    this.onFeatureClick = cb;
  }

  /** Show the whole spectrum. */
  resetView(): void {
    this.setView(this.full[0], this.full[1]);
  }

  /** Show [fromA, toA] (observed Angstrom), clamped to the data. */
  setView(fromA: number, toA: number): void {
    this.viewA = clampDomain(fromA, toA, this.full, this.minSpanA);
    this.mark(DIRTY_VIEW);
    this.syncZoom();
    this.flush();
  }

  /** Visible observed wavelength window, Angstrom. */
  get view(): [number, number] {
    return [this.viewA[0], this.viewA[1]];
  }

  /** Current x scale: observed Angstrom -> CSS px from the svg's left edge. */
  xScale(): d3.ScaleLinear<number, number> {
    const p = this.plotRect();
    return d3.scaleLinear().domain(this.viewA).range([p.left, p.left + p.width]);
  }

  plotRect(): PlotRect {
    const m = SPECTRUM_MARGINS;
    return { left: m.left, top: m.top, width: this.widthPx - m.left - m.right, height: this.heightPx - m.top - m.bottom };
  }

  destroy(): void {
    if (this.pending !== null) cancelFrame(this.pending);
    this.pending = null;
    this.svg.on('.zoom', null).on('.sm', null);
    this.svg.selectAll('*').remove();
  }

  // ---- drawing ------------------------------------------------------------

  /** Redraw the dirty layers now. */
  flush(): void {
    if (this.pending !== null) {
      cancelFrame(this.pending);
      this.pending = null;
    }
    const d = this.dirty;
    if (!d || !this.series || this.widthPx <= 0 || this.heightPx <= 0) return;
    this.dirty = 0;
    const geometry = DIRTY_DATA | DIRTY_SIZE | DIRTY_VIEW;
    if (d & (DIRTY_DATA | DIRTY_VIEW | DIRTY_SIZE)) this.fitY();
    if (d & geometry) this.drawCanvas();
    // DIRTY_Z also covers the flux unit: both only change axis titles and ticks.
    if (d & (geometry | DIRTY_Z)) this.drawAxes();
    if (d & (DIRTY_SIZE | DIRTY_VIEW | DIRTY_Z | DIRTY_MARKERS)) {
      this.drawMarkers();
      this.drawCompareMarkers();
    }
    if (d & (DIRTY_SIZE | DIRTY_VIEW | DIRTY_SKY)) this.drawSky();
    if (d & (DIRTY_SIZE | DIRTY_VIEW | DIRTY_HIGHLIGHT)) this.drawHighlight();
    if (d & DIRTY_DATA) this.drawNote();
    this.svg.attr('data-view-a', `${this.viewA[0]},${this.viewA[1]}`);
  }

  private mark(flags: number): void {
    this.dirty |= flags;
  }

  private schedule(): void {
    if (this.pending !== null) return;
    this.pending = requestFrame(() => {
      this.pending = null;
      this.flush();
    });
  }

  private baseX(): d3.ScaleLinear<number, number> {
    const p = this.plotRect();
    return d3.scaleLinear().domain(this.full).range([p.left, p.left + p.width]);
  }

  /** Put d3-zoom's stored transform in line with viewA, after a change it did not make. */
  private syncZoom(): void {
    const p = this.plotRect();
    if (p.width <= 0 || p.height <= 0) return;
    const maxK = Math.max(1, (this.full[1] - this.full[0]) / this.minSpanA);
    const extent: [[number, number], [number, number]] = [
      [p.left, p.top],
      [p.left + p.width, p.top + p.height],
    ];
    this.zoom.scaleExtent([1, maxK]).extent(extent).translateExtent(extent);
    const t = zoomTransformFor(this.full, [p.left, p.left + p.width], this.viewA);
    this.syncingZoom = true;
    try {
      this.zoom.transform(this.svg, d3.zoomIdentity.translate(t.x, 0).scale(t.k));
    } finally {
      this.syncingZoom = false;
    }
  }

  private visibleRange(): [number, number] {
    const w = this.series!.wavelengthA;
    return [lowerBound(w, this.viewA[0]), upperBound(w, this.viewA[1])];
  }

  private fitY(): void {
    const [i0, i1] = this.visibleRange();
    const [lo, hi] = robustYRange(this.series!.flux, i0, i1) ?? (this.model ? robustYRange(this.model, i0, i1) : null) ?? [0, 1];
    // Keep the label rows clear: the data fills the plot below them.
    const h = this.plotRect().height;
    const reserve = LABEL_BAND_PX < h / 2 ? LABEL_BAND_PX / (h - LABEL_BAND_PX) : 0;
    this.yDomain = [lo, hi + (hi - lo) * reserve];
  }

  private drawCanvas(): void {
    const ctx = this.canvas.getContext('2d');
    if (!ctx) return; // no canvas (jsdom): the SVG overlay still works
    this.lastFrame = drawSpectrumFrame(ctx, {
      widthPx: this.widthPx,
      heightPx: this.heightPx,
      pixelRatio: this.pixelRatio,
      plot: this.plotRect(),
      xDomainA: this.viewA,
      yDomain: this.yDomain,
      series: this.series!,
      model: this.model,
      compareModel: this.compareModel,
      physicsModel: this.physicsModel,
    });
    this.framesDrawn++;
  }

  private drawAxes(): void {
    const p = this.plotRect();
    const x = this.xScale();
    const y = d3.scaleLinear().domain(this.yDomain).range([p.top + p.height, p.top]);
    const xTicks = Math.max(2, Math.floor(p.width / 90));
    this.layers.axisBottom.attr('transform', `translate(0,${p.top + p.height})`).call(d3.axisBottom(x).ticks(xTicks));
    this.layers.axisLeft.attr('transform', `translate(${p.left},0)`).call(d3.axisLeft(y).ticks(Math.max(2, Math.floor(p.height / 50))).tickFormat((v) => fmtFlux(+v)));
    const z = this.overlays.z;
    const hasZ = z !== null && Number.isFinite(z) && z > -1;
    if (hasZ) {
      const rest = d3.scaleLinear().domain([this.viewA[0] / (1 + z), this.viewA[1] / (1 + z)]).range(x.range());
      this.layers.axisTop.style('display', null).attr('transform', `translate(0,${p.top})`).call(d3.axisTop(rest).ticks(xTicks));
    } else {
      this.layers.axisTop.style('display', 'none');
    }
    const titles = [
      { key: 'bottom', text: 'Observed wavelength (Å, vacuum)', x: p.left + p.width / 2, y: this.heightPx - 4, rotate: 0 },
      {
        key: 'top',
        text: hasZ ? `Rest wavelength at z = ${d3.format('.4f')(z)} (Å)` : 'Rest wavelength: no redshift set',
        x: p.left + p.width / 2,
        y: 11,
        rotate: 0,
      },
      { key: 'left', text: this.overlays.fluxUnit ? `Flux (${this.overlays.fluxUnit})` : 'Flux', x: -(p.top + p.height / 2), y: 12, rotate: -90 },
    ];
    this.layers.titles
      .selectAll<SVGTextElement, (typeof titles)[number]>('text')
      .data(titles, (d) => d.key)
      .join('text')
      .attr('class', (d) => `sm-title-${d.key}`)
      .attr('x', (d) => d.x)
      .attr('y', (d) => d.y)
      .attr('transform', (d) => (d.rotate ? `rotate(${d.rotate})` : null))
      .attr('text-anchor', 'middle')
      .attr('font-size', 11)
      .attr('fill', '#333')
      .text((d) => d.text);
  }

  private drawMarkers(): void {
    const p = this.plotRect();
    const x = this.xScale();
    const shown = shiftedMarkersInRange(this.overlays.markers, this.overlays.z, this.viewA[0], this.viewA[1]);
    const places = placeMarkerLabels(
      shown.map((m) => ({ xPx: x(m.observedA), label: m.label, strength: m.strength })),
      LABEL_ROWS,
      p.left,
      p.left + p.width,
    );
    const items = shown.map((m, i) => ({ m, px: x(m.observedA), row: places[i].row, labelPx: places[i].xPx }));
    const triangle = d3.symbol(d3.symbolTriangle, 30)() ?? '';
    this.layers.markers
      .selectAll<SVGGElement, (typeof items)[number]>('g.sm-marker')
      .data(items, (d) => d.m.id)
      .join((enter) => {
        const g = enter.append('g').attr('class', 'sm-marker');
        g.append('line').attr('class', 'sm-marker-line');
        g.append('path').attr('class', 'sm-marker-glyph');
        g.append('text').attr('class', 'sm-marker-label').attr('text-anchor', 'middle').attr('font-size', 11);
        g.append('title');
        return g;
      })
      .each(function (d) {
        const g = d3.select(this);
        const colour = d.m.kind === 'emission' ? SPECTRUM_COLOURS.emission : SPECTRUM_COLOURS.absorption;
        g.attr('data-marker-id', d.m.id).attr('data-kind', d.m.kind);
        g.select('line')
          .attr('x1', d.px)
          .attr('x2', d.px)
          .attr('y1', p.top + LABEL_ROWS * LABEL_ROW_PX + 6)
          .attr('y2', p.top + p.height)
          .attr('stroke', colour)
          .attr('stroke-width', 1)
          .attr('stroke-opacity', 0.8)
          .attr('stroke-dasharray', d.m.kind === 'emission' ? null : '5 3');
        // emission: upward triangle; absorption: downward (shape, not only colour)
        g.select('path')
          .attr('d', triangle)
          .attr('fill', colour)
          .attr('transform', `translate(${d.px},${p.top + LABEL_ROWS * LABEL_ROW_PX + 4}) rotate(${d.m.kind === 'emission' ? 0 : 180})`);
        g.select('text')
          .attr('x', d.labelPx)
          .attr('y', p.top + 10 + (d.row ?? 0) * LABEL_ROW_PX)
          .attr('fill', colour)
          .attr('stroke', 'white')
          .attr('stroke-width', 3)
          .attr('paint-order', 'stroke')
          .attr('display', d.row === null ? 'none' : null)
          .text(d.m.label);
        g.select('title').text(`${d.m.label} ${d.m.kind}, rest ${fmtA(d.m.restA)} Å, observed ${fmtA(d.m.observedA)} Å`);
      });
  }

  /** The comparison solution's lines: short dashed ticks up from the bottom of the plot, labelled just above them. */
  private drawCompareMarkers(): void {
    const p = this.plotRect();
    const x = this.xScale();
    const cmp = this.overlays.compare;
    const shown = cmp ? shiftedMarkersInRange(cmp.markers, cmp.z, this.viewA[0], this.viewA[1]) : [];
    const places = placeMarkerLabels(
      shown.map((m) => ({ xPx: x(m.observedA), label: m.label, strength: m.strength })),
      1,
      p.left,
      p.left + p.width,
    );
    const items = shown.map((m, i) => ({ m, px: x(m.observedA), row: places[i].row, labelPx: places[i].xPx }));
    const bottom = p.top + p.height;
    this.layers.compare
      .selectAll<SVGGElement, (typeof items)[number]>('g.sm-compare-marker')
      .data(items, (d) => d.m.id)
      .join((enter) => {
        const g = enter.append('g').attr('class', 'sm-compare-marker');
        g.append('line');
        g.append('text').attr('text-anchor', 'middle').attr('font-size', 10);
        g.append('title');
        return g;
      })
      .each(function (d) {
        const g = d3.select(this);
        g.attr('data-marker-id', d.m.id);
        g.select('line')
          .attr('x1', d.px)
          .attr('x2', d.px)
          .attr('y1', bottom - COMPARE_TICK_PX)
          .attr('y2', bottom)
          .attr('stroke', SPECTRUM_COLOURS.compare)
          .attr('stroke-width', 1.5)
          .attr('stroke-dasharray', '3 2');
        g.select('text')
          .attr('x', d.labelPx)
          .attr('y', bottom - COMPARE_TICK_PX - 3)
          .attr('fill', SPECTRUM_COLOURS.compare)
          .attr('stroke', 'white')
          .attr('stroke-width', 3)
          .attr('paint-order', 'stroke')
          .attr('display', d.row === null ? 'none' : null)
          .text(d.m.label);
        g.select('title').text(`compared solution: ${d.m.label}, observed ${fmtA(d.m.observedA)} Å`);
      });
  }

  private drawSky(): void {
    const p = this.plotRect();
    const x = this.xScale();
    const regions = this.overlays.skyRegions.filter((r) => r.toA >= this.viewA[0] && r.fromA <= this.viewA[1]);
    this.layers.sky
      .selectAll<SVGRectElement, SkyRegion>('rect')
      .data(regions, (r) => `${r.label}@${r.fromA}`)
      .join((enter) => {
        const r = enter.append('rect').attr('fill', SPECTRUM_COLOURS.sky).attr('fill-opacity', SPECTRUM_COLOURS.skyAlpha);
        r.append('title');
        return r;
      })
      .attr('class', 'sm-sky-region')
      .attr('x', (r) => x(r.fromA))
      .attr('width', (r) => Math.max(1, x(r.toA) - x(r.fromA)))
      .attr('y', p.top)
      .attr('height', Math.max(0, p.height))
      .select('title')
      .text((r) => `Night-sky region: ${r.label} (${fmtA(r.fromA)}–${fmtA(r.toA)} Å observed)`);
  }

  private drawHighlight(): void {
    const p = this.plotRect();
    const x = this.xScale();
    const h = this.overlays.highlightA;
    const data = h !== null && Number.isFinite(h) && h >= this.viewA[0] && h <= this.viewA[1] ? [h] : [];
    this.layers.highlight
      .selectAll<SVGLineElement, number>('line')
      .data(data)
      .join('line')
      .attr('class', 'sm-highlight-line')
      .attr('x1', (v) => x(v))
      .attr('x2', (v) => x(v))
      .attr('y1', p.top)
      .attr('y2', p.top + p.height)
      .attr('stroke', SPECTRUM_COLOURS.highlight)
      .attr('stroke-width', 2)
      .attr('stroke-dasharray', '1 2');
  }

  private drawNote(): void {
    const p = this.plotRect();
    const f = this.series!.flux;
    const empty = !f.some((v) => Number.isFinite(v));
    this.layers.note
      .selectAll<SVGTextElement, string>('text')
      .data(empty ? ['No usable pixels: every flux value is masked or missing.'] : [])
      .join('text')
      .attr('x', p.left + p.width / 2)
      .attr('y', p.top + p.height / 2)
      .attr('text-anchor', 'middle')
      .attr('font-size', 12)
      .attr('fill', '#555')
      .text((t) => t);
  }

  // ---- events ------------------------------------------------------------

  /** Pointer position in CSS px from the svg's top-left corner. */
  private local(event: MouseEvent): [number, number] {
    const r = (this.svg.node() as SVGSVGElement).getBoundingClientRect();
    return [event.clientX - r.left, event.clientY - r.top];
  }

  private inPlot(px: number, py: number): boolean {
    const p = this.plotRect();
    return px >= p.left && px <= p.left + p.width && py >= p.top && py <= p.top + p.height;
  }

  private handleClick(event: MouseEvent): void {
    if (!this.series || !this.onFeatureClick) return;
    const [px, py] = this.local(event);
    if (!this.inPlot(px, py)) return;
    this.onFeatureClick(this.xScale().invert(px));
  }

  private handlePointer(event: MouseEvent): void {
    const [px, py] = this.local(event);
    if (!this.series || !this.inPlot(px, py)) {
      this.hideCrosshair();
      return;
    }
    const p = this.plotRect();
    this.layers.crosshair.select('line').style('display', null).attr('x1', px).attr('x2', px).attr('y1', p.top).attr('y2', p.top + p.height);
    if (!this.readout) return;
    const lambda = this.xScale().invert(px);
    const w = this.series.wavelengthA;
    let i = lowerBound(w, lambda);
    if (i >= w.length || (i > 0 && lambda - w[i - 1] < w[i] - lambda)) i--;
    const z = this.overlays.z;
    const rest = z !== null && Number.isFinite(z) && z > -1 ? `${fmtA(lambda / (1 + z))} Å` : '(no z)';
    const flux = this.series.flux[i];
    this.readout.textContent = `observed ${fmtA(lambda)} Å · rest ${rest} · flux ${Number.isFinite(flux) ? fmtFlux(flux) : 'masked'}`;
  }

  private hideCrosshair(): void {
    this.layers.crosshair.select('line').style('display', 'none');
  }

  private handleKey(event: KeyboardEvent): void {
    const action = keyToViewAction(event);
    if (!action || !this.series) return;
    event.preventDefault();
    event.stopPropagation();
    const [a, b] = applyViewAction(this.viewA, this.full, action, this.minSpanA);
    this.setView(a, b);
  }
}

function requestFrame(cb: () => void): number {
  if (typeof requestAnimationFrame === 'function') return requestAnimationFrame(cb);
  return setTimeout(cb, 16) as unknown as number;
}

function cancelFrame(id: number): void {
  if (typeof cancelAnimationFrame === 'function') cancelAnimationFrame(id);
  else clearTimeout(id);
}

