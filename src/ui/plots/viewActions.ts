/**
 * Keyboard view changes for the spectrum plot and the arithmetic that turns a
 * wanted wavelength window into a d3-zoom transform. Pure, no DOM.
 */

/** Keys the spectrum plot answers while it has focus; listed by the help overlay. */
export const PLOT_KEYS: readonly { keys: readonly string[]; action: string }[] = [
  { keys: ['+', '='], action: 'Zoom in on the middle of the view' },
  { keys: ['-'], action: 'Zoom out' },
  { keys: ['ArrowLeft', 'ArrowRight'], action: 'Pan by a fifth of the view' },
  { keys: ['Shift+ArrowLeft', 'Shift+ArrowRight'], action: 'Pan by a whole view' },
  { keys: ['0'], action: 'Show the whole spectrum' },
];

/** Zoom factor of one key press (view span divided or multiplied by it). */
export const KEY_ZOOM_FACTOR = 1.5;
/** Pan of one arrow press, as a fraction of the view span (Shift: a whole span). */
export const KEY_PAN_FRACTION = 0.2;

export type ViewAction = { type: 'zoom'; factor: number } | { type: 'pan'; fraction: number } | { type: 'reset' };

/** The view action for a key press, or null when the plot does not use that key. */
export function keyToViewAction(e: { key: string; shiftKey?: boolean; ctrlKey?: boolean; metaKey?: boolean; altKey?: boolean }): ViewAction | null {
  if (e.ctrlKey || e.metaKey || e.altKey) return null;
  switch (e.key) {
    case '+':
    case '=':
      return { type: 'zoom', factor: KEY_ZOOM_FACTOR };
    case '-':
    case '_':
      return { type: 'zoom', factor: 1 / KEY_ZOOM_FACTOR };
    case 'ArrowLeft':
      return { type: 'pan', fraction: -(e.shiftKey ? 1 : KEY_PAN_FRACTION) };
    case 'ArrowRight':
      return { type: 'pan', fraction: e.shiftKey ? 1 : KEY_PAN_FRACTION };
    case '0':
      return { type: 'reset' };
    default:
      return null;
  }
}

/**
 * Clamps a window [a, b] into full = [lo, hi], keeping its span when it fits,
 * never narrower than minSpan (all in the same unit, Angstrom here).
 */
export function clampDomain(a: number, b: number, full: readonly [number, number], minSpan: number): [number, number] {
  const fullSpan = full[1] - full[0];
  let span = Math.min(Math.max(b - a, minSpan), fullSpan);
  if (!(span > 0)) span = fullSpan;
  const mid = 0.5 * (a + b);
  let lo = mid - span / 2;
  if (lo < full[0]) lo = full[0];
  if (lo + span > full[1]) lo = full[1] - span;
  return [lo, lo + span];
}

/** The view after an action, clamped to the full range. factor > 1 zooms in about the centre. */
export function applyViewAction(
  view: readonly [number, number],
  full: readonly [number, number],
  action: ViewAction,
  minSpan: number,
): [number, number] {
  const span = view[1] - view[0];
  switch (action.type) {
    case 'reset':
      return [full[0], full[1]];
    case 'zoom': {
      const mid = 0.5 * (view[0] + view[1]);
      const half = span / action.factor / 2;
      return clampDomain(mid - half, mid + half, full, minSpan);
    }
    case 'pan':
      return clampDomain(view[0] + action.fraction * span, view[1] + action.fraction * span, full, minSpan);
  }
}

/**
 * The d3-zoom transform {k, x} that shows target = [a, b] when the untransformed
 * linear scale maps full = [lo, hi] onto range = [r0, r1] pixels. d3's rescaleX
 * inverts the range through (p - x) / k, so we need (r0 - x) / k = base(a) and
 * (r1 - x) / k = base(b).
 */
export function zoomTransformFor(
  full: readonly [number, number],
  range: readonly [number, number],
  target: readonly [number, number],
): { k: number; x: number } {
  const pxPerUnit = (range[1] - range[0]) / (full[1] - full[0]);
  const base = (v: number) => range[0] + (v - full[0]) * pxPerUnit;
  const k = (range[1] - range[0]) / (base(target[1]) - base(target[0]));
  return { k, x: range[0] - k * base(target[0]) };
}
