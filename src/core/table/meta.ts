import type { CosmologyParams } from '../types';
import { describeCosmology, omegaLambda } from '../cosmology';
import type { ColumnDef } from './columns';

/** Provenance written into every export. */
export interface ExportMeta {
  /** Software name. */
  software: string;
  version: string;
  /** Template set id the fits used. */
  templateSet: string;
  cosmology: CosmologyParams;
  /** Creation time, ISO 8601 (passed in: core never reads the clock). */
  createdAt: string;
  /** More provenance, e.g. { shard: '2/8' }; written after `created`. */
  extra?: Readonly<Record<string, string>>;
}

/** The caution every export carries: automatic redshifts nobody reviewed are hypotheses. */
export function exportCaution(columns: readonly ColumnDef[]): string {
  return columns.some((c) => c.name === 'review_state')
    ? 'rows with review_state = unreviewed carry automatic redshifts that no person has checked; treat them as hypotheses'
    : 'every redshift in this table is automatic and unreviewed; treat them as hypotheses until a person has checked them';
}

/** How the derived columns were computed, in one line. */
export function derivedNote(columns: readonly ColumnDef[]): string {
  return columns.some((c) => c.name === 'final_z')
    ? 'derived columns use the cosmology above at final_z, or at z when unreviewed; empty for stars, negative z, rejected and failed rows'
    : 'derived columns use the cosmology above at z; empty for stars, negative z and failed rows';
}

/** Replace line breaks and other control characters so a value fits on one header line. */
export function oneLine(s: string): string {
  return s.replace(/[\u0000-\u001f\u007f]+/g, ' ').trim();
}

/**
 * The provenance as ordered key/value pairs, shared by the CSV header block,
 * the VOTable INFO elements, the FITS header comments and the JSON meta.
 */
export function metaEntries(meta: ExportMeta, columns: readonly ColumnDef[]): Array<[string, string]> {
  return [
    ['software', oneLine(`${meta.software} ${meta.version}`)],
    ['template_set', oneLine(meta.templateSet)],
    ['cosmology', describeCosmology(meta.cosmology)],
    ['created', oneLine(meta.createdAt)],
    ...Object.entries(meta.extra ?? {}).map(([k, v]): [string, string] => [oneLine(k).replace(/[:\s]+/g, '_'), oneLine(v)]),
    ['caution', exportCaution(columns)],
    ['derived', derivedNote(columns)],
  ];
}

/** The cosmology as plain numbers plus its one-line description, for JSON and tables. */
export function cosmologySummary(p: CosmologyParams) {
  return { h0: p.h0, omegaM: p.omegaM, omegaK: p.omegaK, omegaR: p.omegaR, omegaLambda: omegaLambda(p), description: describeCosmology(p) };
}
