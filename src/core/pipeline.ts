/**
 * File bytes -> FitResult: the one path every caller (browser worker, CLI
 * worker_threads, tests) takes, so that a fit in the browser and the same fit
 * from the command line give identical rows.
 */
import { SpectrumReadError, type FitResult, type Spectrum, type FitStatus } from './types';
import { readSpectrum } from './io/readSpectrum';
import { fitSpectrum, type FitOptions, TEMPLATE_SET_ID, ENGINE_VERSION } from './engine';

/** A FitResult for a file that could not be read or fitted. */
export function failedResult(file: string, message: string, status: FitStatus = 'failed'): FitResult {
  return {
    file,
    status,
    error: oneLine(message),
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

function oneLine(s: string): string {
  return s.replace(/[\r\n]+/g, ' ').trim();
}

/** Read then fit; never throws. `file` is the name as the user gave it. */
export function fitBytes(bytes: Uint8Array, file: string, options?: FitOptions): FitResult {
  let spectrum: Spectrum;
  try {
    spectrum = readSpectrum(bytes, file);
  } catch (e) {
    const msg = e instanceof SpectrumReadError ? e.message : `${file}: internal reader error: ${(e as Error)?.message ?? e}`;
    return failedResult(file, msg);
  }
  try {
    return fitSpectrum(spectrum, options);
  } catch (e) {
    return failedResult(file, `${file}: internal fitting error: ${(e as Error)?.message ?? e}`);
  }
}
