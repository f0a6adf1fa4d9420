/** Conversion of internal candidates to the Candidate contract of types.ts. */
import type { Candidate } from '../types';
import type { RefinedCandidate } from './candidates';

export function candidateToContract(c: RefinedCandidate, bestChi2: number): Candidate {
  return {
    z: c.z,
    zErr: c.zErr,
    family: c.family.id,
    class: c.family.class,
    chi2: c.chi2,
    dof: c.dof,
    deltaChi2: c.chi2 - bestChi2,
    atEdge: c.atEdge,
  };
}
