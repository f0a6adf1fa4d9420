/**
 * One simulated spectrum with its truth. The model is the simulator's own
 * (quasar.ts, galaxy.ts, star.ts), deliberately independent of the fitting
 * engine's templates so that evaluating the engine on it is not circular.
 */
import type { Spectrum } from '../types';
import type { Rng } from './prng';
import { DEFAULT_GRID, makeGrid, type GridSpec } from './grid';
import { pixelEdges, addGaussian, observedSigmaA } from './profiles';
import { quasarModel } from './quasar';
import { starFormingModel, passiveModel } from './galaxy';
import { starModel, type StarType } from './star';
import { noiseSigma, telluricTransmission, badColumns } from './noise';
import { SKY_LINES } from './sky';
import type { ClassModel, ModelContext, TruthLine } from './model';

export type SimClass = 'qso' | 'galaxy-sf' | 'galaxy-passive' | 'star';

export interface SimParams {
  class: SimClass;
  /** Redshift; for stars use a small value (|v| < 300 km/s means |z| < 1e-3). */
  z: number;
  /** Median signal-to-noise per pixel at the continuum (1.5 to 50 in the demo and evaluation sets). */
  snr: number;
  /** Observed wavelength grid, or explicit pixel centres (vacuum A). Default DEFAULT_GRID. */
  grid?: GridSpec | Float64Array;
  /** Instrument resolving power lambda / FWHM (default 2000). */
  resolutionR?: number;
  /** Star sub-type (random when omitted). */
  starType?: StarType;
  objectId?: string;
  /** File name stored in the Spectrum (default `${objectId}.sim`). */
  file?: string;
  /** Continuum level (median, in 1e-17 erg/s/cm2/A); random 0.5-50 when omitted. */
  fluxLevel?: number;
  /** Add the Gaussian noise (default true). False leaves the model, with ivar still set. */
  noise?: boolean;
  /** Residual spikes from imperfect sky subtraction, not described by ivar (default true). */
  skyResiduals?: boolean;
  /** Random bad columns, masked with ivar 0 (default true). */
  badColumns?: boolean;
  /** Uncorrected telluric bands (default false). */
  telluric?: boolean;
}

export interface SimTruth {
  objectId: string;
  class: SimClass;
  z: number;
  snr: number;
  resolutionR: number;
  /** Star sub-type ('A', 'G', 'M'); empty for other classes. */
  subtype: string;
  /** Noise-free flux per pixel, flux units (includes forest and telluric absorption). */
  noiseFree: Float64Array;
  /** Line- and absorption-free continuum per pixel, flux units. */
  continuum: Float64Array;
  /** Sky-subtraction residual added per pixel (not part of ivar), flux units. */
  skyResidual: Float64Array;
  /** Ly-alpha forest transmission (quasars only). */
  forest?: Float64Array;
  lines: TruthLine[];
  facts: Record<string, number>;
}

export interface Simulated {
  spectrum: Spectrum;
  truth: SimTruth;
}

export const FLUX_UNIT = '1e-17 erg/s/cm2/A';

export function simulateSpectrum(params: SimParams, rng: Rng): Simulated {
  const wl = params.grid instanceof Float64Array ? Float64Array.from(params.grid) : makeGrid(params.grid ?? DEFAULT_GRID);
  const n = wl.length;
  const edges = pixelEdges(wl);
  const resolutionR = params.resolutionR ?? 2000;
  const ctx: ModelContext = { wl, edges, z: params.z, resolutionR, rng };
  let model: ClassModel;
  switch (params.class) {
    case 'qso':
      model = quasarModel(ctx);
      break;
    case 'galaxy-sf':
      model = starFormingModel(ctx);
      break;
    case 'galaxy-passive':
      model = passiveModel(ctx);
      break;
    case 'star':
      model = starModel(ctx, params.starType ?? rng.pick(['A', 'G', 'M'] as const));
      break;
    default:
      throw new Error(`unknown class ${(params as { class: string }).class}`);
  }

  // Scale to a continuum level in flux units.
  const level = params.fluxLevel ?? rng.logUniform(0.5, 50);
  const contMed = medianPositive(model.continuum);
  const scale = contMed > 0 ? level / contMed : 1;
  const noiseFree = new Float64Array(n);
  const continuum = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    noiseFree[i] = model.flux[i] * scale;
    continuum[i] = model.continuum[i] * scale;
  }
  if (params.telluric) {
    const t = telluricTransmission(wl, rng.uniform(0.5, 1.2));
    for (let i = 0; i < n; i++) noiseFree[i] *= t[i];
  }

  const { sigma, sigmaScale } = noiseSigma(wl, edges, continuum, params.snr, resolutionR);
  const flux = Float64Array.from(noiseFree);
  const ivar = new Float64Array(n);
  for (let i = 0; i < n; i++) ivar[i] = 1 / (sigma[i] * sigma[i]);
  if (params.noise ?? true) for (let i = 0; i < n; i++) flux[i] += sigma[i] * rng.gaussian();

  // Imperfect sky subtraction: each line leaves a residual of random sign,
  // about 5 x strength x the continuum noise at its peak (by eye).
  const skyResidual = new Float64Array(n);
  if (params.skyResiduals ?? true) {
    for (const l of SKY_LINES) {
      if (l.vacA < wl[0] - 20 || l.vacA > wl[n - 1] + 20) continue;
      const sig = observedSigmaA(l.vacA, 10, resolutionR);
      const peak = 5 * l.strength * sigmaScale * rng.gaussian();
      addGaussian(skyResidual, edges, l.vacA, sig, peak * sig * Math.sqrt(2 * Math.PI));
    }
    for (let i = 0; i < n; i++) flux[i] += skyResidual[i];
  }

  const mask = params.badColumns ?? true ? badColumns(n, rng) : new Uint8Array(n);
  for (let i = 0; i < n; i++) {
    if (mask[i]) {
      flux[i] = 0;
      ivar[i] = 0;
    }
  }

  const objectId = params.objectId ?? 'SIM-0000';
  const spectrum: Spectrum = {
    file: params.file ?? `${objectId}.sim`,
    format: 'simulated',
    wavelengthA: wl,
    flux,
    ivar,
    mask,
    meta: { objectId, fluxUnit: FLUX_UNIT, instrument: 'simulated' },
  };
  const truth: SimTruth = {
    objectId,
    class: params.class,
    z: params.z,
    snr: params.snr,
    resolutionR,
    subtype: model.subtype,
    noiseFree,
    continuum,
    skyResidual,
    forest: model.forest,
    lines: model.lines,
    facts: model.facts,
  };
  return { spectrum, truth };
}

function medianPositive(x: Float64Array): number {
  const a = Array.from(x).filter((v) => v > 0 && Number.isFinite(v)).sort((p, q) => p - q);
  if (a.length === 0) return 0;
  return a[a.length >> 1];
}
