// @vitest-environment jsdom
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { cleanup, fireEvent, render, screen } from '@testing-library/react';
import * as d3 from 'd3';
import { SpectrumView, type SpectrumViewProps, SPECTRUM_FALLBACK_WIDTH_PX, JUMP_HALF_WIDTH_REST_A } from '../../../src/ui/plots/SpectrumView';
import { SPECTRUM_MARGINS } from '../../../src/ui/plots/SpectrumPlotController';
import { KEY_ZOOM_FACTOR } from '../../../src/ui/plots/viewActions';
import { LINES, SKY_REGIONS_A } from '../../../src/core/lines/catalogue';
import { RecordingContext } from './recordingContext';

const N = 20_000;
const wavelengthA = Float64Array.from({ length: N }, (_, i) => 3800 + (i * 5400) / (N - 1)); // 3800..9200 A
const flux = Float64Array.from({ length: N }, (_, i) => 10 + Math.sin(i / 50));
const ivar = new Float64Array(N).fill(25);
const mask = new Uint8Array(N);
mask.fill(1, 9000, 9050);
const markers = LINES.map(({ id, label, restA, kind, strength }) => ({ id, label, restA, kind, strength }));
const skyRegions = SKY_REGIONS_A.map((r) => ({ ...r }));

let contexts: RecordingContext[] = [];
beforeEach(() => {
  contexts = [];
  // jsdom has no canvas: hand the plot a recording context so redraws can be counted.
  vi.spyOn(HTMLCanvasElement.prototype, 'getContext').mockImplementation(function (this: HTMLCanvasElement) {
    const self = this as HTMLCanvasElement & { __rec?: RecordingContext };
    if (!self.__rec) {
      self.__rec = new RecordingContext();
      contexts.push(self.__rec);
    }
    return self.__rec as unknown as CanvasRenderingContext2D;
  } as unknown as typeof HTMLCanvasElement.prototype.getContext);
});
afterEach(() => {
  cleanup();
  vi.restoreAllMocks();
});

function props(over: Partial<SpectrumViewProps> = {}): SpectrumViewProps {
  return { wavelengthA, flux, ivar, mask, model: null, z: 0.1, markers, skyRegions, smoothingPx: 1, height: 300, resetKey: 'obj-A', ...over };
}

/** The x scale the plot must use at full view, built independently from the documented margins and fallback width. */
function fullScale() {
  return d3
    .scaleLinear()
    .domain([3800, 9200])
    .range([SPECTRUM_MARGINS.left, SPECTRUM_FALLBACK_WIDTH_PX - SPECTRUM_MARGINS.right]);
}

function svgOf(container: HTMLElement): SVGSVGElement {
  return container.querySelector('svg')!;
}

function markerXs(container: HTMLElement): Map<string, number> {
  const out = new Map<string, number>();
  container.querySelectorAll('g.sm-marker').forEach((g) => out.set(g.getAttribute('data-marker-id')!, Number(g.querySelector('line')!.getAttribute('x1'))));
  return out;
}

function view(container: HTMLElement): [number, number] {
  return svgOf(container).getAttribute('data-view-a')!.split(',').map(Number) as [number, number];
}

describe('SpectrumView markers', () => {
  it('marks only lines whose (1 + z) * restA is in range, at the x the scale gives', () => {
    const { container } = render(<SpectrumView {...props()} />);
    const xs = markerXs(container);
    const x = fullScale();
    const expected = LINES.filter((l) => 1.1 * l.restA >= 3800 && 1.1 * l.restA <= 9200);
    expect([...xs.keys()].sort()).toEqual(expected.map((l) => l.id).sort());
    // Hα 6564.61 A rest (SDSS line table) at z = 0.1 -> 7221.07 A observed; Lyα at 1337 A is out of range.
    expect(xs.has('Halpha')).toBe(true);
    expect(xs.has('LyA')).toBe(false);
    for (const l of expected) expect(xs.get(l.id)).toBeCloseTo(x(1.1 * l.restA), 6);
  });

  it('renders line labels as text and tells emission from absorption by more than colour', () => {
    const { container } = render(<SpectrumView {...props()} />);
    expect(screen.getAllByText('Hα').length).toBeGreaterThan(0);
    expect(screen.getAllByText('Ca II K').length).toBeGreaterThan(0);
    const abs = container.querySelector('g.sm-marker[data-kind="absorption"] line')!;
    const emi = container.querySelector('g.sm-marker[data-kind="emission"] line')!;
    expect(abs.getAttribute('stroke-dasharray')).toBeTruthy();
    expect(emi.getAttribute('stroke-dasharray')).toBeNull();
  });

  it('draws no markers and no rest axis when z is null', () => {
    const { container } = render(<SpectrumView {...props({ z: null })} />);
    expect(container.querySelectorAll('g.sm-marker').length).toBe(0);
    expect(container.querySelector('.sm-title-top')!.textContent).toMatch(/no redshift/);
    expect(screen.queryByRole('button', { name: 'Hα' })).toBeNull();
  });

  it('moves the markers when z changes, and shades night-sky regions with a title', () => {
    const { container, rerender } = render(<SpectrumView {...props()} />);
    rerender(<SpectrumView {...props({ z: 2.5 })} />);
    const xs = markerXs(container);
    // C IV 1549.06 A rest (Vanden Berk et al. 2001) at z = 2.5 -> 5421.71 A
    expect(xs.get('CIV')).toBeCloseTo(fullScale()(3.5 * 1549.06), 6);
    expect(xs.has('Halpha')).toBe(false);
    const sky = container.querySelectorAll('rect.sm-sky-region');
    expect(sky.length).toBe(SKY_REGIONS_A.length);
    expect(sky[0].querySelector('title')!.textContent).toMatch(/Night-sky/);
  });
});

describe('SpectrumView interaction', () => {
  it('calls onFeatureClick with the wavelength under a click', () => {
    const onFeatureClick = vi.fn();
    const { container } = render(<SpectrumView {...props({ onFeatureClick })} />);
    // jsdom lays nothing out: the svg's client rect sits at (0, 0), so clientX is the local x.
    fireEvent.click(svgOf(container), { clientX: 400, clientY: 150 });
    expect(onFeatureClick).toHaveBeenCalledTimes(1);
    expect(onFeatureClick.mock.calls[0][0]).toBeCloseTo(fullScale().invert(400), 6);
    fireEvent.click(svgOf(container), { clientX: 10, clientY: 150 }); // on the y axis, not the data
    expect(onFeatureClick).toHaveBeenCalledTimes(1);
  });

  it('zooms with + and 0 and pans with the arrow keys when focused', () => {
    const { container } = render(<SpectrumView {...props()} />);
    const svg = svgOf(container);
    expect(view(container)).toEqual([3800, 9200]);
    fireEvent.keyDown(svg, { key: '+' });
    const v = view(container);
    expect(v[1] - v[0]).toBeCloseTo(5400 / KEY_ZOOM_FACTOR, 6);
    expect(v[0] + v[1]).toBeCloseTo(13000, 6);
    // markers follow the zoom
    const x = d3.scaleLinear().domain(v).range(fullScale().range());
    expect(markerXs(container).get('Halpha')).toBeCloseTo(x(1.1 * 6564.61), 6);
    fireEvent.keyDown(svg, { key: 'ArrowRight' });
    expect(view(container)[0]).toBeCloseTo(v[0] + 0.2 * (v[1] - v[0]), 6);
    fireEvent.keyDown(svg, { key: '0' });
    expect(view(container)).toEqual([3800, 9200]);
  });

  it('jump buttons zoom to ±60 Å rest around the line', () => {
    const { container } = render(<SpectrumView {...props()} />);
    fireEvent.click(screen.getByRole('button', { name: 'Hα' }));
    const v = view(container);
    const obs = 1.1 * 6564.61;
    expect(v[0]).toBeCloseTo(obs - JUMP_HALF_WIDTH_REST_A * 1.1, 6);
    expect(v[1]).toBeCloseTo(obs + JUMP_HALF_WIDTH_REST_A * 1.1, 6);
  });

  it('resets the zoom when resetKey changes', () => {
    const { container, rerender } = render(<SpectrumView {...props()} />);
    fireEvent.keyDown(svgOf(container), { key: '+' });
    rerender(<SpectrumView {...props()} />);
    expect(view(container)[1] - view(container)[0]).toBeLessThan(5400);
    rerender(<SpectrumView {...props({ resetKey: 'obj-B' })} />);
    expect(view(container)).toEqual([3800, 9200]);
  });

  it('shows observed and rest wavelength and flux under the pointer', () => {
    const { container } = render(<SpectrumView {...props()} />);
    fireEvent.mouseMove(svgOf(container), { clientX: 400, clientY: 150 });
    const lambda = fullScale().invert(400);
    const text = container.querySelector('.sm-readout')!.textContent!;
    expect(text).toContain(`observed ${lambda.toFixed(1)} Å`);
    expect(text).toContain(`rest ${(lambda / 1.1).toFixed(1)} Å`);
    expect(text).toMatch(/flux \d/);
  });
});

describe('SpectrumView redraw discipline', () => {
  it('redraws the canvas on data changes but not on unrelated prop changes', () => {
    const { rerender } = render(<SpectrumView {...props()} />);
    const ctx = contexts[0];
    const frames = ctx.clears;
    expect(frames).toBeGreaterThanOrEqual(1);
    rerender(<SpectrumView {...props({ highlightA: 6000 })} />);
    rerender(<SpectrumView {...props({ highlightA: 6000, z: 0.2 })} />);
    rerender(<SpectrumView {...props({ highlightA: 6000, z: 0.2, onFeatureClick: () => {} })} />);
    expect(ctx.clears).toBe(frames);
    rerender(<SpectrumView {...props({ highlightA: 6000, z: 0.2, smoothingPx: 5 })} />);
    expect(ctx.clears).toBe(frames + 1);
  });

  it('draws 20,000 pixels decimated per column, with the masked run as a gap', () => {
    render(<SpectrumView {...props()} />);
    const ctx = contexts[0];
    const fluxStroke = ctx.paths.find((p) => p.op === 'stroke' && p.style === '#000000')!;
    expect(fluxStroke.subpaths.length).toBe(2);
    expect(fluxStroke.subpaths.flat().length).toBeLessThanOrEqual(4 * (SPECTRUM_FALLBACK_WIDTH_PX - SPECTRUM_MARGINS.left - SPECTRUM_MARGINS.right));
  });

  it('keeps the zoom window when only the smoothing changes', () => {
    const { container, rerender } = render(<SpectrumView {...props()} />);
    fireEvent.keyDown(svgOf(container), { key: '+' });
    const v = view(container);
    rerender(<SpectrumView {...props({ smoothingPx: 7 })} />);
    expect(view(container)).toEqual(v);
  });

  it('marks highlightA with a rule at its x, and only while it is in view', () => {
    const { container, rerender } = render(<SpectrumView {...props({ highlightA: 6000 })} />);
    const rule = container.querySelector('line.sm-highlight-line')!;
    expect(Number(rule.getAttribute('x1'))).toBeCloseTo(fullScale()(6000), 6);
    rerender(<SpectrumView {...props({ highlightA: 12_000 })} />);
    expect(container.querySelector('line.sm-highlight-line')).toBeNull();
  });

  it('renders without a canvas context (getContext returns null)', () => {
    vi.spyOn(HTMLCanvasElement.prototype, 'getContext').mockReturnValue(null);
    const { container } = render(<SpectrumView {...props()} />);
    expect(container.querySelectorAll('g.sm-marker').length).toBeGreaterThan(0);
  });
});
