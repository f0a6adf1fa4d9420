import { describe, expect, it } from 'vitest';
import { floorKms, withFloor, SF_GALAXY_FLOOR_KMS } from '../../../src/core/engine/errorFloor';
import type { RefinedCandidate } from '../../../src/core/engine/candidates';
import { templateFamilies } from '../../../src/core/engine/templates';
import { C_KMS } from '../../../src/core/engine/logGrid';

const fam = (id: string) => templateFamilies().find((f) => f.id === id)!;
function cand(id: string, z: number, narrowAmp = 0): RefinedCandidate {
  const f = fam(id);
  const x = new Float64Array(3 + f.vectors.length);
  const k = f.vectors.findIndex((v) => v.id === 'narrow');
  if (k >= 0) x[3 + k] = narrowAmp;
  return { family: f, shift: 0, z, zErr: 1e-5, chi2: 1, dof: 1, atEdge: false, fit: { shift: 0, chi2: 1, dof: 1, x, active: [] } };
}

describe('systematic z-error floors', () => {
  // Intrinsic line-shift scatter after mean-shift correction, Shen et al. 2016 (ApJ 831, 7): Mg II 205, C III] 233, C IV 415, [O III] 56 km/s.
  it('takes the best quasar line inside 3600-9200 A', () => {
    expect(floorKms(cand('qso', 1.2), 3600, 9200)).toBe(205); // Mg II at 6157 A
    expect(floorKms(cand('qso', 2.8), 3600, 9200)).toBe(233); // C III] at 7253 A, Mg II beyond
    expect(floorKms(cand('qso', 4.5), 3600, 9200)).toBe(415); // C IV at 8520 A only
    expect(floorKms(cand('qso', 0.3), 3600, 9200)).toBe(205); // [O III] in range but no narrow lines fitted
    expect(floorKms(cand('qso', 0.3, 2), 3600, 9200)).toBe(56);
  });

  it('adds in quadrature: dz_floor = (1 + z) v / c', () => {
    expect(floorKms(cand('galaxy-sf', 0.5), 3600, 9200)).toBe(SF_GALAXY_FLOOR_KMS);
    expect(floorKms(cand('star', 0), 3600, 9200)).toBe(0);
    const c = withFloor(cand('qso', 4.5), 3600, 9200);
    expect(c.zErr).toBeCloseTo(Math.hypot(1e-5, (5.5 * 415) / C_KMS), 12);
    expect(withFloor(cand('star', 0), 3600, 9200).zErr).toBe(1e-5);
  });
});
