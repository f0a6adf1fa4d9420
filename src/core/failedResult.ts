import type { FitResult, FitStatus } from './types';
import { ENGINE_VERSION, TEMPLATE_SET_ID } from './engine/version';

/**
 * A FitResult for a file that could not be read or fitted. Kept apart from the
 * engine so that the page can build one without loading the engine.
 */
export function failedResult(file: string, message: string, status: FitStatus = 'failed'): FitResult {
  return {
    file,
    status,
    error: message.replace(/[\r\n]+/g, ' ').trim(),
    candidates: [],
    z: NaN,
    zErr: NaN,
    class: 'unknown',
    score: 0,
    confidence: 'none',
    chi2Gap: NaN,
    nFeatures: 0,
    curves: [],
    lines: [],
    noiseEstimated: false,
    templateSet: TEMPLATE_SET_ID,
    engineVersion: ENGINE_VERSION,
    input: { nPix: 0, lambdaMinA: NaN, lambdaMaxA: NaN, medianSnr: NaN, meta: {}, format: '' },
  };
}
