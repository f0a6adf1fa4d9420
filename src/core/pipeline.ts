/**
 * File bytes -> FitResult: the one path every caller (browser worker, CLI
 * worker_threads, tests) takes, so that a fit in the browser and the same fit
 * from the command line give identical rows.
 */
import { SpectrumReadError, type FitResult, type Spectrum } from './types';
import { readSpectrum } from './io/readSpectrum';
import { fitSpectrum, type FitOptions } from './engine';
import { failedResult } from './failedResult';

export { failedResult };

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
