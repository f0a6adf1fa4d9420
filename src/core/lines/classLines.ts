/**
 * Which catalogue lines belong to each class of object, and how each shows:
 * one rule for the line measurements at a solution and for the markers the
 * reviewer sees on the plot.
 *
 * qso: lines with the quasar broad role as broad emission, lines that are only
 *      narrow as narrow emission, no absorption features;
 * galaxy and unknown: narrow emission, and the absorption features;
 * star: the absorption features only (expected near z = 0).
 * A line with both the narrow and the broad role (the Balmer lines) is narrow
 * in a galaxy and broad in a quasar.
 */
import type { SpectrumClass } from '../types';
import { LINES, lineById, type CatalogueLine, type LineKind } from './catalogue';

/** How a line appears in a class's spectrum; the engine fits each with its own window and widths. */
export type LineProfileName = 'broad' | 'narrow' | 'absorption';

export interface ClassLine {
  line: CatalogueLine;
  profile: LineProfileName;
}

/** A line to mark on the plot: the catalogue facts, with the kind the class shows it as. */
export interface ClassMarker {
  id: string;
  label: string;
  /** Vacuum rest wavelength, Angstrom. */
  restA: number;
  kind: LineKind;
  /** Relative strength within its role (1 = strongest), from the catalogue. */
  strength: number;
}

const CLASSES: readonly SpectrumClass[] = ['qso', 'galaxy', 'star', 'unknown'];

function profileFor(line: CatalogueLine, cls: SpectrumClass): LineProfileName | null {
  const r = line.roles;
  if (cls === 'qso') return r.includes('qso-broad') ? 'broad' : r.includes('narrow') ? 'narrow' : null;
  if (cls === 'star') return r.includes('absorption') ? 'absorption' : null;
  return r.includes('narrow') ? 'narrow' : r.includes('absorption') ? 'absorption' : null;
}

function build(cls: SpectrumClass): readonly ClassLine[] {
  const out: ClassLine[] = [];
  for (const line of LINES) {
    const profile = profileFor(line, cls);
    if (profile) out.push({ line, profile });
  }
  return Object.freeze(out);
}

const LINES_BY_CLASS = new Map(CLASSES.map((c) => [c, build(c)] as const));
const MARKERS_BY_CLASS = new Map(
  CLASSES.map((c) => [
    c,
    Object.freeze(
      LINES_BY_CLASS.get(c)!.map(({ line, profile }): ClassMarker => ({
        id: line.id,
        label: line.label,
        restA: line.restA,
        kind: profile === 'absorption' ? 'absorption' : 'emission',
        strength: line.strength,
      })),
    ),
  ] as const),
);

/** The catalogue lines of a class, in catalogue order, with how each shows (same array on every call). */
export function classLines(cls: SpectrumClass): readonly ClassLine[] {
  return LINES_BY_CLASS.get(cls) ?? LINES_BY_CLASS.get('unknown')!;
}

/**
 * The markers of a class: exactly the lines classLines gives, as the plot
 * draws them. The same array comes back on every call for a class, so a view
 * can compare by identity. No class (no solution yet): the unknown set.
 */
export function markersForClass(cls: SpectrumClass | undefined): readonly ClassMarker[] {
  return MARKERS_BY_CLASS.get(cls ?? 'unknown') ?? MARKERS_BY_CLASS.get('unknown')!;
}

/** True when a class's lines include the catalogue line `lineId`. */
export function classHasLine(cls: SpectrumClass, lineId: string): boolean {
  return classLines(cls).some((l) => l.line.id === lineId);
}

/**
 * The class a named line speaks for when the shown class does not hold it:
 * a quasar broad line says quasar; a narrow line or an absorption feature
 * says galaxy (stars are searched near z = 0 only). Null for an unknown id.
 */
export function classOfLine(lineId: string): SpectrumClass | null {
  const line = lineById(lineId);
  if (!line) return null;
  if (profileFor(line, 'qso') === 'broad') return 'qso';
  return profileFor(line, 'galaxy') ? 'galaxy' : null;
}
