/**
 * Catalogue lines and night-sky regions as the spectrum plot takes them.
 * Which lines each class shows is core's rule (src/core/lines/classLines.ts),
 * the same one the line measurements follow.
 */
import { SKY_REGIONS_A } from '../../core/lines/catalogue';
import { markersForClass } from '../../core/lines/classLines';
import type { SpectrumClass } from '../../core/types';
import type { LineMarker } from '../plots/markerLayout';
import type { SkyRegion } from '../plots/SpectrumPlotController';

/** Markers for the class of the shown solution (the same array for a class on every call). */
export function markersFor(cls: SpectrumClass | undefined): readonly LineMarker[] {
  return markersForClass(cls);
}

export const SKY: SkyRegion[] = SKY_REGIONS_A.map((r) => ({ label: r.label, fromA: r.fromA, toA: r.toA }));
