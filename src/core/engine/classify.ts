/**
 * How candidates of different families are compared: the family with more
 * freedom must not win for having it. Each candidate's full-model chi2 is
 * put on the scale of the best fit's reduced chi2 (template mismatch
 * inflates every chi2 of a bright spectrum alike), then charged ln(n) per
 * free parameter: the Bayesian information criterion (Schwarz 1978, Ann.
 * Stat. 6, 461), an approximation to the evidence of each family that needs
 * no tuning.
 */

export interface Comparable {
  chi2: number;
  nParams: number;
}

/** The divisor that puts chi2 on a reduced-chi2-of-1 scale: max(1, best chi2 / dof). */
export function chi2Scale(best: Comparable, nGood: number): number {
  const dof = Math.max(1, nGood - best.nParams);
  return Math.max(1, best.chi2 / dof);
}

/** The number every candidate is ranked by (smaller is better). */
export function rankingScore(c: Comparable, scale: number, nGood: number): number {
  return c.chi2 / scale + c.nParams * Math.log(Math.max(2, nGood));
}
