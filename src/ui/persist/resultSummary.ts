/**
 * The few numbers of a FitResult the list needs. Summaries for every file
 * stay in memory; the full result (curves, candidates, lines) is read from
 * IndexedDB only for the spectrum on screen.
 */
import type { FitResult, FitStatus, Grade, SpectrumClass } from '../../core/types';

export interface ResultSummary {
  status: FitStatus;
  error?: string;
  /** Automatic redshift (NaN when failed). */
  z: number;
  zErr: number;
  class: SpectrumClass;
  confidence: Grade;
  /** Machine score, 0..1. */
  score: number;
  nPix: number;
  lambdaMinA: number;
  lambdaMaxA: number;
  objectId?: string;
  nCandidates: number;
  /** Median S/N per pixel of the input (absent in summaries stored by older versions). */
  medianSnr?: number;
}

export function summarise(result: FitResult): ResultSummary {
  const s: ResultSummary = {
    status: result.status,
    z: result.z,
    zErr: result.zErr,
    class: result.class,
    confidence: result.confidence,
    score: result.score,
    nPix: result.input.nPix,
    lambdaMinA: result.input.lambdaMinA,
    lambdaMaxA: result.input.lambdaMaxA,
    nCandidates: result.candidates.length,
  };
  if (Number.isFinite(result.input.medianSnr)) s.medianSnr = result.input.medianSnr;
  if (result.error !== undefined) s.error = result.error;
  if (result.input.meta.objectId !== undefined) s.objectId = result.input.meta.objectId;
  return s;
}
