/**
 * What the quasar physics measures on a spectrum at a redshift (no cosmology
 * yet: luminosities and masses follow in quantities.ts). Plain numbers and
 * arrays only, so it crosses the worker boundary and is stored as it is.
 */
import type { BroadLineId, ContinuumRefA } from './regions';
import type { Trough } from './bal';

/** A fitted continuum, enough to redraw it: a (lambda/refA)^alpha + fe T_Fe(lambda), rest lambda, file flux unit. */
export interface ContinuumShape {
  refA: number;
  a: number;
  alpha: number;
  fe: number;
}

export interface ContinuumPoint {
  restA: ContinuumRefA;
  ok: boolean;
  reason?: string;
  /** Observed f_lambda of the power law at (1 + z) restA, file flux unit. */
  flux?: number;
  /** Its 1-sigma error: the larger of the fit's and the resampling draws' (file unit). */
  fluxErr?: number;
}

export interface BroadLineResult {
  id: BroadLineId;
  ok: boolean;
  reason?: string;
  fwhmKms?: number;
  /** The larger of the two errors below, km/s. */
  fwhmErrKms?: number;
  fwhmErrFitKms?: number;
  fwhmErrDrawsKms?: number;
  /** Line dispersion (second moment) of the broad profile, km/s. */
  sigmaKms?: number;
  sigmaErrKms?: number;
  /** Velocity of the broad profile's peak relative to the catalogue wavelength, km/s. */
  peakShiftKms?: number;
  nBroad?: number;
  reducedChi2?: number;
  /** Integrated broad flux over its error. */
  snr?: number;
  /** For drawing: the line model's Gaussians (rest Angstrom, amplitude in file units, km/s) and the continuum under them. */
  gaussians?: { restA: number; amp: number; velKms: number; sigmaKms: number; broad: boolean }[];
  continuum?: ContinuumShape;
  /** Rest range fitted, Angstrom. */
  rangeA?: [number, number];
}

export interface AbsorptionResult {
  ok: boolean;
  reason?: string;
  biKms?: number;
  biErrKms?: number;
  aiKms?: number;
  aiErrKms?: number;
  troughs: Trough[];
  continuum?: ContinuumShape;
}

export interface QuasarMeasurement {
  /** Redshift the measurement was made at. */
  z: number;
  /** Factor from the file's flux unit to erg/s/cm2/A, or why there is none. */
  fluxScale: { ok: true; ergPerSCm2A: number; unit: string } | { ok: false; reason: string };
  continua: ContinuumPoint[];
  lines: BroadLineResult[];
  absorption: AbsorptionResult;
  /** Resampling draws used for the errors. */
  draws: number;
  /** True when the file had no uncertainty and one was estimated from the scatter. */
  noiseEstimated: boolean;
}
