/**
 * The three sources the engine is judged on (npm run evaluate, and the
 * confidence calibration): the project's own simulator, simulations from
 * published templates held out of the fit (heldOut.ts), and the real survey
 * spectra in test/data/real-spectra with the surveys' redshifts as truth.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { simulateBatchItem } from '../../src/core/sim';
import { fitSpectrumDetailed, type DetailedFit, type FitOptions } from '../../src/core/engine/fitSpectrum';
import { readSpectrum } from '../../src/core/io';
import type { SpectrumClass } from '../../src/core/types';
import { heldOutCases } from './heldOut';

export type SourceId = 'simulator' | 'held-out' | 'real';

export interface EvalItem {
  source: SourceId;
  name: string;
  trueClass: SpectrumClass;
  trueZ: number;
  /** Median S/N per pixel (the simulation's setting, or the engine's measurement for real spectra). */
  snr: number;
  detail: DetailedFit;
}

const simClass = (c: string): SpectrumClass => (c === 'qso' ? 'qso' : c === 'star' ? 'star' : 'galaxy');

export function simulatorItems(n: number, seed: number, o: FitOptions = {}): EvalItem[] {
  const out: EvalItem[] = [];
  for (let i = 0; i < n; i++) {
    const s = simulateBatchItem(i, seed);
    out.push({ source: 'simulator', name: `sim-${seed}-${i}`, trueClass: simClass(s.truth.class), trueZ: s.truth.z, snr: s.truth.snr, detail: fitSpectrumDetailed(s.spectrum, o) });
  }
  return out;
}

export function heldOutItems(n: number, seed: number, o: FitOptions = {}): EvalItem[] {
  return heldOutCases(n, seed).map((c, i) => ({
    source: 'held-out',
    name: `held-out-${seed}-${i} (${c.source})`,
    trueClass: c.trueClass,
    trueZ: c.z,
    snr: c.snr,
    detail: fitSpectrumDetailed(c.spectrum, { ...o, templateFamilies: c.families }),
  }));
}

export const REAL_DIR = join(import.meta.dirname, '..', '..', 'test', 'data', 'real-spectra');

export function realItems(o: FitOptions = {}): EvalItem[] {
  const manifest = readFileSync(join(REAL_DIR, 'MANIFEST.tsv'), 'utf8').trim().split(/\r?\n/).slice(1).map((l) => l.split('\t'));
  return manifest.map(([name, survey, cls, zTrue]) => {
    const detail = fitSpectrumDetailed(readSpectrum(new Uint8Array(readFileSync(join(REAL_DIR, 'csv', `${name}.csv`))), `${name}.csv`), o);
    return { source: 'real', name: `${name} (${survey})`, trueClass: cls as SpectrumClass, trueZ: Number(zTrue), snr: detail.result.input.medianSnr, detail };
  });
}
