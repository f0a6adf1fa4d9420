/**
 * A deterministic mix of simulated spectra of every class, for the engine's
 * evaluation: object i always comes out the same for a given seed, whatever n is.
 */
import { C_KMS } from '../constants';
import { createRng, mixSeed } from './prng';
import { simulateSpectrum, type SimClass, type SimParams, type Simulated } from './simulateSpectrum';
import type { GridSpec } from './grid';

export interface BatchOptions {
  grid?: GridSpec;
  resolutionR?: number;
  /** S/N range per pixel, log-uniform (default 1.5-30). */
  snrRange?: [number, number];
  /** Object-id prefix (default 'SIM'). */
  idPrefix?: string;
  skyResiduals?: boolean;
  badColumns?: boolean;
  telluric?: boolean;
}

/**
 * The class of object i: a fixed repeating pattern of 20 (8 quasars, 5
 * star-forming galaxies, 3 passive galaxies, 4 stars), roughly what a
 * UV-excess quasar-candidate run returns (proportions invented).
 */
const PATTERN: readonly SimClass[] = [
  'qso', 'galaxy-sf', 'qso', 'star', 'galaxy-passive', 'qso', 'galaxy-sf', 'qso', 'star', 'qso',
  'galaxy-sf', 'galaxy-passive', 'qso', 'star', 'galaxy-sf', 'qso', 'galaxy-passive', 'qso', 'star', 'galaxy-sf',
];

/** Redshift ranges: quasars 0.05-5.5, star-forming 0-1.2, passive 0.02-0.9; stars |v| < 300 km/s. */
export function drawRedshift(cls: SimClass, u: number): number {
  switch (cls) {
    case 'qso':
      return 0.05 + 5.45 * u;
    case 'galaxy-sf':
      return 0.005 + 1.195 * u;
    case 'galaxy-passive':
      return 0.02 + 0.88 * u;
    case 'star': {
      // Relativistic Doppler, 1 + z = sqrt((1 + b) / (1 - b)) (docs/reference.md sec. 3); v uniform in +-300 km/s.
      const b = ((2 * u - 1) * 300) / C_KMS;
      return Math.sqrt((1 + b) / (1 - b)) - 1;
    }
  }
}

export function batchParams(i: number, seed: number, options: BatchOptions = {}): SimParams {
  const r = createRng(mixSeed(seed, 0x9e37 + i));
  const cls = PATTERN[i % PATTERN.length];
  const z = drawRedshift(cls, r.next());
  const [lo, hi] = options.snrRange ?? [1.5, 30];
  const snr = r.logUniform(lo, hi);
  const id = `${options.idPrefix ?? 'SIM'}-${String(i + 1).padStart(5, '0')}`;
  return {
    class: cls,
    z,
    snr,
    grid: options.grid,
    resolutionR: options.resolutionR,
    objectId: id,
    file: `${id}.sim`,
    skyResiduals: options.skyResiduals,
    badColumns: options.badColumns,
    telluric: options.telluric,
  };
}

/** Object i of the batch on its own (the same as simulateBatch(n, seed)[i] for any n > i). */
export function simulateBatchItem(i: number, seed: number, options: BatchOptions = {}): Simulated {
  return simulateSpectrum(batchParams(i, seed, options), createRng(mixSeed(seed, 0x51d + i)));
}

export function simulateBatch(n: number, seed: number, options: BatchOptions = {}): Simulated[] {
  const out: Simulated[] = [];
  for (let i = 0; i < n; i++) out.push(simulateBatchItem(i, seed, options));
  return out;
}
