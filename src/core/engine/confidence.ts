/**
 * Machine confidence of an automatic redshift: a calibrated probability
 * that z is right (|dz|/(1+z) < 0.003), and a grade.
 *
 * RULE (copied into the README):
 *   score = 1 / (1 + exp(-(b . [1, ln(1 + gap), min(nFeatures, 4),
 *                              qso, star, ln(1 + medianSnr), ln(1 + snr2)])))
 *   gap: ranking-score difference to the next distinct candidate (classify.ts;
 *   capped at GAP_CAP, Infinity when there is none); nFeatures: independent
 *   detected lines of the line table (features.ts); qso / star: 1 for that
 *   class; medianSnr: the
 *   data's median S/N per pixel; snr2: the S/N of the second strongest
 *   feature, capped at SNR_CAP (a redshift resting on one line is a guess at
 *   its identity). The summed S/N of all features was tried and dropped: it
 *   is collinear with the gap and came out with a negative weight. The score is 0 when the class is unknown and
 *   halved on a range edge.
 *   Grades: high when score >= HIGH_MIN and nFeatures >= HIGH_MIN_FEATURES,
 *   medium >= MEDIUM_MIN, low >= LOW_MIN, else none.
 * The coefficients come from scripts/calibrate-confidence.ts: logistic
 * regression on a mixture of the project's simulator, simulations from
 * published templates held out of the families, and the real spectra of
 * test/data/real-spectra, checked by 5-fold cross-validation on each source
 * (figures in the README's Evaluation section).
 * A reviewer's grade never replaces this one; both are exported.
 */
import type { FitResult, Grade, SpectrumClass } from '../types';

/** [intercept, ...FEATURE_NAMES]: from scripts/calibrate-confidence.ts (see above). */
export const COEFFICIENTS: readonly number[] = [-2.186, 0.962, 0.391, -2.154, 1.711, 0.112, 0.147];
export const FEATURE_NAMES = ['ln(1+gap)', 'min(nFeatures,4)', 'qso', 'star', 'ln(1+medianSnr)', 'ln(1+snr2)'] as const;
export const GAP_CAP = 1e4;
export const SNR_CAP = 50;
/**
 * 0.97: out-of-fold (scripts/calibrate-confidence.ts, seed 11, 1048 fits), a
 * 'high' at 0.97 was wrong (> 0.01) for 2 of 335 on the project simulator
 * (0.6 %), 0 of 228 held-out and 0 of 51 real; at 0.9, 1 of 54 real.
 */
export const HIGH_MIN = 0.97;
export const MEDIUM_MIN = 0.75;
export const LOW_MIN = 0.4;
/** A single line, however strong, can be misidentified: 'high' needs two. */
export const HIGH_MIN_FEATURES = 2;

export interface ConfidenceInput {
  cls: SpectrumClass;
  chi2Gap: number;
  nFeatures: number;
  featureSnrs: number[];
  atEdge: boolean;
  medianSnr: number;
}

/** The inputs of a finished fit. */
export function confidenceInputOf(r: FitResult, featureSnrs: number[]): ConfidenceInput {
  return { cls: r.class, chi2Gap: r.chi2Gap, nFeatures: r.nFeatures, featureSnrs, atEdge: r.candidates[0]?.atEdge ?? false, medianSnr: r.input.medianSnr };
}

/** The regression inputs, in FEATURE_NAMES order. */
export function confidenceFeatures(inp: ConfidenceInput): number[] {
  const gap = Math.min(GAP_CAP, Math.max(0, Number.isFinite(inp.chi2Gap) ? inp.chi2Gap : GAP_CAP));
  const snr = Number.isFinite(inp.medianSnr) ? Math.max(0, inp.medianSnr) : 0;
  const snr2 = [...inp.featureSnrs].sort((a, b) => b - a)[1] ?? 0;
  return [Math.log1p(gap), Math.min(inp.nFeatures, 4), inp.cls === 'qso' ? 1 : 0, inp.cls === 'star' ? 1 : 0, Math.log1p(snr), Math.log1p(Math.min(SNR_CAP, snr2))];
}

/** Logistic score of the regression inputs. */
export function scoreFromFeatures(x: number[]): number {
  let t = COEFFICIENTS[0];
  for (let k = 0; k < x.length; k++) t += COEFFICIENTS[k + 1] * x[k];
  return 1 / (1 + Math.exp(-t));
}

export function confidenceScore(inp: ConfidenceInput): number {
  if (inp.cls === 'unknown') return 0;
  const score = scoreFromFeatures(confidenceFeatures(inp));
  return inp.atEdge ? score / 2 : score;
}

/** Grade of a score; 'high' also needs HIGH_MIN_FEATURES independent features when the inputs are given. */
export function gradeOf(score: number, x?: number[]): Grade {
  if (score >= HIGH_MIN && (!x || x[1] >= HIGH_MIN_FEATURES)) return 'high';
  if (score >= MEDIUM_MIN) return 'medium';
  if (score >= LOW_MIN) return 'low';
  return 'none';
}
