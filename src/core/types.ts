/**
 * The data contracts every layer relies on. Units live in the names:
 * wavelengths are vacuum Angstrom, velocities km/s.
 */
import type { QuasarMeasurement } from './physics/types';

/** Header facts carried with a spectrum; every field optional. */
export interface SpectrumMeta {
  objectId?: string;
  /** Right ascension, degrees (ICRS as given by the file). */
  raDeg?: number;
  /** Declination, degrees. */
  decDeg?: number;
  /** Date of observation as written in the file (ISO 8601 when possible). */
  dateObs?: string;
  exposureS?: number;
  instrument?: string;
  /** Flux unit string as written in the file, e.g. '1e-17 erg/s/cm2/A'. */
  fluxUnit?: string;
  /** True when the file gave air wavelengths and the reader converted them to vacuum. */
  convertedFromAir?: boolean;
}

/**
 * One reduced 1-D spectrum, validated once at load.
 * Invariants (enforced by the readers): length >= 2; all arrays the same length;
 * wavelength finite and strictly increasing.
 */
export interface Spectrum {
  /** File name as given by the user (path or base name). */
  file: string;
  /** Which reader produced it, e.g. 'fits-image', 'fits-table', 'text'. */
  format: string;
  /** Vacuum wavelength of each pixel centre, Angstrom, strictly increasing. */
  wavelengthA: Float64Array;
  /** Flux density per pixel, in meta.fluxUnit (NaN allowed; such pixels get zero weight). */
  flux: Float64Array;
  /** Inverse variance of flux, 1/unit^2; 0 = no information. null when the file carried no uncertainty. */
  ivar: Float64Array | null;
  /** 1 = bad pixel (from the file's mask), 0 = good. */
  mask: Uint8Array;
  meta: SpectrumMeta;
}

/** Where in the file a read problem sits; all optional. */
export interface ReadErrorWhere {
  hdu?: number;
  keyword?: string;
  /** 1-based line number in a text file. */
  line?: number;
  column?: string;
}

/**
 * A read failure with one message shape: `${file}: ${reason}` plus the place.
 * Readers throw only this; anything else escaping a reader is a bug.
 */
export class SpectrumReadError extends Error {
  readonly file: string;
  readonly reason: string;
  readonly where: ReadErrorWhere;
  constructor(file: string, reason: string, where: ReadErrorWhere = {}) {
    super(formatReadError(file, reason, where));
    this.name = 'SpectrumReadError';
    this.file = file;
    this.reason = reason;
    this.where = where;
  }
}

export function formatReadError(file: string, reason: string, where: ReadErrorWhere): string {
  const at: string[] = [];
  if (where.hdu !== undefined) at.push(`HDU ${where.hdu}`);
  if (where.keyword !== undefined) at.push(`keyword ${where.keyword}`);
  if (where.column !== undefined) at.push(`column ${where.column}`);
  if (where.line !== undefined) at.push(`line ${where.line}`);
  return at.length ? `${file} (${at.join(', ')}): ${reason}` : `${file}: ${reason}`;
}

export type SpectrumClass = 'qso' | 'galaxy' | 'star' | 'unknown';
export type Grade = 'high' | 'medium' | 'low' | 'none';

/** One distinct local minimum of chi-square against redshift. */
export interface Candidate {
  z: number;
  /** 1-sigma error from the chi-square curvature, scaled by the reduced chi-square. */
  zErr: number;
  /** Template family id, e.g. 'qso', 'galaxy-sf', 'galaxy-passive', 'star'. */
  family: string;
  class: SpectrumClass;
  chi2: number;
  /** Degrees of freedom of the fit (good pixels minus free parameters). */
  dof: number;
  /** chi2 minus the best candidate's chi2 (0 for the best). */
  deltaChi2: number;
  /** True when the minimum sits on the edge of the family's search range. */
  atEdge: boolean;
}

/** Chi-square against redshift for one family, down-sampled for plotting. */
export interface ChiSquareCurve {
  family: string;
  z: Float64Array;
  /** chi2(z) minus the global best chi2 of the fit. */
  deltaChi2: Float64Array;
}

/** A Gaussian-plus-local-continuum measurement of one catalogue line at the chosen z. */
export interface LineMeasurement {
  /** Catalogue id, e.g. 'CIV', 'OIII_5008'. */
  id: string;
  label: string;
  kind: 'emission' | 'absorption';
  restA: number;
  observedA: number;
  observedErrA: number;
  /** Redshift implied by this line alone. */
  z: number;
  zErr: number;
  fwhmKms: number;
  fwhmErrKms: number;
  /** Integrated line flux in (flux unit * Angstrom); negative for absorption. */
  flux: number;
  fluxErr: number;
  /** Rest-frame equivalent width, Angstrom (positive for emission, by this project's convention). */
  ewRestA: number;
  ewRestErrA: number;
  snr: number;
  /** True when the line is detected at snr >= 3 with a physical width. */
  detected: boolean;
}

export type FitStatus = 'ok' | 'failed' | 'timeout';

export interface FitResult {
  file: string;
  status: FitStatus;
  /** One-line reason when status is not 'ok'. */
  error?: string;
  /** Ranked distinct solutions, best first (empty when failed). */
  candidates: Candidate[];
  z: number;
  zErr: number;
  class: SpectrumClass;
  /** Machine confidence score, 0..1. */
  score: number;
  confidence: Grade;
  /** chi2 of the runner-up distinct candidate minus the best (Infinity when none). */
  chi2Gap: number;
  /** Number of independent catalogue lines detected at the best solution. */
  nFeatures: number;
  curves: ChiSquareCurve[];
  lines: LineMeasurement[];
  /** True when the file had no uncertainty and the engine estimated one. */
  noiseEstimated: boolean;
  /** Template set id and engine version, for provenance. */
  templateSet: string;
  engineVersion: string;
  /** Summary of the input, for tables. */
  input: { nPix: number; lambdaMinA: number; lambdaMaxA: number; medianSnr: number; meta: SpectrumMeta; format: string };
  /** Input pixels masked before the fit, by reason (absent in results saved before it existed). */
  masked?: { reason: string; pixels: number }[];
  /** Quasar physics measured at z (src/core/physics); absent for other classes and in results saved before it existed. */
  quasar?: QuasarMeasurement;
}

export type ReviewState = 'unreviewed' | 'accepted' | 'changed' | 'rejected';
/** How the final redshift was set. */
export type HowSet = 'auto' | 'candidate' | 'line' | 'typed' | 'refit';

/**
 * Review flags: problems a reviewer marks on a spectrum, beside the redshift
 * and the grade. The id is what sessions store and the review_flags column
 * writes; this order is the order everywhere (stored lists, exported cells).
 */
export const REVIEW_FLAGS = [
  { id: 'broad-absorption', label: 'Broad absorption troughs (BAL)' },
  { id: 'sky-residuals', label: 'Sky or telluric residuals spoil part of the spectrum' },
  { id: 'low-snr', label: 'Low S/N' },
  { id: 'partial-coverage', label: 'Partial coverage: key lines outside the range or masked' },
  { id: 'blend', label: 'Possible blend or two objects in the spectrum' },
] as const;

export type ReviewFlag = (typeof REVIEW_FLAGS)[number]['id'];

export function isReviewFlag(v: unknown): v is ReviewFlag {
  return typeof v === 'string' && REVIEW_FLAGS.some((f) => f.id === v);
}

/** A list of flags once each, in REVIEW_FLAGS order; words that are no flag are dropped. */
export function orderedReviewFlags(flags: readonly unknown[] | undefined | null): ReviewFlag[] {
  if (!Array.isArray(flags)) return [];
  return REVIEW_FLAGS.map((f) => f.id).filter((id) => flags.includes(id));
}

/** A reviewer's decision on one spectrum; the automatic solution stays in the FitResult. */
export interface ReviewDecision {
  file: string;
  state: ReviewState;
  /** Final redshift (null when rejected). */
  z: number | null;
  zErr: number | null;
  class: SpectrumClass;
  reviewerGrade: Grade | null;
  howSet: HowSet;
  reviewer: string;
  /** ISO 8601 time of the decision. */
  decidedAt: string;
  note: string;
  /**
   * When set through a line identification (how_set line, or a refit started
   * there): which catalogue line, at which observed vacuum wavelength (Angstrom).
   */
  lineId?: { id: string; observedA: number };
  /**
   * Review flags, each once, in REVIEW_FLAGS order. Absent means none
   * (decisions stored before flags were part of the decision, and unflagged ones).
   */
  flags?: ReviewFlag[];
  /**
   * Quasar physics the review box measured at this decision's z, kept so
   * exports carry the physics at a z the reviewer changed; absent otherwise.
   */
  quasar?: QuasarMeasurement;
}

/** Lambda-CDM parameters; H0 in km/s/Mpc. omegaLambda = 1 - omegaM - omegaK - omegaR. */
export interface CosmologyParams {
  h0: number;
  omegaM: number;
  /** Curvature density today (0 = flat). */
  omegaK: number;
  /** Radiation density today (0 = ignore radiation). */
  omegaR: number;
}
