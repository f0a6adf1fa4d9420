/**
 * Over 400 lines on purpose: the plot's layout, the stars' own km/s panel and
 * the candidate marks share one set of scales and one d3 drawing pass.
 *
 * Fit quality against redshift: delta chi-square per template family on a
 * symmetric-log y axis (the minima near 0 get room, the large values still show),
 * numbered candidate marks, and a rule at the current redshift. React owns the
 * container; d3 draws the SVG inside, one layer per input so a change of the
 * current z or the selection never redraws the curves.
 */
import * as d3 from 'd3';
import { useLayoutEffect, useMemo, useRef, type ReactElement } from 'react';
import { lowerBound } from './decimate';
import { familyStyle } from './palette';
import { useElementWidth } from './useElementWidth';
import { SPEED_OF_LIGHT_KMS } from '../../core/cosmology/constants';

export interface FitQualityCurve {
  family: string;
  /** Redshift grid, ascending. */
  z: Float64Array;
  /** chi2(z) minus the fit's best chi2 (dimensionless). */
  deltaChi2: Float64Array;
}

export interface FitQualityCandidate {
  z: number;
  family: string;
  class: string;
  deltaChi2: number;
}

export interface FitQualityPlotProps {
  curves: FitQualityCurve[];
  /** Ranked candidates, best first; they are numbered 1, 2, ... in this order. */
  candidates: FitQualityCandidate[];
  currentZ: number | null;
  /** Index into candidates of the one in use, or null. */
  selectedCandidate: number | null;
  onPickCandidate?: (index: number) => void;
  onPickZ?: (z: number) => void;
  /** CSS px. */
  height?: number;
  /**
   * Candidate indices the number keys reach, in key order: only these get a
   * mark, numbered by their key. Default: every candidate, numbered in order.
   */
  keyed?: readonly number[];
}

/** Width of the side panel for families searched over a narrow range (stars near z = 0), CSS px. */
export const INSET_WIDTH_PX = 150;
/** Gap between the main plot and the side panel, CSS px. */
export const INSET_GAP_PX = 28;
/** A family whose curve spans less than this fraction of the whole redshift range gets the side panel. */
export const NARROW_FRACTION = 0.02;
/** Marks closer than this (CSS px) are stacked so their numbers stay readable. */
const MARK_CLEARANCE_PX = 15;

/**
 * Families searched over a narrow range (a star's +-1000 km/s around z = 0
 * on a 0-6.5 axis would be a few pixels wide): names of the curves whose
 * redshift span is under NARROW_FRACTION of the span of all curves. Empty
 * when every family is narrow or every family is wide.
 */
export function narrowFamilies(curves: readonly FitQualityCurve[]): Set<string> {
  const span = (c: FitQualityCurve) => (c.z.length ? c.z[c.z.length - 1] - c.z[0] : 0);
  let lo = Infinity;
  let hi = -Infinity;
  for (const c of curves) if (c.z.length) (lo = Math.min(lo, c.z[0])), (hi = Math.max(hi, c.z[c.z.length - 1]));
  const total = hi - lo;
  const narrow = new Set(curves.filter((c) => c.z.length > 0 && span(c) < NARROW_FRACTION * total).map((c) => c.family));
  return narrow.size === 0 || narrow.size === new Set(curves.map((c) => c.family)).size ? new Set() : narrow;
}

/** Velocity scale of the side panel: cz in km/s (a small-z velocity), over the narrow families' range. */
export function insetScale(curves: readonly FitQualityCurve[], narrow: ReadonlySet<string>, widthPx: number): d3.ScaleLinear<number, number> | null {
  if (!narrow.size) return null;
  let lo = Infinity;
  let hi = -Infinity;
  for (const c of curves) if (narrow.has(c.family) && c.z.length) (lo = Math.min(lo, c.z[0])), (hi = Math.max(hi, c.z[c.z.length - 1]));
  if (!(hi > lo)) return null;
  const right = widthPx - FIT_MARGINS.right;
  return d3
    .scaleLinear()
    .domain([lo * SPEED_OF_LIGHT_KMS, hi * SPEED_OF_LIGHT_KMS])
    .range([right - INSET_WIDTH_PX, right]);
}

/** Space around the plot rectangle (legend on top, axes left and bottom), CSS px. */
export const FIT_MARGINS = { top: 24, right: 16, bottom: 36, left: 56 } as const;
export const FIT_DEFAULT_HEIGHT_PX = 200;
/** Gap between the x axis and delta chi-square = 0, CSS px. */
export const FIT_FLOOR_PX = 10;
export const FIT_FALLBACK_WIDTH_PX = 800;
/**
 * Linear-to-log crossover of the y axis, in delta chi-square: below it the
 * axis is about linear, above it logarithmic (Webber 2013, Meas. Sci. Technol.
 * 24, 027001, bi-symmetric log transform; d3.scaleSymlog).
 */
export const SYMLOG_CONSTANT = 1;

const fmtZ = d3.format('.4f');
const fmtChi = d3.format(',.1f');

/** The scales of the plot, from the data extent and the container size. */
export function fitQualityScales(
  curves: readonly FitQualityCurve[],
  candidates: readonly FitQualityCandidate[],
  widthPx: number,
  heightPx: number,
  narrow: ReadonlySet<string> = new Set(),
): { x: d3.ScaleLinear<number, number>; y: d3.ScaleSymLog<number, number> } {
  let z0 = Infinity;
  let z1 = -Infinity;
  let c0 = 0;
  let c1 = 0;
  const take = (z: number, c: number) => {
    if (Number.isFinite(z)) {
      z0 = Math.min(z0, z);
      z1 = Math.max(z1, z);
    }
    if (Number.isFinite(c)) {
      c0 = Math.min(c0, c);
      c1 = Math.max(c1, c);
    }
  };
  // Narrow families (drawn in the side panel) count for the y extent only.
  for (const cu of curves) for (let i = 0; i < cu.z.length; i++) take(narrow.has(cu.family) ? NaN : cu.z[i], cu.deltaChi2[i]);
  for (const ca of candidates) take(narrow.has(ca.family) ? NaN : ca.z, ca.deltaChi2);
  if (!(z1 > z0)) {
    z0 = Number.isFinite(z0) ? z0 - 0.1 : 0;
    z1 = z0 + 0.2;
  }
  if (!(c1 > c0)) c1 = c0 + 10;
  const m = FIT_MARGINS;
  const inset = narrow.size ? INSET_WIDTH_PX + INSET_GAP_PX : 0;
  const x = d3.scaleLinear().domain([z0, z1]).range([m.left, widthPx - m.right - inset]);
  // Delta chi-square 0 (the best candidate) sits FIT_FLOOR_PX above the axis so its mark stays clear of it.
  const y = d3.scaleSymlog().constant(SYMLOG_CONSTANT).domain([c0, c1 * 1.15]).range([heightPx - m.bottom - FIT_FLOOR_PX, m.top]);
  return { x, y };
}

/** Ticks for the symlog axis: 0 and powers of ten from 10 up (1 would sit on top of 0). */
function symlogTicks(y: d3.ScaleSymLog<number, number>): number[] {
  const top = y.domain()[1];
  const out = [0];
  for (let p = 10; p <= top; p *= 10) out.push(p);
  if (out.length === 1 && top >= 1) out.push(1);
  return out;
}

type Layer = d3.Selection<SVGGElement, unknown, null, undefined>;

export function FitQualityPlot(props: FitQualityPlotProps): ReactElement {
  const { curves, candidates, currentZ, selectedCandidate } = props;
  const height = props.height ?? FIT_DEFAULT_HEIGHT_PX;
  const [containerRef, width] = useElementWidth<HTMLDivElement>(FIT_FALLBACK_WIDTH_PX);
  const svgRef = useRef<SVGSVGElement>(null);
  const readoutRef = useRef<HTMLDivElement>(null);
  const layers = useRef<Record<'curves' | 'axes' | 'legend' | 'rule' | 'hover' | 'marks' | 'note', Layer> | null>(null);
  // Latest callbacks, read at event time, so new closures never cause a redraw.
  const callbacks = useRef({ onPickCandidate: props.onPickCandidate, onPickZ: props.onPickZ });
  callbacks.current = { onPickCandidate: props.onPickCandidate, onPickZ: props.onPickZ };

  const narrow = useMemo(() => narrowFamilies(curves), [curves]);
  const scales = useMemo(() => {
    const sc = fitQualityScales(curves, candidates, width, height, narrow);
    return { ...sc, xi: insetScale(curves, narrow, width) };
  }, [curves, candidates, width, height, narrow]);
  /** Pixel x of a redshift for a family: the side panel's velocity scale for narrow families. */
  const xOf = useMemo(() => {
    const { x, xi } = scales;
    return (family: string, z: number) => (xi && narrow.has(family) ? xi(z * SPEED_OF_LIGHT_KMS) : x(z));
  }, [scales, narrow]);
  const familyIndex = useMemo(() => {
    const m = new Map<string, number>();
    for (const c of curves) if (!m.has(c.family)) m.set(c.family, m.size);
    for (const c of candidates) if (!m.has(c.family)) m.set(c.family, m.size);
    return m;
  }, [curves, candidates]);

  // Layers and plot-area events, once.
  useLayoutEffect(() => {
    const svg = d3.select(svgRef.current!);
    svg.selectAll('*').remove();
    const mk = (cls: string) => svg.append('g').attr('class', cls);
    layers.current = {
      curves: mk('fq-curves'),
      axes: mk('fq-axes'),
      legend: mk('fq-legend'),
      rule: mk('fq-rule').style('pointer-events', 'none'),
      hover: mk('fq-hover').style('pointer-events', 'none'),
      marks: mk('fq-marks'),
      note: mk('fq-note').style('pointer-events', 'none'),
    };
    return () => {
      svg.on('.fq', null);
      svg.selectAll('*').remove();
      layers.current = null;
    };
  }, []);

  // Pointer: pick a z on click, show a readout on hover. Re-bound when the scales change.
  useLayoutEffect(() => {
    const svgEl = svgRef.current!;
    const svg = d3.select(svgEl);
    const { x, y, xi } = scales;
    const local = (e: MouseEvent): [number, number] => {
      const r = svgEl.getBoundingClientRect();
      return [e.clientX - r.left, e.clientY - r.top];
    };
    const inY = (py: number) => py >= y.range()[1] && py <= y.range()[0] + FIT_FLOOR_PX;
    const inInset = ([px, py]: [number, number]) => !!xi && px >= xi.range()[0] && px <= xi.range()[1] && inY(py);
    const inside = (p: [number, number]) => (p[0] >= x.range()[0] && p[0] <= x.range()[1] && inY(p[1])) || inInset(p);
    /** Redshift under a pixel x: from the velocity scale in the side panel. */
    const zAt = (px: number) => (xi && px >= xi.range()[0] ? xi.invert(px) / SPEED_OF_LIGHT_KMS : x.invert(px));
    svg.on('click.fq', (e: MouseEvent) => {
      const p = local(e);
      if (curves.length === 0 || !inside(p)) return;
      callbacks.current.onPickZ?.(zAt(p[0]));
    });
    svg.on('mousemove.fq', (e: MouseEvent) => {
      const p = local(e);
      const hover = layers.current?.hover;
      if (!hover) return;
      if (curves.length === 0 || !inside(p)) {
        hover.selectAll('line').remove();
        return;
      }
      hover
        .selectAll('line')
        .data([p[0]])
        .join('line')
        .attr('x1', (d) => d)
        .attr('x2', (d) => d)
        .attr('y1', y.range()[1])
        .attr('y2', y.range()[0])
        .attr('stroke', '#999')
        .attr('stroke-dasharray', '2 3');
      const z = zAt(p[0]);
      const parts = curves.map((c) => {
        let i = lowerBound(c.z, z);
        if (i >= c.z.length || (i > 0 && z - c.z[i - 1] < c.z[i] - z)) i--;
        const v = i >= 0 ? c.deltaChi2[i] : NaN;
        return `${c.family} Δχ² ${Number.isFinite(v) ? fmtChi(v) : '–'}`;
      });
      const zText = inInset(p) ? `z ${d3.format('.5f')(z)} (cz ${d3.format(',.0f')(z * SPEED_OF_LIGHT_KMS)} km/s)` : `z ${fmtZ(z)}`;
      if (readoutRef.current) readoutRef.current.textContent = `${zText} · ${parts.join(' · ')}`;
    });
    svg.on('mouseleave.fq', () => layers.current?.hover.selectAll('line').remove());
  }, [scales, curves]);

  // Curves, axes, legend: only when the data or the size change.
  useLayoutEffect(() => {
    const L = layers.current;
    if (!L) return;
    const { x, y, xi } = scales;
    const pathOf = (c: FitQualityCurve) =>
      d3
        .line<number>()
        .defined((i) => Number.isFinite(c.z[i]) && Number.isFinite(c.deltaChi2[i]))
        .x((i) => xOf(c.family, c.z[i]))
        .y((i) => y(c.deltaChi2[i]))(d3.range(Math.min(c.z.length, c.deltaChi2.length))) ?? '';
    L.curves
      .selectAll<SVGPathElement, FitQualityCurve>('path')
      .data(curves, (c) => c.family)
      .join('path')
      .attr('class', 'fq-curve')
      .attr('data-family', (c) => c.family)
      .attr('data-panel', (c) => (narrow.has(c.family) ? 'inset' : 'main'))
      .attr('fill', 'none')
      .attr('stroke-width', 1.5)
      .attr('stroke', (c) => familyStyle(familyIndex.get(c.family) ?? 0).colour)
      .attr('stroke-dasharray', (c) => familyStyle(familyIndex.get(c.family) ?? 0).dash || null)
      .attr('d', pathOf);

    const bottom = y.range()[0] + FIT_FLOOR_PX;
    L.axes.selectAll('*').remove();
    L.axes.append('g').attr('transform', `translate(0,${bottom})`).call(d3.axisBottom(x).ticks(Math.max(2, Math.floor((x.range()[1] - x.range()[0]) / 80))));
    L.axes
      .append('g')
      .attr('transform', `translate(${x.range()[0]},0)`)
      .call((g) => g.append('line').attr('y1', y.range()[0]).attr('y2', bottom).attr('stroke', 'currentColor'))
      .call(d3.axisLeft(y).tickValues(symlogTicks(y)).tickFormat((v) => d3.format('~s')(+v)));
    L.axes
      .append('text')
      .attr('x', (x.range()[0] + x.range()[1]) / 2)
      .attr('y', height - 4)
      .attr('text-anchor', 'middle')
      .attr('font-size', 11)
      .text('Redshift z');
    if (xi) {
      // Side panel: families searched over a narrow range, on a velocity axis.
      const [a, b] = xi.range();
      L.axes.append('g').attr('transform', `translate(0,${bottom})`).call(d3.axisBottom(xi).ticks(3).tickFormat((v) => d3.format('~s')(+v)));
      L.axes
        .append('g')
        .attr('transform', `translate(${a},0)`)
        .call((g) => g.append('line').attr('y1', y.range()[1]).attr('y2', bottom).attr('stroke', 'currentColor').attr('stroke-opacity', 0.5));
      L.axes
        .append('text')
        .attr('class', 'fq-inset-title')
        .attr('x', (a + b) / 2)
        .attr('y', height - 4)
        .attr('text-anchor', 'middle')
        .attr('font-size', 11)
        .text(`${[...narrow].join(', ')}: cz (km/s)`);
    }
    L.axes
      .append('text')
      .attr('transform', 'rotate(-90)')
      .attr('x', -(y.range()[0] + y.range()[1]) / 2)
      .attr('y', 12)
      .attr('text-anchor', 'middle')
      .attr('font-size', 11)
      .text('Δχ², coarse scan (symlog)');

    // Legend along the top: a line sample in the family's colour and dash, and its name.
    const families = [...familyIndex.keys()];
    let cursor = x.range()[0];
    const items = families.map((f) => {
      const at = cursor;
      cursor += 30 + f.length * 6.5 + 12;
      return { f, at };
    });
    L.legend
      .selectAll<SVGGElement, (typeof items)[number]>('g')
      .data(items, (d) => d.f)
      .join((enter) => {
        const g = enter.append('g').attr('class', 'fq-legend-item');
        g.append('line');
        g.append('text').attr('font-size', 11);
        return g;
      })
      .each(function (d) {
        const s = familyStyle(familyIndex.get(d.f) ?? 0);
        const g = d3.select(this);
        g.select('line').attr('x1', d.at).attr('x2', d.at + 24).attr('y1', 10).attr('y2', 10).attr('stroke', s.colour).attr('stroke-width', 2).attr('stroke-dasharray', s.dash || null);
        g.select('text').attr('x', d.at + 28).attr('y', 14).text(d.f);
      });

    L.note
      .selectAll<SVGTextElement, string>('text')
      .data(curves.length === 0 ? ['No fit-quality curve: the spectrum is not fitted yet, or the fit failed.'] : [])
      .join('text')
      .attr('x', (x.range()[0] + x.range()[1]) / 2)
      .attr('y', (y.range()[0] + y.range()[1]) / 2)
      .attr('text-anchor', 'middle')
      .attr('font-size', 12)
      .attr('fill', '#555')
      .text((t) => t);
  }, [scales, curves, familyIndex, height, xOf, narrow]);

  // Candidate marks: on candidates, selection or scale changes.
  useLayoutEffect(() => {
    const L = layers.current;
    if (!L) return;
    const { y } = scales;
    const keyOrder = props.keyed ?? candidates.map((_, i) => i);
    // Each mark at its z and delta chi-square; marks that would cover each other are stacked upwards.
    const items = keyOrder
      .filter((i) => candidates[i])
      .map((i, k) => ({ c: candidates[i], i, k, cx: xOf(candidates[i].family, candidates[i].z), cy: y(candidates[i].deltaChi2) }));
    const placed: { cx: number; cy: number }[] = [];
    for (const it of [...items].sort((a, b) => a.k - b.k)) {
      while (placed.some((p) => Math.abs(p.cx - it.cx) < MARK_CLEARANCE_PX && Math.abs(p.cy - it.cy) < MARK_CLEARANCE_PX)) it.cy -= MARK_CLEARANCE_PX;
      placed.push(it);
    }
    L.marks
      .selectAll<SVGGElement, (typeof items)[number]>('g.fq-candidate')
      .data(items, (d) => `${d.i}`)
      .join((enter) => {
        const g = enter.append('g').attr('class', 'fq-candidate').attr('role', 'button').attr('tabindex', 0).style('cursor', 'pointer');
        g.append('circle');
        g.append('text').attr('text-anchor', 'middle').attr('font-size', 10).attr('font-weight', 'bold').style('pointer-events', 'none');
        g.append('title');
        g.on('click', (e: MouseEvent, d) => {
          e.stopPropagation();
          callbacks.current.onPickCandidate?.(d.i);
        });
        g.on('keydown', (e: KeyboardEvent, d) => {
          if (e.key !== 'Enter' && e.key !== ' ') return;
          e.preventDefault();
          e.stopPropagation();
          callbacks.current.onPickCandidate?.(d.i);
        });
        return g;
      })
      .each(function (d) {
        const g = d3.select(this);
        const s = familyStyle(familyIndex.get(d.c.family) ?? 0);
        const selected = d.i === selectedCandidate;
        const { cx, cy } = d;
        const label = `Candidate ${d.k + 1}: z = ${fmtZ(d.c.z)}, ${d.c.class} (${d.c.family}), Δχ² = ${fmtChi(d.c.deltaChi2)}`;
        g.attr('data-candidate-index', d.i).attr('aria-label', label).attr('aria-pressed', selected ? 'true' : 'false');
        g.select('circle')
          .attr('cx', cx)
          .attr('cy', cy)
          .attr('r', selected ? 9 : 7)
          .attr('fill', selected ? s.colour : 'white')
          .attr('stroke', s.colour)
          .attr('stroke-width', selected ? 3 : 1.5);
        g.select('text')
          .attr('x', cx)
          .attr('y', cy + 3.5)
          .attr('fill', selected ? 'white' : s.colour)
          .text(String(d.k + 1));
        g.select('title').text(label);
      });
  }, [scales, candidates, selectedCandidate, familyIndex, xOf, props.keyed]);

  // Current redshift rule: the cheapest layer, on its own.
  useLayoutEffect(() => {
    const L = layers.current;
    if (!L) return;
    const { x, y, xi } = scales;
    const [a, b] = x.domain();
    const inMain = currentZ !== null && Number.isFinite(currentZ) && currentZ >= a && currentZ <= b;
    const vi = xi && currentZ !== null ? currentZ * SPEED_OF_LIGHT_KMS : NaN;
    const inInset = !!xi && Number.isFinite(vi) && vi >= xi.domain()[0] && vi <= xi.domain()[1];
    const data = currentZ !== null && (inMain || inInset) ? [currentZ] : [];
    const xRule = (v: number) => (inInset && xi ? xi(v * SPEED_OF_LIGHT_KMS) : x(v));
    const g = L.rule
      .selectAll<SVGGElement, number>('g')
      .data(data)
      .join((enter) => {
        const e = enter.append('g').attr('class', 'fq-current-z');
        e.append('line');
        e.append('text').attr('font-size', 10).attr('text-anchor', 'start');
        return e;
      });
    g.select('line')
      .attr('x1', (v) => xRule(v))
      .attr('x2', (v) => xRule(v))
      .attr('y1', y.range()[1])
      .attr('y2', y.range()[0])
      .attr('stroke', '#000')
      .attr('stroke-width', 1.5)
      .attr('stroke-dasharray', '6 2 1 2');
    // The label goes left of the rule near the right edge, so it is never cut off.
    const rightEdge = (xi ?? x).range()[1];
    const flip = (v: number) => xRule(v) > rightEdge - 64;
    g.select('text')
      .attr('text-anchor', (v) => (flip(v) ? 'end' : 'start'))
      .attr('x', (v) => xRule(v) + (flip(v) ? -3 : 3))
      .attr('y', y.range()[1] + 10)
      .text((v) => `z = ${fmtZ(v)}`);
  }, [scales, currentZ]);

  return (
    <div ref={containerRef} className="sm-fit-quality" style={{ width: '100%' }}>
      <svg
        ref={svgRef}
        width={width}
        height={height}
        role="group"
        aria-roledescription="fit quality plot"
        aria-label="Fit quality against redshift. Click a numbered mark to pick that candidate, or click the plot to try that redshift."
        style={{ display: 'block', cursor: 'crosshair' }}
      />
      <div ref={readoutRef} className="fq-readout" aria-live="off" style={{ fontSize: 12, minHeight: 18, color: '#333', fontVariantNumeric: 'tabular-nums' }} />
    </div>
  );
}
