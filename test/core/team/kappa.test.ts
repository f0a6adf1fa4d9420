import { describe, expect, it } from 'vitest';
import { cohenKappa, confusionTable } from '../../../src/core/team/kappa';

describe("cohenKappa(table): Cohen's (1960) kappa", () => {
  it('matches the published three-class example: kappa 0.4842', () => {
    // Counts and kappa from the SAS/STAT PROC FREQ agreement example printout, as reproduced in
    // statsmodels 0.15.0 (statsmodels/stats/tests/test_inter_rater.py, TestUnweightedCohens:
    // table [[0,4,1],[0,8,0],[0,1,5]], "Kappa 0.4842"). By hand: p_o = 13/19, p_e = 140/361.
    const r = cohenKappa([
      [0, 4, 1],
      [0, 8, 0],
      [0, 1, 5],
    ]);
    expect(r.n).toBe(19);
    expect(r.observed).toBeCloseTo(13 / 19, 12);
    expect(r.expected).toBeCloseTo(140 / 361, 12);
    expect(r.kappa).toBeCloseTo(0.4842, 4);
  });

  it('matches statsmodels cohens_kappa on a 2x2 and a 4x4 table', () => {
    // [C] statsmodels 0.15.0 statsmodels.stats.inter_rater.cohens_kappa(table).kappa, run for these tables.
    // The 2x2 one by hand from the formula: p_o = 35/50 = 0.7, p_e = 0.5*0.6 + 0.5*0.4 = 0.5, kappa = 0.4.
    expect(cohenKappa([[20, 5], [10, 15]]).kappa).toBeCloseTo(0.4, 12);
    const t = [
      [12, 1, 0, 1],
      [2, 9, 1, 0],
      [0, 0, 7, 1],
      [1, 0, 0, 3],
    ];
    expect(cohenKappa(t).kappa).toBeCloseTo(0.7417475728155339, 12);
  });

  it('is 1 for perfect agreement and undefined (NaN) when both raters use one class only', () => {
    // From the definition: p_o = 1 gives 1; p_e = 1 makes the ratio 0/0.
    expect(cohenKappa([[3, 0], [0, 4]]).kappa).toBe(1);
    expect(cohenKappa([[5, 0], [0, 0]]).kappa).toBeNaN();
    expect(cohenKappa([[0, 0], [0, 0]]).n).toBe(0);
  });

  it('refuses a table that is not square or holds a negative count', () => {
    expect(() => cohenKappa([[1, 2]])).toThrow(/square/);
    expect(() => cohenKappa([[1, -1], [0, 1]])).toThrow(/not a count/);
  });
});

describe('confusionTable(pairs, classes)', () => {
  it('counts rater A by row and rater B by column', () => {
    const t = confusionTable(
      [
        ['qso', 'qso'],
        ['qso', 'galaxy'],
        ['star', 'star'],
      ],
      ['qso', 'galaxy', 'star'],
    );
    expect(t).toEqual([
      [1, 1, 0],
      [0, 0, 0],
      [0, 0, 1],
    ]);
    expect(() => confusionTable([['qso', 'blob']], ['qso', 'galaxy'])).toThrow(/blob/);
  });
});
