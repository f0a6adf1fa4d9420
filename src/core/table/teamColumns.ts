/**
 * Columns of a team review's exports: the consensus columns appended to the
 * final catalogue, and the long table of every verdict (one row per
 * spectrum and reviewer, and one per arbiter's settlement).
 */
import type { ColumnDef } from './columns';

export const CONSENSUS_COLUMNS: readonly ColumnDef[] = [
  { name: 'n_reviewers', unit: '', type: 'int', group: 'review', description: 'Reviewers whose verdict on this spectrum counts (their latest)' },
  { name: 'agreement', unit: '', type: 'text', group: 'review', description: 'agree (same class, |dz|/(1+z) below the tolerance in the header), disagree, single (one reviewer) or none (no verdict)' },
  { name: 'settled_by', unit: '', type: 'text', group: 'review', description: 'Arbiter who settled a disagreement; empty when no one did (the review columns are then empty for a disagreement)' },
];

export const VERDICT_COLUMNS: readonly ColumnDef[] = [
  { name: 'file', unit: '', type: 'text', group: 'review', ucd: 'meta.id;meta.dataset', description: 'Spectrum file as the batch names it' },
  { name: 'spectrum_id', unit: '', type: 'text', group: 'review', ucd: 'meta.id', description: "The spectrum's id in the batch" },
  { name: 'role', unit: '', type: 'text', group: 'review', description: 'reviewer, or arbiter for a settlement' },
  { name: 'reviewer', unit: '', type: 'text', group: 'review', description: 'Who gave the verdict (the arbiter for a settlement)' },
  { name: 'review_state', unit: '', type: 'text', group: 'review', description: 'accepted, changed or rejected' },
  { name: 'z', unit: '', type: 'float', decimals: 6, group: 'review', ucd: 'src.redshift', description: 'Redshift of the verdict; empty when rejected' },
  { name: 'z_err', unit: '', type: 'float', decimals: 6, group: 'review', ucd: 'stat.error;src.redshift', description: '1-sigma error of z, when the way it was set gives one' },
  { name: 'class', unit: '', type: 'text', group: 'review', ucd: 'src.class', description: 'qso, galaxy, star or unknown' },
  { name: 'how_set', unit: '', type: 'text', group: 'review', description: 'auto, candidate, line, typed or refit' },
  { name: 'reviewer_grade', unit: '', type: 'text', group: 'review', ucd: 'meta.code.qual', description: "The reviewer's grade: high, medium, low or none" },
  { name: 'review_flags', unit: '', type: 'text', group: 'review', ucd: 'meta.code', description: "Review flags, ';'-separated" },
  { name: 'note', unit: '', type: 'text', group: 'review', ucd: 'meta.note', description: "The reviewer's note" },
  { name: 'reviewed_at', unit: '', type: 'text', group: 'review', description: 'Time of the verdict, ISO 8601' },
  { name: 'source', unit: '', type: 'text', group: 'review', description: 'File the verdict was read from (empty for a settlement)' },
  { name: 'counted', unit: '', type: 'bool', group: 'review', description: "false for a reviewer's earlier verdict replaced by a later one of theirs in another file, or an arbiter's replaced settlement" },
  { name: 'agreement', unit: '', type: 'text', group: 'review', description: "The spectrum's agreement state: agree, disagree, single or none" },
  { name: 'in_final', unit: '', type: 'bool', group: 'review', description: 'true for the verdict the final catalogue carries' },
];
