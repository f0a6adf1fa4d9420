// @vitest-environment jsdom
import { afterEach, describe, expect, it, vi } from 'vitest';
import { cleanup, fireEvent, render, screen } from '@testing-library/react';
import * as d3 from 'd3';
import {
  FitQualityPlot,
  FIT_FALLBACK_WIDTH_PX,
  FIT_MARGINS,
  fitQualityScales,
  type FitQualityPlotProps,
} from '../../../src/ui/plots/FitQualityPlot';

afterEach(cleanup);

// Synthetic curves: parabolic wells at z = 2.1 (qso) and z = 0.45 (galaxy), on a 0..4 grid.
const zGrid = Float64Array.from({ length: 401 }, (_, i) => i * 0.01);
const curves = [
  { family: 'qso', z: zGrid, deltaChi2: zGrid.map((z) => 4000 * (z - 2.1) ** 2) },
  { family: 'galaxy-sf', z: zGrid, deltaChi2: zGrid.map((z) => 40 + 3000 * (z - 0.45) ** 2) },
];
const candidates = [
  { z: 2.1, family: 'qso', class: 'qso', deltaChi2: 0 },
  { z: 0.45, family: 'galaxy-sf', class: 'galaxy', deltaChi2: 40 },
];

function props(over: Partial<FitQualityPlotProps> = {}): FitQualityPlotProps {
  return { curves, candidates, currentZ: 2.1, selectedCandidate: 0, height: 200, ...over };
}

describe('FitQualityPlot', () => {
  it('draws one curve per family with a legend entry each, in distinct styles', () => {
    const { container } = render(<FitQualityPlot {...props()} />);
    const paths = container.querySelectorAll('path.fq-curve');
    expect(paths.length).toBe(2);
    const styles = [...paths].map((p) => `${p.getAttribute('stroke')}|${p.getAttribute('stroke-dasharray')}`);
    expect(new Set(styles).size).toBe(2);
    // the second family differs by dash as well as colour, so colour is not the only cue
    expect(paths[0].getAttribute('stroke-dasharray')).not.toBe(paths[1].getAttribute('stroke-dasharray'));
    expect(screen.getByText('qso')).toBeTruthy();
    expect(screen.getByText('galaxy-sf')).toBeTruthy();
  });

  it('numbers the candidates and calls onPickCandidate when a mark is clicked (and not onPickZ)', () => {
    const onPickCandidate = vi.fn();
    const onPickZ = vi.fn();
    const { container } = render(<FitQualityPlot {...props({ onPickCandidate, onPickZ })} />);
    const marks = container.querySelectorAll('g.fq-candidate');
    expect([...marks].map((m) => m.querySelector('text')!.textContent)).toEqual(['1', '2']);
    fireEvent.click(marks[1].querySelector('circle')!);
    expect(onPickCandidate).toHaveBeenCalledWith(1);
    expect(onPickZ).not.toHaveBeenCalled();
    fireEvent.keyDown(marks[0], { key: 'Enter' });
    expect(onPickCandidate).toHaveBeenLastCalledWith(0);
  });

  it('places candidate marks at the scale position of their z and delta chi-square', () => {
    const { container } = render(<FitQualityPlot {...props()} />);
    const x = d3.scaleLinear().domain([0, 4]).range([FIT_MARGINS.left, FIT_FALLBACK_WIDTH_PX - FIT_MARGINS.right]);
    const c = container.querySelector('g.fq-candidate[data-candidate-index="1"] circle')!;
    expect(Number(c.getAttribute('cx'))).toBeCloseTo(x(0.45), 6);
    const { y } = fitQualityScales(curves, candidates, FIT_FALLBACK_WIDTH_PX, 200);
    expect(Number(c.getAttribute('cy'))).toBeCloseTo(y(40), 6);
  });

  it('calls onPickZ with the redshift under a click elsewhere on the plot', () => {
    const onPickZ = vi.fn();
    const onPickCandidate = vi.fn();
    const { container } = render(<FitQualityPlot {...props({ onPickZ, onPickCandidate })} />);
    const x = d3.scaleLinear().domain([0, 4]).range([FIT_MARGINS.left, FIT_FALLBACK_WIDTH_PX - FIT_MARGINS.right]);
    fireEvent.click(container.querySelector('svg')!, { clientX: 300, clientY: 100 });
    expect(onPickZ).toHaveBeenCalledTimes(1);
    expect(onPickZ.mock.calls[0][0]).toBeCloseTo(x.invert(300), 6);
    expect(onPickCandidate).not.toHaveBeenCalled();
    fireEvent.click(container.querySelector('svg')!, { clientX: 5, clientY: 100 }); // the y axis
    expect(onPickZ).toHaveBeenCalledTimes(1);
  });

  it('shows the current z as a rule and highlights the selected candidate', () => {
    const { container, rerender } = render(<FitQualityPlot {...props()} />);
    const x = d3.scaleLinear().domain([0, 4]).range([FIT_MARGINS.left, FIT_FALLBACK_WIDTH_PX - FIT_MARGINS.right]);
    expect(Number(container.querySelector('.fq-current-z line')!.getAttribute('x1'))).toBeCloseTo(x(2.1), 6);
    expect(container.querySelector('g.fq-candidate[data-candidate-index="0"]')!.getAttribute('aria-pressed')).toBe('true');
    const curveBefore = container.querySelector('path.fq-curve');
    rerender(<FitQualityPlot {...props({ currentZ: 0.45, selectedCandidate: 1 })} />);
    expect(Number(container.querySelector('.fq-current-z line')!.getAttribute('x1'))).toBeCloseTo(x(0.45), 6);
    expect(container.querySelector('g.fq-candidate[data-candidate-index="1"]')!.getAttribute('aria-pressed')).toBe('true');
    // the curves were not rebuilt for a selection change
    expect(container.querySelector('path.fq-curve')).toBe(curveBefore);
    rerender(<FitQualityPlot {...props({ currentZ: null })} />);
    expect(container.querySelector('.fq-current-z')).toBeNull();
  });

  it('says so when there is no curve', () => {
    const onPickZ = vi.fn();
    const { container } = render(<FitQualityPlot {...props({ curves: [], candidates: [], currentZ: null, onPickZ })} />);
    expect(screen.getByText(/No fit-quality curve/)).toBeTruthy();
    fireEvent.click(container.querySelector('svg')!, { clientX: 300, clientY: 100 });
    expect(onPickZ).not.toHaveBeenCalled();
  });
});

describe('fitQualityScales(curves, candidates, widthPx, heightPx)', () => {
  it('gives the near-zero minima room on the symlog axis', () => {
    const { y } = fitQualityScales(curves, candidates, 800, 200);
    const bottom = y(0);
    const top = y(y.domain()[1]);
    // on a linear axis Δχ² = 10 of a ~44000 range would sit within 0.1% of the height; symlog lifts it past a fifth
    expect((bottom - y(10)) / (bottom - top)).toBeGreaterThan(0.2);
    expect(y.domain()[0]).toBe(0);
  });
});

describe('families searched over a narrow range (stars near z = 0)', () => {
  // Synthetic star curve over +-0.0033 (about +-1000 km/s), well at z = 0.0002.
  const cKms = 299792.458; // speed of light, km/s (SI definition)
  const zStar = Float64Array.from({ length: 67 }, (_, i) => -0.0033 + i * 0.0001);
  const withStar = [...curves, { family: 'star', z: zStar, deltaChi2: zStar.map((z) => 90 + 1e8 * (z - 0.0002) ** 2) }];
  const starCands = [...candidates, { z: 0.0002, family: 'star', class: 'star', deltaChi2: 90 }];

  it('gets its own panel on a velocity axis, so its well is as wide as the panel, not a few pixels', () => {
    const { container } = render(<FitQualityPlot {...props({ curves: withStar, candidates: starCands })} />);
    const star = container.querySelector('path.fq-curve[data-family="star"]')!;
    expect(star.getAttribute('data-panel')).toBe('inset');
    expect(container.querySelector('path.fq-curve[data-family="qso"]')!.getAttribute('data-panel')).toBe('main');
    const xs = [...star.getAttribute('d')!.matchAll(/[ML]([-\d.]+),/g)].map((m) => Number(m[1]));
    const main = fitQualityScales(withStar, starCands, FIT_FALLBACK_WIDTH_PX, 200, new Set(['star'])).x;
    expect(Math.max(...xs) - Math.min(...xs)).toBeGreaterThan(100);
    expect(Math.min(...xs)).toBeGreaterThan(main.range()[1]);
    // The star candidate's mark sits in the panel at its velocity.
    const mark = container.querySelector('g.fq-candidate[data-candidate-index="2"] circle')!;
    expect(Number(mark.getAttribute('cx'))).toBeGreaterThan(main.range()[1]);
    expect(screen.getByText(/star: cz \(km\/s\)/)).toBeTruthy();
  });

  it('a click in the panel picks the redshift of that velocity', () => {
    const onPickZ = vi.fn();
    const { container } = render(<FitQualityPlot {...props({ curves: withStar, candidates: starCands, onPickZ })} />);
    const svg = container.querySelector('svg')!;
    const right = FIT_FALLBACK_WIDTH_PX - FIT_MARGINS.right;
    const px = right - 20;
    fireEvent.click(svg, { clientX: px, clientY: 100 });
    const v = d3.scaleLinear().domain([-0.0033 * cKms, (-0.0033 + 66 * 0.0001) * cKms]).range([right - 150, right]);
    expect(onPickZ.mock.calls[0][0]).toBeCloseTo(v.invert(px) / cKms, 8);
  });

  it('marks only the keyed candidates, numbered by key, and stacks marks that would cover each other', () => {
    const close = [
      { z: 2.1, family: 'qso', class: 'qso', deltaChi2: 0 },
      { z: 2.1005, family: 'qso', class: 'qso', deltaChi2: 1 },
      { z: 0.45, family: 'galaxy-sf', class: 'galaxy', deltaChi2: 40 },
    ];
    const { container } = render(<FitQualityPlot {...props({ candidates: close, keyed: [0, 1] })} />);
    const marks = [...container.querySelectorAll('g.fq-candidate')];
    expect(marks.map((m) => m.querySelector('text')!.textContent)).toEqual(['1', '2']);
    const [a, b] = marks.map((m) => m.querySelector('circle')!);
    const d = Math.hypot(Number(a.getAttribute('cx')) - Number(b.getAttribute('cx')), Number(a.getAttribute('cy')) - Number(b.getAttribute('cy')));
    expect(d).toBeGreaterThanOrEqual(14);
  });
});
