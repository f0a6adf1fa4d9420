/**
 * Hand-made FitResults and ReviewDecisions in an invented scenario (field
 * "Lantern Deep", object ids LD-xxxx); no real data.
 */
import type { Candidate, FitResult, ReviewDecision } from '../../../src/core/types';
import { DEFAULT_COSMOLOGY } from '../../../src/core/cosmology';
import type { ExportMeta } from '../../../src/core/table';
import { failedResult as pipelineFailedResult } from '../../../src/core/failedResult';

function candidate(z: number, cls: Candidate['class'], family: string, chi2: number, best: number): Candidate {
  return { z, zErr: 0.00031, family, class: cls, chi2, dof: 3800, deltaChi2: chi2 - best, atEdge: false };
}

export function okResult(over: Partial<FitResult> = {}): FitResult {
  const best = 4012.5;
  return {
    file: 'night2/ld-0042.fits',
    status: 'ok',
    candidates: [candidate(2.345678912, 'qso', 'qso', best, best), candidate(0.987654, 'galaxy', 'galaxy-sf', best + 187.25, best)],
    z: 2.345678912,
    zErr: 0.000412345,
    class: 'qso',
    score: 0.987654,
    confidence: 'high',
    chi2Gap: 187.25,
    nFeatures: 4,
    curves: [],
    lines: [],
    noiseEstimated: false,
    templateSet: 'lantern-templates-1',
    engineVersion: '0.1.0',
    input: {
      nPix: 3900,
      lambdaMinA: 3600.123456,
      lambdaMaxA: 9200.5,
      medianSnr: 8.2,
      meta: { objectId: 'LD-0042', raDeg: 150.123456789, decDeg: -2.5 },
      format: 'fits-table',
    },
    ...over,
  };
}

/** The shape the pipeline gives an unreadable file (src/core/failedResult.ts), with this fixture set's provenance. */
export function failedResult(file = 'night2/ld-0099.fits', error = 'night2/ld-0099.fits (HDU 1): NAXIS1 claims 2147483648 pixels'): FitResult {
  return { ...pipelineFailedResult(file, error), templateSet: 'lantern-templates-1', engineVersion: '0.1.0' };
}

export function decision(over: Partial<ReviewDecision> = {}): ReviewDecision {
  return {
    file: 'night2/ld-0042.fits',
    state: 'changed',
    z: 0.987654,
    zErr: 0.0003,
    class: 'galaxy',
    reviewerGrade: 'medium',
    howSet: 'candidate',
    reviewer: 'reviewer-a',
    decidedAt: '2026-03-04T05:06:07Z',
    note: 'second solution fits [O II] and H-beta',
    ...over,
  };
}

export const META: ExportMeta = {
  software: 'Shiftmark',
  version: '0.1.0',
  templateSet: 'lantern-templates-1',
  cosmology: DEFAULT_COSMOLOGY,
  createdAt: '2026-03-05T10:00:00Z',
};
