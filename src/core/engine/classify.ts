/**
 * How candidates of different families are compared: the family with more
 * freedom must not win for having it. Each candidate's full-model chi2 is
 * put on the scale of the best fit's reduced chi2 (template mismatch
 * inflates every chi2 of a bright spectrum alike), then charged ln(n) per
 * free parameter: the Bayesian information criterion (Schwarz 1978, Ann.
 * Stat. 6, 461), an approximation to the evidence of each family that needs
 * no tuning. An eigenspectrum family is charged its library's effective
 * dimension (templates/build/recipes.ts, eigenDims), not its vector count:
 * a stellar library needs many eigenspectra for detail, but stars vary in
 * few ways, and charging every one made stars lose to galaxies at low S/N.
 */
import type { Family } from './family';
import type { ModelFit } from './model';

/** Parameters charged for a fit of a family: eigenspectra in use (at most eigenDims), other amplitudes in use, and the polynomial terms. */
export function chargedParams(f: Family, fit: ModelFit): number {
  let eig = 0;
  let other = 0;
  for (let j = 0; j < fit.amplitudes.length; j++) {
    if (fit.amplitudes[j] === 0) continue;
    if (f.eigen[j]) eig++;
    else other++;
  }
  const poly = fit.nParams - eig - other;
  return Math.min(eig, f.eigenDims) + other + Math.max(0, poly);
}

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
