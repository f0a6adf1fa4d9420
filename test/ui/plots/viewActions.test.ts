import { describe, expect, it } from 'vitest';
import * as d3 from 'd3';
import {
  applyViewAction,
  clampDomain,
  keyToViewAction,
  KEY_ZOOM_FACTOR,
  PLOT_KEYS,
  zoomTransformFor,
} from '../../../src/ui/plots/viewActions';

describe('keyToViewAction(event)', () => {
  it('maps every documented key to an action', () => {
    for (const row of PLOT_KEYS) {
      for (const k of row.keys) {
        const [mod, key] = k.includes('+') && k.length > 1 ? k.split('+') : [undefined, k];
        expect(keyToViewAction({ key, shiftKey: mod === 'Shift' }), k).not.toBeNull();
      }
    }
  });

  it('leaves other keys and modified keys to the app', () => {
    expect(keyToViewAction({ key: 'a' })).toBeNull();
    expect(keyToViewAction({ key: 'Enter' })).toBeNull();
    expect(keyToViewAction({ key: '+', ctrlKey: true })).toBeNull();
  });
});

describe('applyViewAction(view, full, action, minSpan)', () => {
  const full: [number, number] = [3800, 9200];
  it('zooms about the centre by the key factor', () => {
    const v = applyViewAction([5000, 6000], full, { type: 'zoom', factor: KEY_ZOOM_FACTOR }, 1);
    expect(v[0] + v[1]).toBeCloseTo(11000, 9);
    expect(v[1] - v[0]).toBeCloseTo(1000 / KEY_ZOOM_FACTOR, 9);
  });
  it('pans and stops at the edge without shrinking the view', () => {
    expect(applyViewAction([5000, 6000], full, { type: 'pan', fraction: 0.2 }, 1)).toEqual([5200, 6200]);
    expect(applyViewAction([8500, 9100], full, { type: 'pan', fraction: 1 }, 1)).toEqual([8600, 9200]);
  });
  it('never zooms out past the full range nor in past minSpan', () => {
    expect(applyViewAction([4000, 9000], full, { type: 'zoom', factor: 0.1 }, 1)).toEqual(full);
    const v = applyViewAction([5000, 5004], full, { type: 'zoom', factor: 10 }, 3);
    expect(v[1] - v[0]).toBeCloseTo(3, 9);
    expect(applyViewAction([5000, 5004], full, { type: 'reset' }, 3)).toEqual(full);
  });
  it('clampDomain keeps a window that already fits', () => {
    expect(clampDomain(4000, 4100, full, 1)).toEqual([4000, 4100]);
  });
});

describe('zoomTransformFor(full, range, target)', () => {
  it('gives a transform whose rescaleX shows the target window (checked through d3 itself)', () => {
    const full: [number, number] = [3800, 9200];
    const range: [number, number] = [56, 788];
    const base = d3.scaleLinear().domain(full).range(range);
    for (const target of [[5000, 5100], [3800, 9200], [9100, 9200], [3900.5, 3901]] as [number, number][]) {
      const { k, x } = zoomTransformFor(full, range, target);
      const d = d3.zoomIdentity.translate(x, 0).scale(k).rescaleX(base).domain();
      expect(d[0]).toBeCloseTo(target[0], 6);
      expect(d[1]).toBeCloseTo(target[1], 6);
    }
  });
});
