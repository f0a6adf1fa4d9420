/**
 * Catalogue lines and night-sky regions as the spectrum plot takes them,
 * built once. Which lines each class shows is a display choice of the UI for
 * now (core has no such list yet).
 */
import { LINES, SKY_REGIONS_A } from '../../core/lines/catalogue';
import type { LineMarker } from '../plots/markerLayout';
import type { SkyRegion } from '../plots/SpectrumPlotController';

export const MARKERS: LineMarker[] = LINES.map((l) => ({ id: l.id, label: l.label, restA: l.restA, kind: l.kind, strength: l.strength }));
const BALMER = new Set(['Hbeta', 'Hgam', 'Hdel', 'Heps', 'Halpha']);
/**
 * Markers for the class of the shown solution, so the plot shows the lines that
 * class would have: quasars broad and narrow emission; galaxies narrow emission
 * and stellar absorption; stars absorption, with the Balmer lines as troughs.
 */
export const MARKERS_BY_CLASS: Record<string, LineMarker[]> = {
  qso: MARKERS.filter((m) => LINES.find((l) => l.id === m.id)!.roles.some((r) => r === 'qso-broad' || r === 'narrow')),
  galaxy: MARKERS.filter((m) => LINES.find((l) => l.id === m.id)!.roles.some((r) => r === 'narrow' || r === 'absorption')),
  star: MARKERS.filter((m) => m.kind === 'absorption' || BALMER.has(m.id)).map((m) => ({ ...m, kind: 'absorption' as const })),
  unknown: MARKERS,
};

export function markersFor(cls: string | undefined): LineMarker[] {
  return MARKERS_BY_CLASS[cls ?? 'unknown'] ?? MARKERS;
}

export const SKY: SkyRegion[] = SKY_REGIONS_A.map((r) => ({ label: r.label, fromA: r.fromA, toA: r.toA }));
