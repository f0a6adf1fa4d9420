import { describe, expect, it } from 'vitest';
import { floorKms, withFloor, GALAXY_FLOOR_KMS, STAR_FLOOR_KMS } from '../../../src/core/engine/errorFloor';
import type { ScoredCandidate } from '../../../src/core/engine/candidates';
import { engineFamilies } from '../../../src/core/engine';

const fam = (id: string) => engineFamilies().find((f) => f.id === id)!;
const cand = (id: string, z: number, zErr: number) => ({ family: fam(id), z, zErr }) as unknown as ScoredCandidate;

describe('floorKms / withFloor', () => {
  it('uses the smallest Shen et al. 2016 (ApJ 831, 7) line-shift scatter among quasar lines inside the data (docs/reference.md sec. 6)', () => {
    // z = 1: Mg II 2798.75 -> 5597.5 A inside 3800-9200: 205 km/s (C III] 233, C IV 415 would be larger)
    expect(floorKms(cand('qso', 1, 0), 3800, 9200)).toBe(205);
    // z = 3: Mg II at 11195 A is outside; C III] at 7635 A inside: 233 km/s
    expect(floorKms(cand('qso', 3, 0), 3800, 9200)).toBe(233);
  });
  it('adds the class floor in quadrature: dz = (1 + z) v / c', () => {
    const g = withFloor(cand('galaxy', 0.5, 0), 3800, 9200);
    expect(g.zErr).toBeCloseTo((1.5 * GALAXY_FLOOR_KMS) / 299792.458, 12);
    const s = withFloor(cand('star', 0, 1e-4), 3800, 9200);
    expect(s.zErr).toBeCloseTo(Math.hypot(1e-4, STAR_FLOOR_KMS / 299792.458), 12);
  });
});
