/**
 * The catalogue's columns, in order: one list shared by the command line and
 * every export format, so that a column means the same thing everywhere.
 * Units live in the names and in `unit` (VOUnit spelling, '' = dimensionless).
 */
import { REVIEW_FLAGS } from '../types';
import { PHYSICS_COLUMN_DEFS } from '../physics/columns';

/** The review_flags column's description: every flag id with its meaning. */
const FLAGS_DESCRIPTION = `Problems the reviewer marked, ';'-separated, in this order: ${REVIEW_FLAGS.map((f) => `${f.id} (${f.label})`).join(', ')}; empty when none or unreviewed`;

/** text: free text or a code word; float: fixed decimals; int: integer; bool: 'true'/'false'. */
export type ColumnType = 'text' | 'float' | 'int' | 'bool';

/** automatic: from the fit; review: from a person; derived: cosmology at the chosen z; physics: quasar quantities (src/core/physics). */
export type ColumnGroup = 'automatic' | 'review' | 'derived' | 'physics';

export interface ColumnDef {
  name: string;
  /** VOUnit string, '' when dimensionless or text. */
  unit: string;
  description: string;
  type: ColumnType;
  group: ColumnGroup;
  /** Digits after the decimal point (float columns): fixed, so every caller writes the same bytes. */
  decimals?: number;
  /** Significant digits in exponent notation instead (float columns whose scale depends on the input, e.g. a flux). */
  significant?: number;
  /** IVOA UCD1+ word where one plainly fits. */
  ucd?: string;
}

const DEFS = [
  { name: 'file', unit: '', type: 'text', group: 'automatic', ucd: 'meta.id;meta.dataset', description: 'Spectrum file: its name, or the path inside the folder given (starting with that folder\'s name)' },
  { name: 'object_id', unit: '', type: 'text', group: 'automatic', ucd: 'meta.id', description: 'Object identifier from the file header (empty when absent)' },
  { name: 'ra_deg', unit: 'deg', type: 'float', decimals: 7, group: 'automatic', ucd: 'pos.eq.ra;meta.main', description: 'Right ascension from the file header' },
  { name: 'dec_deg', unit: 'deg', type: 'float', decimals: 7, group: 'automatic', ucd: 'pos.eq.dec;meta.main', description: 'Declination from the file header' },
  { name: 'z', unit: '', type: 'float', decimals: 6, group: 'automatic', ucd: 'src.redshift', description: 'Automatic redshift (best chi-square solution); a hypothesis until reviewed' },
  { name: 'z_err', unit: '', type: 'float', decimals: 6, group: 'automatic', ucd: 'stat.error;src.redshift', description: '1-sigma error of z from the chi-square curvature, scaled by the reduced chi-square' },
  { name: 'class', unit: '', type: 'text', group: 'automatic', ucd: 'src.class', description: 'Automatic class: qso, galaxy, star or unknown' },
  { name: 'confidence', unit: '', type: 'text', group: 'automatic', ucd: 'meta.code.qual', description: 'Machine confidence grade: high, medium, low or none' },
  { name: 'score', unit: '', type: 'float', decimals: 4, group: 'automatic', description: 'Machine confidence score, 0 to 1' },
  { name: 'chi2_gap', unit: '', type: 'float', decimals: 3, group: 'automatic', description: 'Chi-square of the runner-up distinct solution minus the best; empty when there is none' },
  { name: 'n_features', unit: '', type: 'int', group: 'automatic', description: 'Independent catalogue lines detected at the best solution' },
  { name: 'runner_up_z', unit: '', type: 'float', decimals: 6, group: 'automatic', description: 'Redshift of the runner-up distinct solution' },
  { name: 'runner_up_class', unit: '', type: 'text', group: 'automatic', description: 'Class of the runner-up distinct solution' },
  { name: 'runner_up_delta_chi2', unit: '', type: 'float', decimals: 3, group: 'automatic', description: 'Chi-square of the runner-up minus the best' },
  { name: 'noise_estimated', unit: '', type: 'bool', group: 'automatic', description: 'true when the file had no uncertainty and the engine estimated one' },
  { name: 'n_pix', unit: '', type: 'int', group: 'automatic', description: 'Pixels in the spectrum as read' },
  { name: 'lambda_min_a', unit: 'Angstrom', type: 'float', decimals: 3, group: 'automatic', ucd: 'em.wl;stat.min', description: 'Shortest vacuum wavelength in the spectrum' },
  { name: 'lambda_max_a', unit: 'Angstrom', type: 'float', decimals: 3, group: 'automatic', ucd: 'em.wl;stat.max', description: 'Longest vacuum wavelength in the spectrum' },
  { name: 'error', unit: '', type: 'text', group: 'automatic', description: 'Empty when the file was read and fitted; otherwise a one-line reason' },
  { name: 'final_z', unit: '', type: 'float', decimals: 6, group: 'review', ucd: 'src.redshift', description: 'Redshift set by the reviewer; empty when unreviewed or rejected' },
  { name: 'final_z_err', unit: '', type: 'float', decimals: 6, group: 'review', ucd: 'stat.error;src.redshift', description: '1-sigma error of final_z' },
  { name: 'final_class', unit: '', type: 'text', group: 'review', ucd: 'src.class', description: 'Class set by the reviewer; empty when unreviewed' },
  { name: 'review_state', unit: '', type: 'text', group: 'review', description: 'unreviewed, accepted, changed or rejected' },
  { name: 'how_set', unit: '', type: 'text', group: 'review', description: 'How final_z was set: auto, candidate, line, typed or refit' },
  { name: 'line_id', unit: '', type: 'text', group: 'review', description: "Catalogue line the reviewer named (how_set = line: final_z is that line's own redshift; refit: the refit started there); empty otherwise" },
  { name: 'line_observed_a', unit: 'Angstrom', type: 'float', decimals: 3, group: 'review', ucd: 'em.wl', description: 'Observed vacuum wavelength of the named line (the fitted centre of the feature)' },
  { name: 'reviewer_grade', unit: '', type: 'text', group: 'review', ucd: 'meta.code.qual', description: "Reviewer's confidence grade: high, medium, low or none" },
  { name: 'reviewer', unit: '', type: 'text', group: 'review', description: 'Who reviewed the spectrum' },
  { name: 'reviewed_at', unit: '', type: 'text', group: 'review', description: 'Time of the review decision, ISO 8601' },
  { name: 'note', unit: '', type: 'text', group: 'review', ucd: 'meta.note', description: "Reviewer's note" },
  { name: 'review_flags', unit: '', type: 'text', group: 'review', ucd: 'meta.code', description: FLAGS_DESCRIPTION },
  { name: 'derived_from', unit: '', type: 'text', group: 'derived', description: 'Which redshift the derived quantities use: final, auto, or empty when none apply (stars, negative z, rejected, failed)' },
  { name: 'lookback_gyr', unit: 'Gyr', type: 'float', decimals: 4, group: 'derived', description: 'Lookback time to the redshift' },
  { name: 'age_gyr', unit: 'Gyr', type: 'float', decimals: 4, group: 'derived', ucd: 'time.age', description: 'Age of the universe at the redshift' },
  { name: 'lum_dist_mpc', unit: 'Mpc', type: 'float', decimals: 2, group: 'derived', description: 'Luminosity distance' },
  { name: 'dist_mod_mag', unit: 'mag', type: 'float', decimals: 4, group: 'derived', ucd: 'phot.mag.distMod', description: 'Distance modulus 5 log10(D_L / 10 pc)' },
  { name: 'ang_diam_dist_mpc', unit: 'Mpc', type: 'float', decimals: 2, group: 'derived', description: 'Angular diameter distance' },
  { name: 'kpc_per_arcsec', unit: 'kpc/arcsec', type: 'float', decimals: 4, group: 'derived', description: 'Proper transverse size of one arcsecond at the redshift' },
  ...PHYSICS_COLUMN_DEFS,
] as const satisfies readonly ColumnDef[];

/** Every column name of the catalogue. */
export type ColumnName = (typeof DEFS)[number]['name'];

/** All columns: automatic, review, derived, in export order. */
export const CATALOGUE_COLUMNS: readonly ColumnDef[] = DEFS;

/** The columns of an unreviewed batch (command line): automatic plus derived. */
export const AUTOMATIC_COLUMNS: readonly ColumnDef[] = DEFS.filter((c) => c.group !== 'review');

/** A row: one formatted cell per column name; '' = empty (no value). */
export type TableRow = Readonly<Record<string, string>>;

/** The column definition of a name, or undefined for a name the catalogue does not know. */
export function columnByName(name: string): ColumnDef | undefined {
  return CATALOGUE_COLUMNS.find((c) => c.name === name);
}
