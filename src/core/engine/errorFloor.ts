/**
 * Systematic floors added in quadrature to the statistical (curvature) z
 * error, so that quoted errors are honest:
 *
 * - Quasars: broad-line peaks are shifted from systemic by amounts that vary
 *   from object to object; no template removes that. After mean-shift
 *   corrections the intrinsic scatter is 56 km/s for [O III] 5008, 205 for
 *   Mg II, 233 for C III], 400 for broad H-beta, 415 for C IV (Shen et al.
 *   2016, ApJ 831, 7; docs/reference.md sec. 6). The floor is the smallest of
 *   these among the lines inside the data at the solution ([O III] only when
 *   the narrow-line vector is in use); Ly-alpha alone takes the C IV value.
 * - Galaxies: GALAXY_FLOOR_KMS; stars: STAR_FLOOR_KMS. Template mismatch
 *   (Kinney-Calzetti zero points known to ~1 A, Pickles at R ~ 500, fixed line
 *   ratios) that the curvature does not know about. Set by
 *   scripts/calibrate-confidence.ts so that the median |dz|/z_err over the
 *   three sources pooled is 0.674, the Gaussian value.
 * The resampling onto the log grid needs no factor of its own on the
 * simulations (already on the grid); for coarser-pixel inputs the reduced
 * chi-square scaling partly covers it. Not verified on real spectra.
 */
import { C_KMS } from './logGrid';
import type { ScoredCandidate } from './candidates';

/** Shen et al. 2016 intrinsic line-shift scatter, km/s, with rest wavelengths (docs/reference.md sec. 1). */
export const QSO_LINE_FLOORS: readonly { id: string; restA: number; kms: number }[] = [
  { id: 'OIII_5008', restA: 5008.24, kms: 56 },
  { id: 'MgII', restA: 2798.75, kms: 205 },
  { id: 'CIII', restA: 1908.73, kms: 233 },
  { id: 'Hbeta', restA: 4862.68, kms: 400 },
  { id: 'CIV', restA: 1549.06, kms: 415 },
  { id: 'LyA', restA: 1215.67, kms: 415 },
];

export const GALAXY_FLOOR_KMS = 21;
export const STAR_FLOOR_KMS = 35;

/** Floor in km/s for a solution whose data span lambdaMinA..lambdaMaxA (observed, Angstrom). */
export function floorKms(c: ScoredCandidate, lambdaMinA: number, lambdaMaxA: number): number {
  if (c.family.class === 'galaxy') return GALAXY_FLOOR_KMS;
  if (c.family.class === 'star') return STAR_FLOOR_KMS;
  if (c.family.class !== 'qso') return 0;
  let best = Infinity;
  for (const l of QSO_LINE_FLOORS) {
    const obs = l.restA * (1 + c.z);
    if (obs > lambdaMinA && obs < lambdaMaxA) best = Math.min(best, l.kms);
  }
  return Number.isFinite(best) ? best : 415;
}

/** The candidate with its floor added in quadrature to zErr (dz = (1 + z) v / c). */
export function withFloor(c: ScoredCandidate, lambdaMinA: number, lambdaMaxA: number): ScoredCandidate {
  const f = ((1 + c.z) * floorKms(c, lambdaMinA, lambdaMaxA)) / C_KMS;
  return f > 0 ? { ...c, zErr: Math.hypot(c.zErr, f) } : c;
}
