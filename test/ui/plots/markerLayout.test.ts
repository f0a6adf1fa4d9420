import { describe, expect, it } from 'vitest';
import {
  labelWidthPx,
  layoutMarkerLabels,
  placeMarkerLabels,
  LABEL_GAP_PX,
  shiftedMarkersInRange,
  strongestLinesInRange,
  type LineMarker,
} from '../../../src/ui/plots/markerLayout';

// Rest wavelengths (vacuum, Angstrom) as in src/core/lines/catalogue.ts (Vanden Berk et al. 2001, AJ 122, 549, Table 2; SDSS line table).
const M: LineMarker[] = [
  { id: 'LyA', label: 'Lyα', restA: 1215.67, kind: 'emission', strength: 1 },
  { id: 'CIV', label: 'C IV', restA: 1549.06, kind: 'emission', strength: 0.25 },
  { id: 'OIII_4960', label: '[O III]', restA: 4960.3, kind: 'emission', strength: 0.33 },
  { id: 'OIII_5008', label: '[O III]', restA: 5008.24, kind: 'emission', strength: 1 },
  { id: 'CaK', label: 'Ca II K', restA: 3934.78, kind: 'absorption', strength: 1 },
];

describe('shiftedMarkersInRange(markers, z, fromA, toA)', () => {
  it('shifts by (1 + z) and keeps only lines in range', () => {
    // Lyα at z = 3 lands at 4862.68 A (docs/reference.md sec. 3 worked example)
    const got = shiftedMarkersInRange(M, 3, 3600, 9000);
    expect(got.map((m) => m.id)).toEqual(['LyA', 'CIV']);
    expect(got[0].observedA).toBeCloseTo(4862.68, 2);
    expect(got[1].observedA).toBeCloseTo(4 * 1549.06, 9);
  });

  it('returns nothing when z is null or unphysical', () => {
    expect(shiftedMarkersInRange(M, null, 0, 1e9)).toEqual([]);
    expect(shiftedMarkersInRange(M, -1, 0, 1e9)).toEqual([]);
    expect(shiftedMarkersInRange(M, NaN, 0, 1e9)).toEqual([]);
  });

  it('includes the range ends', () => {
    expect(shiftedMarkersInRange(M, 0, 1215.67, 1215.67).map((m) => m.id)).toEqual(['LyA']);
  });
});

describe('strongestLinesInRange(markers, z, fromA, toA, maxCount)', () => {
  it('orders by strength and keeps one button per label', () => {
    const got = strongestLinesInRange(M, 0.1, 3600, 9000, 5);
    expect(got.map((m) => m.id)).toEqual(['OIII_5008', 'CaK']);
    expect(strongestLinesInRange(M, 0.1, 3600, 9000, 1).map((m) => m.id)).toEqual(['OIII_5008']);
  });
});

describe('layoutMarkerLabels(requests, nRows)', () => {
  it('puts far-apart labels in the first row', () => {
    const rows = layoutMarkerLabels(
      [
        { xPx: 100, label: 'Hβ', strength: 0.3 },
        { xPx: 400, label: 'Hα', strength: 1 },
      ],
      3,
    );
    expect(rows).toEqual([0, 0]);
  });

  it('staggers close labels and drops the weakest when rows run out', () => {
    const req = [
      { xPx: 300, label: '[N II]', strength: 0.1 },
      { xPx: 302, label: 'Hα', strength: 1 },
      { xPx: 305, label: '[N II]', strength: 0.3 },
    ];
    expect(layoutMarkerLabels(req, 2)).toEqual([null, 0, 1]);
    expect(layoutMarkerLabels(req, 3)).toEqual([2, 0, 1]);
  });

  it('never places two labels of one row closer than the gap (property over a crowd)', () => {
    const req = Array.from({ length: 40 }, (_, i) => ({ xPx: (i * 37) % 500, label: 'L' + 'x'.repeat(i % 6), strength: (i * 13) % 7 }));
    const rows = layoutMarkerLabels(req, 3);
    for (let r = 0; r < 3; r++) {
      const spans = req
        .map((q, i) => ({ q, i }))
        .filter(({ i }) => rows[i] === r)
        .map(({ q }) => [q.xPx - labelWidthPx(q.label) / 2, q.xPx + labelWidthPx(q.label) / 2])
        .sort((a, b) => a[0] - b[0]);
      for (let k = 1; k < spans.length; k++) expect(spans[k][0]).toBeGreaterThanOrEqual(spans[k - 1][1] + LABEL_GAP_PX);
    }
    expect(rows.some((r) => r === null)).toBe(true);
  });
});

describe('placeMarkerLabels inside the plot', () => {
  it('slides a label at the edge inwards so none of it is cut off', () => {
    const [p] = placeMarkerLabels([{ xPx: 52, label: '[Ne V]', strength: 1 }], 2, 50, 800);
    const w = labelWidthPx('[Ne V]');
    expect(p.row).toBe(0);
    expect(p.xPx - w / 2).toBeGreaterThanOrEqual(50);
    const [q] = placeMarkerLabels([{ xPx: 799, label: '[S II]', strength: 1 }], 2, 50, 800);
    expect(q.xPx + labelWidthPx('[S II]') / 2).toBeLessThanOrEqual(800);
  });

  it('gives the two lines of a doublet one label, and still places other labels', () => {
    const places = placeMarkerLabels(
      [
        { xPx: 400, label: '[O III]', strength: 1 },
        { xPx: 392, label: '[O III]', strength: 0.3 },
        { xPx: 398, label: 'Hβ', strength: 0.5 },
      ],
      3,
    );
    expect(places.filter((p) => p.row !== null)).toHaveLength(2);
    expect(places[0].row).not.toBeNull();
    expect(places[1].row).toBeNull();
    expect(layoutMarkerLabels([{ xPx: 400, label: 'a', strength: 1 }], 1)).toEqual([0]);
  });
});
