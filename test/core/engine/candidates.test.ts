import { describe, expect, it } from 'vitest';
import { localMinima, mergeDistinct, orderCandidates, type RefinedCandidate } from '../../../src/core/engine/candidates';
import { templateFamilies } from '../../../src/core/engine/templates';

const fam = (id: string) => templateFamilies().find((f) => f.id === id)!;

function cand(family: string, z: number, chi2: number, atEdge = false): RefinedCandidate {
  return { family: fam(family), shift: 0, z, zErr: 1e-4, chi2, dof: 100, atEdge, fit: { shift: 0, chi2, dof: 100, x: new Float64Array(0), active: [] } };
}

describe('localMinima(y, minSep, maxCount, from, to)', () => {
  it('finds interior and end minima, best first, separated by more than minSep', () => {
    const y = Float64Array.from([1, 2, 3, 0.5, 3, 0.6, 4, 5, 0.2]);
    // minima at 0 (end), 3, 5, 8 (end); 5 is within 2 of 3 and worse -> dropped
    expect(localMinima(y, 2, 10)).toEqual([8, 3, 0]);
    expect(localMinima(y, 2, 2)).toEqual([8, 3]);
    // restricted to 2..6: minima 3 and 5 (5 kept with minSep 1)
    expect(localMinima(y, 1, 10, 2, 6)).toEqual([3, 5]);
  });
});

describe('mergeDistinct and orderCandidates', () => {
  it('drops a solution within the distinct velocity of a better one, across families', () => {
    // 0.5000 vs 0.5010 is ~200 km/s apart (c ln(1.501/1.5)): the same solution (Bolton et al. 2012 use > 1000 km/s)
    const m = mergeDistinct([cand('galaxy-sf', 0.5, 100), cand('galaxy-passive', 0.501, 120), cand('galaxy-sf', 0.9, 130)]);
    expect(m.map((c) => c.z)).toEqual([0.5, 0.9]);
  });

  it('refuses an edge minimum as best when a non-edge minimum exists', () => {
    const ordered = orderCandidates(mergeDistinct([cand('star', 0.00333, 50, true), cand('galaxy-sf', 0.3, 80)]));
    expect(ordered[0].z).toBe(0.3);
    expect(ordered[1].atEdge).toBe(true);
  });

  it('keeps an edge minimum as best when nothing else exists', () => {
    const ordered = orderCandidates([cand('qso', 6.5, 50, true)]);
    expect(ordered[0].z).toBe(6.5);
  });

  it('an edge minimum does not hide a proper minimum close to it', () => {
    // galaxy at the z = 0 edge and a star at +30 km/s: the star must survive
    const m = orderCandidates(mergeDistinct([cand('galaxy-passive', 0, 10, true), cand('star', 0.0001, 20)]));
    expect(m[0].family.id).toBe('star');
  });
});
