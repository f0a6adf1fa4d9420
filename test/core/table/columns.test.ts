import { describe, expect, it } from 'vitest';
import { AUTOMATIC_COLUMNS, CATALOGUE_COLUMNS, columnByName } from '../../../src/core/table/columns';

// The column contract in DESIGN.md ("Contracts other parts rely on") and the task brief; issue 10 adds the named line and the review flags.
const REQUIRED = [
  'file', 'object_id', 'ra_deg', 'dec_deg', 'z', 'z_err', 'class', 'confidence', 'score', 'chi2_gap', 'n_features',
  'runner_up_z', 'runner_up_class', 'runner_up_delta_chi2', 'noise_estimated', 'n_pix', 'lambda_min_a', 'lambda_max_a',
  'error', 'final_z', 'final_z_err', 'final_class', 'review_state', 'how_set', 'line_id', 'line_observed_a', 'reviewer_grade', 'reviewer',
  'reviewed_at', 'note', 'review_flags', 'lookback_gyr', 'age_gyr', 'lum_dist_mpc', 'dist_mod_mag', 'ang_diam_dist_mpc', 'kpc_per_arcsec',
];

describe('CATALOGUE_COLUMNS', () => {
  it('holds every required column once, in the agreed order', () => {
    const names = CATALOGUE_COLUMNS.map((c) => c.name);
    expect(new Set(names).size).toBe(names.length);
    const present = names.filter((n) => REQUIRED.includes(n));
    expect(present).toEqual(REQUIRED);
  });
  it('gives every column a description, and every float a number of decimals', () => {
    for (const c of CATALOGUE_COLUMNS) {
      expect(c.description.length).toBeGreaterThan(5);
      if (c.type === 'float') expect(Number.isInteger(c.decimals)).toBe(true);
    }
  });
  it('writes z to 6 decimals and units where the name promises one', () => {
    expect(columnByName('z')?.decimals).toBe(6);
    expect(columnByName('ra_deg')?.unit).toBe('deg');
    expect(columnByName('lambda_min_a')?.unit).toBe('Angstrom');
    expect(columnByName('lum_dist_mpc')?.unit).toBe('Mpc');
    expect(columnByName('age_gyr')?.unit).toBe('Gyr');
    expect(columnByName('dist_mod_mag')?.unit).toBe('mag');
    expect(columnByName('nope')).toBeUndefined();
  });
});

describe('AUTOMATIC_COLUMNS', () => {
  it('is the catalogue without the review columns, same order, starting file, ..., ending with the quasar physics', () => {
    expect(AUTOMATIC_COLUMNS.some((c) => c.group === 'review')).toBe(false);
    expect(AUTOMATIC_COLUMNS.map((c) => c.name)).toEqual(CATALOGUE_COLUMNS.filter((c) => c.group !== 'review').map((c) => c.name));
    expect(AUTOMATIC_COLUMNS[0].name).toBe('file');
    expect(AUTOMATIC_COLUMNS.at(-1)?.name).toBe('n_civ_troughs');
  });
});
