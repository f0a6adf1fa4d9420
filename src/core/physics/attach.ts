/**
 * The one place a fit gets its quasar measurement: callers (the browser
 * worker, the CLI thread) hand over the file bytes and the fit; quasars that
 * fitted get `measureQuasar` at the automatic z, others are left as they are.
 * Never throws: a failure becomes a measurement that says why.
 */
import type { FitResult, Spectrum } from '../types';
import { readSpectrumById } from '../io/readSpectra';
import { measureQuasar, type MeasureOptions } from './measure';
import type { QuasarMeasurement } from './types';

function failedMeasurement(z: number, reason: string): QuasarMeasurement {
  return { z, fluxScale: { ok: false, reason }, continua: [], lines: [], absorption: { ok: false, reason, troughs: [] }, draws: 0, noiseEstimated: false };
}

/** Measurement of a spectrum at z that never throws (resampling draws only when `o` asks). */
export function safeMeasureQuasar(s: Spectrum, z: number, o: MeasureOptions = {}): QuasarMeasurement {
  try {
    return measureQuasar(s, z, o);
  } catch (e) {
    return failedMeasurement(z, `quasar measurement failed: ${(e as Error)?.message ?? e}`);
  }
}

/** The fit with `quasar` set when it is a quasar fitted at z > 0 (`file` is the spectrum's id: a name, or name#n in a multi-object file). */
export function withQuasarMeasurement(result: FitResult, bytes: Uint8Array, file: string): FitResult {
  if (result.status !== 'ok' || result.class !== 'qso' || !(result.z > 0)) return result;
  let s: Spectrum;
  try {
    s = readSpectrumById(bytes, file);
  } catch {
    return result; // a file this reader refuses was fitted some other way; nothing to measure on here
  }
  return { ...result, quasar: safeMeasureQuasar(s, result.z) };
}
