/**
 * The worker's face: thin calls into src/core, nothing computed here.
 * Parsed spectra are kept in a small LRU cache by file key so that the
 * review loop (refit, name a line, measure lines) never re-reads a file.
 * Typed arrays going back to the page are copies handed over with
 * Comlink.transfer, so the cached originals stay intact.
 */
import { transfer } from 'comlink';
import type { FitResult, LineMeasurement, Spectrum, SpectrumClass } from '../core/types';
import { SpectrumReadError } from '../core/types';
import { fitBytes, fitOrSplit, type FileWork } from '../core/pipeline';
import { readSpectrumById } from '../core/io/readSpectra';
import { FitWorkspace, fitSpectrum, locateFeature, measureLines, refitNear, solutionModel, suggestLines } from '../core/engine';
import { maskRanges } from '../core/physics/maskRanges';

/** This worker's engine workspace: FFT plans and template transforms reused from fit to fit. */
const workspace = new FitWorkspace();
import { LruCache } from './lruCache';
import { safeMeasureQuasar } from '../core/physics/attach';
import type { QuasarMeasurement } from '../core/physics/types';

/** A catalogue line a located feature could be (the engine's own answer type). */
export type LineSuggestion = ReturnType<typeof suggestLines>[number];

/** A spectrum as sent to the page for drawing (same fields as Spectrum). */
export type SpectrumPayload = Spectrum;

/** What `openSpectrum` answers. */
export type OpenAnswer =
  | { kind: 'spectrum'; spectrum: SpectrumPayload }
  | { kind: 'need-bytes' }
  | { kind: 'read-error'; message: string };

/** A feature found near a click, with the catalogue lines it could be, best first. */
export interface FeatureAnswer {
  feature: { centreA: number; centreErrA: number; kind: 'emission' | 'absorption'; snr: number; fwhmA: number } | null;
  suggestions: LineSuggestion[];
}

export interface FitWorkerApi {
  /** Read and fit the spectrum `file` names (a file, or `file#n` of a multi-object file); never throws: failures come back as status 'failed'. */
  fitFile(bytes: Uint8Array, file: string): FitResult;
  /** First look at a file: fitted when it holds one spectrum, else the ids of its spectra (core/pipeline.ts). */
  fitOrSplit(bytes: Uint8Array, file: string): FileWork;
  /** Parse a file for display; without bytes, answers from the cache or asks for them. */
  openSpectrum(key: string, file: string, bytes: Uint8Array | null): OpenAnswer;
  /** Best solution near a redshift the reviewer chose; null when the spectrum is not open. */
  refitNear(key: string, zCentre: number): FitResult | null;
  /** Locate the feature nearest an observed wavelength (Angstrom) and list the lines it could be. */
  nameFeature(key: string, clickA: number): FeatureAnswer | null;
  /** Gaussian line measurements at a redshift and class; null when the spectrum is not open. */
  measureLines(key: string, z: number, cls: SpectrumClass): LineMeasurement[] | null;
  /** Best-fit model flux of a template family at z on the spectrum's own grid (NaN where undefined); null when not open. */
  solutionModel(key: string, z: number, family: string): Float64Array | null;
  /**
   * Quasar physics at z (continuum, broad lines, absorption troughs); null when the spectrum is not open.
   * With `draws` > 0, errors also from that many seeded resampled spectra (each draw refits every region: slow).
   */
  measureQuasar(key: string, z: number, draws?: number): QuasarMeasurement | null;
  /**
   * Quasar physics at z of the spectrum `file` names in `bytes`, read for this call only (not cached, so the
   * review's open spectra stay): for exports of decisions the review box never measured. A file the reader refuses comes back as its message.
   */
  measureQuasarFile(bytes: Uint8Array, file: string, z: number): QuasarMeasurement | { error: string };
  /**
   * Fit again with the observed ranges (Angstrom) masked, e.g. absorption troughs:
   * near zCentre when given, else over the whole range; null when not open.
   */
  refitMasked(key: string, rangesA: [number, number][], zCentre: number | null): FitResult | null;
}

/** Parsed spectra kept per worker (a few MB at most for 20,000-pixel spectra). */
export const SPECTRUM_CACHE_ENTRIES = 8;

/** Buffers of every typed array a FitResult carries, so they move rather than copy. */
export function fitResultBuffers(result: FitResult): ArrayBuffer[] {
  const out: ArrayBuffer[] = [];
  for (const c of result.curves) {
    out.push(c.z.buffer as ArrayBuffer, c.deltaChi2.buffer as ArrayBuffer);
  }
  return out;
}

/**
 * A copy of a cached spectrum with the buffers it owns, to be moved to the
 * page. Comlink looks up the transfer list by the object a call returns, so
 * the list must be attached to the whole answer, not to a part of it.
 */
function copyForTransfer(s: Spectrum): { copy: Spectrum; buffers: ArrayBuffer[] } {
  const copy: Spectrum = {
    file: s.file,
    format: s.format,
    wavelengthA: s.wavelengthA.slice(),
    flux: s.flux.slice(),
    ivar: s.ivar ? s.ivar.slice() : null,
    mask: s.mask.slice(),
    meta: { ...s.meta },
  };
  const buffers = [copy.wavelengthA.buffer, copy.flux.buffer, copy.mask.buffer] as ArrayBuffer[];
  if (copy.ivar) buffers.push(copy.ivar.buffer as ArrayBuffer);
  return { copy, buffers };
}

export function createFitWorkerApi(cacheEntries = SPECTRUM_CACHE_ENTRIES): FitWorkerApi & { cache: LruCache<string, Spectrum> } {
  const cache = new LruCache<string, Spectrum>(cacheEntries);
  return {
    cache,
    fitFile(bytes, file) {
      const result = fitBytes(bytes, file, { workspace }); // quasar physics included (core/pipeline.ts)
      return transfer(result, fitResultBuffers(result));
    },
    fitOrSplit(bytes, file) {
      const work = fitOrSplit(bytes, file, { workspace });
      if (work.kind !== 'fitted') return work;
      return transfer(work, fitResultBuffers(work.result));
    },
    openSpectrum(key, file, bytes) {
      let spectrum = cache.get(key);
      if (!spectrum) {
        if (!bytes) return { kind: 'need-bytes' };
        try {
          spectrum = readSpectrumById(bytes, file);
        } catch (e) {
          const message = e instanceof SpectrumReadError ? e.message : `${file}: internal reader error: ${(e as Error)?.message ?? e}`;
          return { kind: 'read-error', message };
        }
        cache.set(key, spectrum);
      }
      const { copy, buffers } = copyForTransfer(spectrum);
      return transfer({ kind: 'spectrum', spectrum: copy }, buffers);
    },
    refitNear(key, zCentre) {
      const spectrum = cache.get(key);
      if (!spectrum) return null;
      const result = refitNear(spectrum, zCentre, { workspace });
      return transfer(result, fitResultBuffers(result));
    },
    nameFeature(key, clickA) {
      const spectrum = cache.get(key);
      if (!spectrum) return null;
      const feature = locateFeature(spectrum, clickA);
      if (!feature) return { feature: null, suggestions: [] };
      return { feature, suggestions: suggestLines(spectrum, feature.centreA, feature.kind) };
    },
    measureLines(key, z, cls) {
      const spectrum = cache.get(key);
      if (!spectrum) return null;
      return measureLines(spectrum, z, cls);
    },
    solutionModel(key, z, family) {
      const spectrum = cache.get(key);
      if (!spectrum) return null;
      const model = solutionModel(spectrum, z, family);
      return transfer(model, [model.buffer as ArrayBuffer]);
    },
    measureQuasar(key, z, draws = 0) {
      const spectrum = cache.get(key);
      if (!spectrum) return null;
      return safeMeasureQuasar(spectrum, z, { draws });
    },
    measureQuasarFile(bytes, file, z) {
      let spectrum: Spectrum;
      try {
        spectrum = readSpectrumById(bytes, file);
      } catch (e) {
        return { error: e instanceof SpectrumReadError ? e.message : `${file}: internal reader error: ${(e as Error)?.message ?? e}` };
      }
      return safeMeasureQuasar(spectrum, z);
    },
    refitMasked(key, rangesA, zCentre) {
      const spectrum = cache.get(key);
      if (!spectrum) return null;
      const masked = maskRanges(spectrum, rangesA);
      const fitted = zCentre === null ? fitSpectrum(masked, { workspace }) : refitNear(masked, zCentre, { workspace });
      const result = fitted.status === 'ok' && fitted.class === 'qso' ? { ...fitted, quasar: safeMeasureQuasar(spectrum, fitted.z) } : fitted;
      return transfer(result, fitResultBuffers(result));
    },
  };
}
