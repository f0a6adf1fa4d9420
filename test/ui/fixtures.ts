/**
 * Hand-made records for UI tests (no engine involved). Values are invented
 * for the tests; they check that the UI moves data, not science.
 */
import type { Candidate, FitResult, ReviewDecision, Spectrum } from '../../src/core/types';
import { failedResult } from '../../src/core/failedResult';

export function makeCandidate(z: number, cls: Candidate['class'], deltaChi2: number): Candidate {
  return { z, zErr: 0.001, family: cls === 'qso' ? 'qso' : cls === 'star' ? 'star-A' : 'galaxy-sf', class: cls, chi2: 1000 + deltaChi2, dof: 990, deltaChi2, atEdge: false };
}

export function makeResult(file: string, over: Partial<FitResult> = {}): FitResult {
  const candidates = over.candidates ?? [makeCandidate(1.2, 'qso', 0), makeCandidate(0.35, 'galaxy', 40)];
  return {
    file,
    status: 'ok',
    candidates,
    z: candidates[0]?.z ?? NaN,
    zErr: 0.001,
    class: candidates[0]?.class ?? 'unknown',
    score: 0.9,
    confidence: 'high',
    chi2Gap: 40,
    nFeatures: 3,
    curves: [{ family: 'qso', z: new Float64Array([0, 1, 2]), deltaChi2: new Float64Array([50, 0, 60]) }],
    lines: [],
    noiseEstimated: false,
    templateSet: 'test-templates',
    engineVersion: 'test-engine',
    input: { nPix: 3000, lambdaMinA: 3600, lambdaMaxA: 9800, medianSnr: 8, meta: { objectId: `OBJ-${file}` }, format: 'text' },
    ...over,
  };
}

export function makeFailed(file: string, error: string): FitResult {
  return failedResult(file, error);
}

export function makeDecision(file: string, over: Partial<ReviewDecision> = {}): ReviewDecision {
  return {
    file,
    state: 'accepted',
    z: 1.2,
    zErr: 0.001,
    class: 'qso',
    reviewerGrade: 'high',
    howSet: 'auto',
    reviewer: 'Tester',
    decidedAt: '2026-01-02T10:00:00.000Z',
    note: '',
    ...over,
  };
}

export function makeSpectrum(file: string, n = 200): Spectrum {
  const wavelengthA = new Float64Array(n);
  const flux = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    wavelengthA[i] = 4000 + i * 10;
    flux[i] = 1 + (i === 100 ? 5 : 0);
  }
  return { file, format: 'text', wavelengthA, flux, ivar: new Float64Array(n).fill(1), mask: new Uint8Array(n), meta: {} };
}

export function textBytes(s: string): Uint8Array {
  return new TextEncoder().encode(s);
}
