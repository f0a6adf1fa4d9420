/**
 * Which catalogue lines to mark at a redshift, and where their labels go so they
 * do not overlap. Pure, no DOM.
 */

/** A line the plot can mark, as the catalogue gives it. restA: vacuum rest wavelength, Angstrom. */
export interface LineMarker {
  id: string;
  label: string;
  restA: number;
  kind: 'emission' | 'absorption';
  /** Relative strength (larger = more important); decides who keeps a label. */
  strength: number;
}

/** A marker shifted to the observed frame: observedA = (1 + z) * restA, Angstrom. */
export interface ShiftedMarker extends LineMarker {
  observedA: number;
}

/**
 * Markers whose observed wavelength (1 + z) * restA lies in [fromA, toA] (Angstrom),
 * in catalogue order. z null (no redshift yet) or z <= -1 (unphysical): none.
 */
export function shiftedMarkersInRange(
  markers: readonly LineMarker[],
  z: number | null,
  fromA: number,
  toA: number,
): ShiftedMarker[] {
  if (z === null || !Number.isFinite(z) || z <= -1) return [];
  const out: ShiftedMarker[] = [];
  for (const m of markers) {
    const observedA = (1 + z) * m.restA;
    if (observedA >= fromA && observedA <= toA) out.push({ ...m, observedA });
  }
  return out;
}

/**
 * The strongest lines in [fromA, toA] (observed Angstrom), at most maxCount,
 * strongest first, one per label (the [O III] pair gives one button).
 */
export function strongestLinesInRange(
  markers: readonly LineMarker[],
  z: number | null,
  fromA: number,
  toA: number,
  maxCount: number,
): ShiftedMarker[] {
  const inRange = shiftedMarkersInRange(markers, z, fromA, toA).sort((a, b) => b.strength - a.strength);
  const seen = new Set<string>();
  const out: ShiftedMarker[] = [];
  for (const m of inRange) {
    if (seen.has(m.label)) continue;
    seen.add(m.label);
    out.push(m);
    if (out.length >= maxCount) break;
  }
  return out;
}

/** Approximate advance of one label character at the 11 px label font, CSS px (no DOM to measure in). */
export const LABEL_CHAR_WIDTH_PX = 6.5;
/** Free space kept between neighbouring labels in one row, CSS px. */
export const LABEL_GAP_PX = 4;

/** Estimated width of a label, CSS px. */
export function labelWidthPx(label: string): number {
  return label.length * LABEL_CHAR_WIDTH_PX + 2;
}

/** A label to place: centred on xPx (CSS px). */
export interface LabelRequest {
  xPx: number;
  label: string;
  strength: number;
}

/**
 * Greedy label placement: strongest first, each label centred on its line goes
 * into the first of nRows rows where it overlaps nothing already placed (with
 * LABEL_GAP_PX between); a label that fits nowhere is dropped (row null), so
 * the weaker of two crowded lines loses its label, never the stronger.
 * Returns the row of each request, in request order.
 */
export function layoutMarkerLabels(requests: readonly LabelRequest[], nRows: number): (number | null)[] {
  return placeMarkerLabels(requests, nRows, -Infinity, Infinity, false).map((p) => p.row);
}

/** Where a label goes: its row (null = not drawn) and the centre of its text, CSS px. */
export interface LabelPlace {
  row: number | null;
  xPx: number;
}

/**
 * As layoutMarkerLabels, inside [leftPx, rightPx]: a label near an edge slides
 * inwards so it is never cut off (its line stays where it is), and a label
 * equal to one already placed within two label widths is not repeated (the
 * two lines of a doublet carry one label).
 */
export function placeMarkerLabels(requests: readonly LabelRequest[], nRows: number, leftPx = -Infinity, rightPx = Infinity, oneLabelPerDoublet = true): LabelPlace[] {
  const order = requests.map((_, i) => i).sort((a, b) => requests[b].strength - requests[a].strength || requests[a].xPx - requests[b].xPx);
  const rows: [number, number][][] = Array.from({ length: Math.max(0, nRows) }, () => []);
  const result: LabelPlace[] = requests.map((q) => ({ row: null, xPx: q.xPx }));
  const placed: { label: string; xPx: number }[] = [];
  for (const i of order) {
    const q = requests[i];
    const w = labelWidthPx(q.label);
    if (oneLabelPerDoublet && placed.some((p) => p.label === q.label && Math.abs(p.xPx - q.xPx) < 2 * w)) continue;
    let x = q.xPx;
    if (x - w / 2 < leftPx) x = leftPx + w / 2;
    if (x + w / 2 > rightPx) x = Math.max(leftPx + w / 2, rightPx - w / 2);
    const a = x - w / 2;
    const b = x + w / 2;
    for (let r = 0; r < rows.length; r++) {
      const clash = rows[r].some(([c, d]) => a < d + LABEL_GAP_PX && c < b + LABEL_GAP_PX);
      if (!clash) {
        rows[r].push([a, b]);
        result[i] = { row: r, xPx: x };
        placed.push({ label: q.label, xPx: q.xPx });
        break;
      }
    }
  }
  return result;
}
