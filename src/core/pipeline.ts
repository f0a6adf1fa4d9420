/**
 * File bytes -> FitResult: the one path every caller (browser worker, CLI
 * worker_threads, tests) takes, so that a fit in the browser and the same fit
 * from the command line give identical rows.
 *
 * A unit of work is one spectrum. A file is first looked at with fitOrSplit:
 * a file of one spectrum is fitted at once (one unit, as before multi-object
 * files were read); a multi-object file answers with the ids of its spectra
 * (`file#n`, see io/readSpectra.ts), and each id is then fitted on its own
 * with fitBytes, so a pool spreads a plate over its workers and a bad row
 * fails alone.
 */
import { SpectrumReadError, type FitResult, type Spectrum } from './types';
import { openSpectraFile, noTargetsError, rowOfId, spectrumId, spectrumOfOpened, type OpenedFile } from './io/readSpectra';
import { fitSpectrum, type FitOptions } from './engine';
import { failedResult } from './failedResult';
import { safeMeasureQuasar } from './physics/attach';

export { failedResult };

/** What looking at a file gives: its fit, or the ids of the spectra it holds. */
export type FileWork = { kind: 'fitted'; result: FitResult } | { kind: 'split'; ids: string[] };

function readFailure(e: unknown, id: string): FitResult {
  const msg = e instanceof SpectrumReadError ? e.message : `${id}: internal reader error: ${(e as Error)?.message ?? e}`;
  return failedResult(id, msg);
}

function fitOpened(opened: OpenedFile, id: string, options?: FitOptions): FitResult {
  let spectrum: Spectrum;
  try {
    spectrum = spectrumOfOpened(opened, id);
  } catch (e) {
    const failed = readFailure(e, id);
    // A bad row still has the object id and position its fibre table gives, so its row says which object failed.
    const index = rowOfId(id)?.index;
    const facts = opened.layout?.rows.find((r) => r.index === index)?.facts;
    if (facts) failed.input.meta = Object.fromEntries(Object.entries(facts).filter(([, v]) => v !== undefined));
    return failed;
  }
  let result: FitResult;
  try {
    result = fitSpectrum(spectrum, options);
  } catch (e) {
    return failedResult(id, `${id}: internal fitting error: ${(e as Error)?.message ?? e}`);
  }
  // Quasars fitted at z > 0 get their physics (core/physics) here, on the spectrum already read,
  // so the browser worker, the CLI thread and in-process callers give one and the same row.
  if (result.status === 'ok' && result.class === 'qso' && result.z > 0) result = { ...result, quasar: safeMeasureQuasar(spectrum, result.z) };
  return result;
}

/**
 * Read then fit the spectrum `id` names (a file's name, or `file#n` for one
 * spectrum of a multi-object file); never throws.
 */
export function fitBytes(bytes: Uint8Array, id: string, options?: FitOptions): FitResult {
  let opened: OpenedFile;
  try {
    opened = openSpectraFile(bytes, id);
  } catch (e) {
    return readFailure(e, id);
  }
  return fitOpened(opened, id, options);
}

/**
 * First look at a file named `file`: a file of one spectrum (or one that
 * cannot be read) is fitted now; a multi-object file gives the ids of its
 * target spectra for fitBytes. Never throws.
 */
export function fitOrSplit(bytes: Uint8Array, file: string, options?: FitOptions): FileWork {
  let opened: OpenedFile;
  try {
    opened = openSpectraFile(bytes, file);
  } catch (e) {
    return { kind: 'fitted', result: readFailure(e, file) };
  }
  const { layout } = opened;
  if (!layout) return { kind: 'fitted', result: fitOpened(opened, file, options) };
  if (layout.rows.length === 0) return { kind: 'fitted', result: readFailure(noTargetsError(file, layout), file) };
  return { kind: 'split', ids: layout.rows.map((r) => spectrumId(file, r.index)) };
}
