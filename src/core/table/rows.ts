/**
 * FitResult (+ ReviewDecision) -> one formatted table row. Every export and
 * the command line build rows here, so a row is byte-identical wherever it is
 * made.
 */
import { orderedReviewFlags, type CosmologyParams, type FitResult, type ReviewDecision, type SpectrumClass } from '../types';
import { derivedQuantities } from '../cosmology';
import { AUTOMATIC_COLUMNS, CATALOGUE_COLUMNS, type ColumnDef, type ColumnName, type TableRow } from './columns';
import { formatCell, type CellValue } from './formatCell';
import { oneLine } from './meta';
import { physicsCells } from '../physics/rowValues';

type Values = Partial<Record<ColumnName, CellValue>>;

function build(columns: readonly ColumnDef[], values: Values): TableRow {
  const row: Record<string, string> = {};
  for (const c of columns) row[c.name] = formatCell(c, values[c.name as ColumnName]);
  return row;
}

function automaticValues(r: FitResult): Values {
  const meta = r.input?.meta ?? {};
  const ok = r.status === 'ok';
  const hasInput = (r.input?.nPix ?? 0) > 0;
  const runnerUp = ok ? r.candidates[1] : undefined;
  // The file name and header facts hold for a failed fit too; fit numbers do not.
  const v: Values = {
    file: r.file,
    object_id: meta.objectId ?? '',
    ra_deg: meta.raDeg,
    dec_deg: meta.decDeg,
    class: r.class,
    confidence: r.confidence,
    n_pix: hasInput ? r.input.nPix : undefined,
    lambda_min_a: hasInput ? r.input.lambdaMinA : undefined,
    lambda_max_a: hasInput ? r.input.lambdaMaxA : undefined,
    error: ok ? '' : oneLine(r.error ?? '') || `fit ${r.status}`,
  };
  if (ok) {
    Object.assign(v, {
      z: r.z,
      z_err: r.zErr,
      score: r.score,
      chi2_gap: r.chi2Gap, // Infinity (no runner-up) formats as empty
      n_features: r.nFeatures,
      runner_up_z: runnerUp?.z,
      runner_up_class: runnerUp?.class ?? '',
      runner_up_delta_chi2: runnerUp?.deltaChi2,
      noise_estimated: r.noiseEstimated,
    } satisfies Values);
  }
  return v;
}

/**
 * Derived quantities at z for the given cosmology, or none: stars (a Doppler
 * shift, not a distance), negative or non-finite z.
 */
function derivedValues(z: number | null | undefined, cls: SpectrumClass, from: 'auto' | 'final', cosmo: CosmologyParams): Values {
  if (z === null || z === undefined || !Number.isFinite(z) || z < 0 || cls === 'star') return { derived_from: '' };
  const d = derivedQuantities(z, cosmo);
  return {
    derived_from: from,
    lookback_gyr: d.lookbackTimeGyr,
    age_gyr: d.ageGyr,
    lum_dist_mpc: d.luminosityDistanceMpc,
    dist_mod_mag: d.distanceModulusMag, // -Infinity at z = 0 formats as empty
    ang_diam_dist_mpc: d.angularDiameterDistanceMpc,
    kpc_per_arcsec: d.kpcPerArcsec,
  };
}

/** The command-line row: automatic columns plus derived quantities at the automatic z. */
export function automaticRow(result: FitResult, cosmo: CosmologyParams): TableRow {
  const auto = automaticValues(result);
  const derived = result.status === 'ok' ? derivedValues(result.z, result.class, 'auto', cosmo) : { derived_from: '' };
  const physics = result.status === 'ok' ? physicsCells(result, result.z, result.class, cosmo) : {};
  return build(AUTOMATIC_COLUMNS, { ...auto, ...derived, ...(physics as Values) });
}

/**
 * The full catalogue row: automatic, review and derived columns. Derived
 * quantities use the reviewer's z when the spectrum was accepted or changed,
 * none when rejected, and the automatic z while unreviewed.
 */
export function catalogueRow(result: FitResult, decision: ReviewDecision | undefined, cosmo: CosmologyParams): TableRow {
  if (decision && decision.file !== result.file) {
    throw new Error(`review decision for '${decision.file}' paired with the fit of '${result.file}'`);
  }
  const auto = automaticValues(result);
  const state = decision?.state ?? 'unreviewed';
  const decided = state === 'accepted' || state === 'changed';
  const review: Values = { review_state: state };
  if (decision) {
    // The named line belongs to a redshift that was kept; flags to any decision made.
    const line = decided && decision.z !== null ? decision.lineId : undefined;
    Object.assign(review, {
      final_z: decided ? decision.z : undefined,
      final_z_err: decided ? decision.zErr : undefined,
      final_class: state === 'unreviewed' ? '' : decision.class,
      how_set: state === 'unreviewed' ? '' : decision.howSet,
      line_id: line?.id ?? '',
      line_observed_a: line?.observedA,
      reviewer_grade: decision.reviewerGrade ?? '',
      reviewer: decision.reviewer,
      reviewed_at: decision.decidedAt,
      note: decision.note,
      review_flags: state === 'unreviewed' ? '' : orderedReviewFlags(decision.flags).join(';'),
    } satisfies Values);
  }
  let derived: Values;
  let physics: Values = {};
  if (decided && decision) {
    derived = derivedValues(decision.z, decision.class, 'final', cosmo);
    physics = physicsCells(result, decision.z, decision.class, cosmo) as Values;
  } else if (state === 'unreviewed' && result.status === 'ok') {
    derived = derivedValues(result.z, result.class, 'auto', cosmo);
    physics = physicsCells(result, result.z, result.class, cosmo) as Values;
  } else derived = { derived_from: '' };
  return build(CATALOGUE_COLUMNS, { ...auto, ...review, ...derived, ...physics });
}
