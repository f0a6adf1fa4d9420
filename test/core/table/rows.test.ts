import { describe, expect, it } from 'vitest';
import { automaticRow, catalogueRow } from '../../../src/core/table/rows';
import { AUTOMATIC_COLUMNS, CATALOGUE_COLUMNS } from '../../../src/core/table/columns';
import { derivedQuantities, DEFAULT_COSMOLOGY } from '../../../src/core/cosmology';
import { decision, failedResult, okResult } from './fixtures';

const COSMO = DEFAULT_COSMOLOGY;

describe('automaticRow(result, cosmo)', () => {
  it('has exactly the automatic columns, formatted with fixed decimals', () => {
    const row = automaticRow(okResult(), COSMO);
    expect(Object.keys(row)).toEqual(AUTOMATIC_COLUMNS.map((c) => c.name));
    expect(row.file).toBe('night2/ld-0042.fits');
    expect(row.object_id).toBe('LD-0042');
    expect(row.ra_deg).toBe('150.1234568');
    expect(row.dec_deg).toBe('-2.5000000');
    expect(row.z).toBe('2.345679');
    expect(row.z_err).toBe('0.000412');
    expect(row.class).toBe('qso');
    expect(row.confidence).toBe('high');
    expect(row.score).toBe('0.9877');
    expect(row.chi2_gap).toBe('187.250');
    expect(row.n_features).toBe('4');
    expect(row.runner_up_z).toBe('0.987654');
    expect(row.runner_up_class).toBe('galaxy');
    expect(row.runner_up_delta_chi2).toBe('187.250');
    expect(row.noise_estimated).toBe('false');
    expect(row.n_pix).toBe('3900');
    expect(row.lambda_min_a).toBe('3600.123');
    expect(row.lambda_max_a).toBe('9200.500');
    expect(row.error).toBe('');
  });
  it('derives quantities at the automatic z with the given cosmology', () => {
    const row = automaticRow(okResult(), COSMO);
    const d = derivedQuantities(2.345678912, COSMO);
    expect(row.derived_from).toBe('auto');
    expect(row.lum_dist_mpc).toBe(d.luminosityDistanceMpc.toFixed(2));
    expect(row.age_gyr).toBe(d.ageGyr.toFixed(4));
    expect(row.lookback_gyr).toBe(d.lookbackTimeGyr.toFixed(4));
    expect(row.dist_mod_mag).toBe(d.distanceModulusMag.toFixed(4));
    expect(row.ang_diam_dist_mpc).toBe(d.angularDiameterDistanceMpc.toFixed(2));
    expect(row.kpc_per_arcsec).toBe(d.kpcPerArcsec.toFixed(4));
  });
  it('matches reference case A (astropy [C], docs/reference.md sec. 4) at z = 1: D_L 6607.66 Mpc, age 5.7516 Gyr', () => {
    const row = automaticRow(okResult({ z: 1, class: 'galaxy' }), COSMO);
    expect(row.lum_dist_mpc).toBe('6607.66');
    expect(row.age_gyr).toBe('5.7516');
    expect(row.dist_mod_mag).toBe('44.1002');
  });
  it('writes empty cells for a missing runner-up and an infinite chi-square gap', () => {
    const r = okResult({ chi2Gap: Infinity });
    r.candidates = r.candidates.slice(0, 1);
    const row = automaticRow(r, COSMO);
    expect(row.chi2_gap).toBe('');
    expect(row.runner_up_z).toBe('');
    expect(row.runner_up_class).toBe('');
    expect(row.runner_up_delta_chi2).toBe('');
  });
  it('leaves derived quantities empty for a star and for a negative z', () => {
    for (const r of [okResult({ class: 'star', z: 0.0001 }), okResult({ class: 'galaxy', z: -0.0002 })]) {
      const row = automaticRow(r, COSMO);
      expect(row.derived_from).toBe('');
      expect(row.lum_dist_mpc).toBe('');
      expect(row.age_gyr).toBe('');
      expect(row.z).not.toBe(''); // the measured z itself stays
    }
  });
  it('keeps a negative z a plain number', () => {
    expect(automaticRow(okResult({ class: 'star', z: -0.000123 }), COSMO).z).toBe('-0.000123');
  });
  it('at z = 0 writes distances 0 and an empty distance modulus (D_L = 0)', () => {
    const row = automaticRow(okResult({ z: 0, class: 'galaxy' }), COSMO);
    expect(row.lum_dist_mpc).toBe('0.00');
    expect(row.dist_mod_mag).toBe('');
  });
  it('a failed result carries its error and leaves every number empty', () => {
    const row = automaticRow(failedResult(), COSMO);
    expect(row.file).toBe('night2/ld-0099.fits');
    expect(row.error).toBe('night2/ld-0099.fits (HDU 1): NAXIS1 claims 2147483648 pixels');
    for (const c of AUTOMATIC_COLUMNS) {
      if (c.type !== 'text') expect(row[c.name], c.name).toBe('');
    }
    expect(row.derived_from).toBe('');
  });
  it('a failed result without a message still gets a one-line reason; line breaks are flattened', () => {
    expect(automaticRow({ ...failedResult(), status: 'timeout', error: undefined }, COSMO).error).toBe('fit timeout');
    expect(automaticRow(failedResult('a.fits', 'first\r\nsecond'), COSMO).error).toBe('first second');
  });
  it('keeps header facts of a spectrum that was read but whose fit failed', () => {
    const r = { ...okResult(), status: 'failed' as const, error: 'a.fits: internal fitting error: x' };
    const row = automaticRow(r, COSMO);
    expect(row.n_pix).toBe('3900');
    expect(row.ra_deg).toBe('150.1234568');
    expect(row.z).toBe('');
    expect(row.score).toBe('');
  });
  it('is deterministic: the same inputs give the same bytes', () => {
    expect(JSON.stringify(automaticRow(okResult(), COSMO))).toBe(JSON.stringify(automaticRow(okResult(), COSMO)));
  });
  it('refuses an unphysical cosmology', () => {
    expect(() => automaticRow(okResult(), { ...COSMO, h0: 0 })).toThrow(/H0/);
  });
});

describe('catalogueRow(result, decision, cosmo)', () => {
  it('has every catalogue column; unreviewed rows have empty final columns and derive from the automatic z', () => {
    const row = catalogueRow(okResult(), undefined, COSMO);
    expect(Object.keys(row)).toEqual(CATALOGUE_COLUMNS.map((c) => c.name));
    expect(row.review_state).toBe('unreviewed');
    expect(row.final_z).toBe('');
    expect(row.final_class).toBe('');
    expect(row.derived_from).toBe('auto');
    expect(row.lum_dist_mpc).toBe(automaticRow(okResult(), COSMO).lum_dist_mpc);
  });
  it('a changed decision fills the final columns and derives from the final z', () => {
    const row = catalogueRow(okResult(), decision(), COSMO);
    expect(row.z).toBe('2.345679'); // the automatic solution stays
    expect(row.final_z).toBe('0.987654');
    expect(row.final_z_err).toBe('0.000300');
    expect(row.final_class).toBe('galaxy');
    expect(row.review_state).toBe('changed');
    expect(row.how_set).toBe('candidate');
    expect(row.reviewer_grade).toBe('medium');
    expect(row.reviewer).toBe('reviewer-a');
    expect(row.reviewed_at).toBe('2026-03-04T05:06:07Z');
    expect(row.note).toBe('second solution fits [O II] and H-beta');
    expect(row.derived_from).toBe('final');
    expect(row.lum_dist_mpc).toBe(derivedQuantities(0.987654, COSMO).luminosityDistanceMpc.toFixed(2));
  });
  it('a rejected decision leaves final_z and the derived quantities empty', () => {
    const row = catalogueRow(okResult(), decision({ state: 'rejected', z: null, zErr: null, class: 'unknown', reviewerGrade: null }), COSMO);
    expect(row.review_state).toBe('rejected');
    expect(row.final_z).toBe('');
    expect(row.reviewer_grade).toBe('');
    expect(row.derived_from).toBe('');
    expect(row.age_gyr).toBe('');
  });
  it('an accepted star gets no derived quantities', () => {
    const row = catalogueRow(okResult(), decision({ state: 'accepted', z: 0.0001, class: 'star' }), COSMO);
    expect(row.final_z).toBe('0.000100');
    expect(row.derived_from).toBe('');
  });
  it('a failed result with no decision keeps its error and empty numbers', () => {
    const row = catalogueRow(failedResult(), undefined, COSMO);
    expect(row.error).not.toBe('');
    expect(row.z).toBe('');
    expect(row.derived_from).toBe('');
    expect(row.review_state).toBe('unreviewed');
  });
  it('refuses a decision that belongs to another file', () => {
    expect(() => catalogueRow(okResult(), decision({ file: 'other.fits' }), COSMO)).toThrow(/paired with/);
  });
  it('agrees with automaticRow on every automatic and derived column while unreviewed', () => {
    const auto = automaticRow(okResult(), COSMO);
    const full = catalogueRow(okResult(), undefined, COSMO);
    for (const c of AUTOMATIC_COLUMNS) expect(full[c.name], c.name).toBe(auto[c.name]);
  });
});
