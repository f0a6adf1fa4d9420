/**
 * Table cells of the physics columns for one row: the fit's quasar
 * measurement turned into quantities for the export's cosmology, at the z the
 * row's derived quantities use. A measurement made at another z (the
 * reviewer changed it) is not reused: the cells stay empty and the note says
 * so, unless the decision carries its own measurement at its z
 * (withDecisionPhysics), which then takes the fit's place.
 */
import type { CosmologyParams, FitResult, ReviewDecision, SpectrumClass } from '../types';
import { quasarQuantities } from './quantities';
import type { BroadLineId } from './regions';

type Cell = string | number | undefined;

const LINE_KEYS: readonly [BroadLineId, string][] = [
  ['CIV', 'civ'],
  ['MgII', 'mgii'],
  ['Hbeta', 'hbeta'],
  ['Halpha', 'halpha'],
];

/** Same z within this (a refit moves z by far more). */
const SAME_Z = 1e-6;

/** The fit as an export row for this decision should see it: the decision's measurement, made at the decision's z, in place of the fit's. */
export function withDecisionPhysics(result: FitResult, decision: ReviewDecision | undefined): FitResult {
  const m = decision?.quasar;
  if (!m || result.status !== 'ok' || decision.z === null || Math.abs(m.z - decision.z) > SAME_Z) return result;
  return { ...result, quasar: m };
}

/** The decision with the measurement `m` attached when m was made at its z for a quasar, and without a stale one otherwise. */
export function decisionWithPhysics(decision: ReviewDecision, m: FitResult['quasar'] | undefined): ReviewDecision {
  const fits = m && decision.class === 'qso' && decision.z !== null && Math.abs(m.z - decision.z) <= SAME_Z;
  if (fits) return { ...decision, quasar: m };
  if (!decision.quasar) return decision;
  const { quasar: _stale, ...rest } = decision;
  return rest;
}

/**
 * Cells by column name, or only a note. `z` and `cls` are what the row's
 * derived quantities use (null when none apply).
 */
export function physicsCells(result: FitResult, z: number | null | undefined, cls: SpectrumClass, cosmo: CosmologyParams): Record<string, Cell> {
  if (z === null || z === undefined || cls !== 'qso') return { qso_phys_note: '' };
  const m = result.quasar;
  if (!m) return { qso_phys_note: result.class === 'qso' ? 'not measured (fitted before quasar physics existed)' : 'not measured: the automatic fit was not a quasar; open it in review to measure' };
  if (Math.abs(m.z - z) > SAME_Z) return { qso_phys_note: `measured at z = ${m.z.toFixed(5)}, not at this row's z; open it in review to measure again` };
  const q = quasarQuantities(m, cosmo);
  const v: Record<string, Cell> = { qso_phys_z: m.z, qso_phys_draws: m.draws };
  const notes: string[] = [];
  if (!m.fluxScale.ok) notes.push(`no luminosities: ${m.fluxScale.reason}`);
  for (const a of [1350, 3000, 5100] as const) {
    const L = q.logLambdaL[a];
    if ('value' in L) {
      v[`loglam${a}`] = L.value;
      v[`loglam${a}_err`] = L.err;
    }
  }
  for (const [id, key] of LINE_KEYS) {
    const l = m.lines.find((x) => x.id === id);
    if (l?.ok) {
      v[`fwhm_${key}_kms`] = l.fwhmKms;
      v[`fwhm_${key}_err_kms`] = l.fwhmErrKms;
      v[`sigma_${key}_kms`] = l.sigmaKms;
      v[`sigma_${key}_err_kms`] = l.sigmaErrKms;
    }
  }
  for (const e of q.masses) {
    v[`log_mbh_${e.id}`] = e.logM;
    v[`log_mbh_${e.id}_err`] = e.logMErr;
  }
  if (q.preferred) {
    v.log_mbh = q.preferred.logM;
    v.log_mbh_err = q.preferred.logMErr;
    v.log_mbh_sys_dex = q.preferred.sysDex;
    v.log_mbh_from = q.preferred.id;
  } else if (m.fluxScale.ok) notes.push(`no mass: ${q.massReason}`);
  if (q.logLbol) {
    v.log_lbol = q.logLbol.value;
    v.log_lbol_err = q.logLbol.err;
  }
  if (q.logEddRatio) {
    v.log_edd_ratio = q.logEddRatio.value;
    v.log_edd_ratio_err = q.logEddRatio.err;
  }
  if (m.absorption.ok) {
    v.bi_civ_kms = m.absorption.biKms;
    v.bi_civ_err_kms = m.absorption.biErrKms;
    v.ai_civ_kms = m.absorption.aiKms;
    v.ai_civ_err_kms = m.absorption.aiErrKms;
    v.n_civ_troughs = m.absorption.troughs.length;
  } else notes.push(`no absorption indices: ${m.absorption.reason}`);
  v.qso_phys_note = notes.join('; ');
  return v;
}
