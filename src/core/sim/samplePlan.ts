/**
 * The demo set's invented scenario: the "Marrow Reach" field (code MRX), a
 * made-up pilot run of a multi-object spectrograph on UV-excess quasar
 * candidates. Names, ids, positions and dates are invented; no real survey,
 * object or observatory is meant.
 */
import type { SimClass } from './simulateSpectrum';
import type { StarType } from './star';
import type { FitsLayout } from './sampleFits';

export const FIELD_NAME = 'Marrow Reach';
export const FIELD_CODE = 'MRX';
/** Invented field centre, degrees. */
export const FIELD_RA_DEG = 187.35;
export const FIELD_DEC_DEG = 8.62;

/** File layouts of the demo set; every layout the readers support appears at least twice. */
export type SampleLayout = 'csv-ivar' | 'csv-error' | 'tsv' | 'text-bare' | 'text-nm-air' | 'csv-mask' | 'csv-gz' | FitsLayout;

export interface PlannedObject {
  cls: SimClass;
  z: number;
  snr: number;
  layout: SampleLayout;
  starType?: StarType;
  /** Uncorrected telluric bands in this spectrum. */
  telluric?: boolean;
}

/**
 * 44 objects: 18 quasars (z 0.21 to 5.3), 10 star-forming galaxies, 8 passive
 * galaxies, 8 stars; S/N from 1.8 (poor) to 45 (excellent). Star redshifts are
 * drawn from the seed (|v| < 300 km/s), so they are 0 here.
 */
export const PLAN: readonly PlannedObject[] = [
  { cls: 'qso', z: 0.21, snr: 22, layout: 'csv-ivar' },
  { cls: 'qso', z: 0.48, snr: 9, layout: 'fits-wave-linear' },
  { cls: 'qso', z: 0.75, snr: 4.5, layout: 'fits-table-loglam' },
  { cls: 'qso', z: 0.98, snr: 30, layout: 'text-nm-air' },
  { cls: 'qso', z: 1.25, snr: 12, layout: 'fits-wave-log' },
  { cls: 'qso', z: 1.52, snr: 2.2, layout: 'csv-error' },
  { cls: 'qso', z: 1.8, snr: 16, layout: 'fits-dcflag-log10' },
  { cls: 'qso', z: 2.05, snr: 6, layout: 'tsv' },
  { cls: 'qso', z: 2.3, snr: 40, layout: 'fits-table-arrays' },
  { cls: 'qso', z: 2.62, snr: 3.2, layout: 'fits-bitpix-16' },
  { cls: 'qso', z: 2.95, snr: 14, layout: 'csv-mask' },
  { cls: 'qso', z: 3.25, snr: 8, layout: 'fits-gz' },
  { cls: 'qso', z: 3.6, snr: 25, layout: 'fits-awav', telluric: true },
  { cls: 'qso', z: 3.95, snr: 5, layout: 'text-bare' },
  { cls: 'qso', z: 4.3, snr: 11, layout: 'fits-table-wave' },
  { cls: 'qso', z: 4.65, snr: 3.8, layout: 'csv-gz' },
  { cls: 'qso', z: 4.98, snr: 18, layout: 'fits-bitpix-64' },
  { cls: 'qso', z: 5.3, snr: 7, layout: 'fits-wave-cd' },
  { cls: 'galaxy-sf', z: 0.03, snr: 35, layout: 'fits-wave-cd' },
  { cls: 'galaxy-sf', z: 0.11, snr: 6.5, layout: 'csv-ivar' },
  { cls: 'galaxy-sf', z: 0.19, snr: 2.5, layout: 'fits-table-loglam' },
  { cls: 'galaxy-sf', z: 0.28, snr: 12, layout: 'tsv', telluric: true },
  { cls: 'galaxy-sf', z: 0.37, snr: 4, layout: 'fits-wave-linear' },
  { cls: 'galaxy-sf', z: 0.52, snr: 9.5, layout: 'text-nm-air' },
  { cls: 'galaxy-sf', z: 0.68, snr: 1.8, layout: 'fits-awav' },
  { cls: 'galaxy-sf', z: 0.85, snr: 15, layout: 'csv-mask' },
  { cls: 'galaxy-sf', z: 1.02, snr: 5.5, layout: 'fits-table-arrays' },
  { cls: 'galaxy-sf', z: 1.18, snr: 8.5, layout: 'csv-gz' },
  { cls: 'galaxy-passive', z: 0.05, snr: 45, layout: 'fits-bitpix-16' },
  { cls: 'galaxy-passive', z: 0.14, snr: 10, layout: 'text-bare' },
  { cls: 'galaxy-passive', z: 0.26, snr: 20, layout: 'fits-wave-log' },
  { cls: 'galaxy-passive', z: 0.39, snr: 3, layout: 'csv-error' },
  { cls: 'galaxy-passive', z: 0.51, snr: 13, layout: 'fits-dcflag-log10' },
  { cls: 'galaxy-passive', z: 0.66, snr: 6, layout: 'fits-table-wave' },
  { cls: 'galaxy-passive', z: 0.74, snr: 4.2, layout: 'fits-gz' },
  { cls: 'galaxy-passive', z: 0.82, snr: 28, layout: 'fits-bitpix-64' },
  { cls: 'star', z: 0, snr: 30, layout: 'fits-table-arrays', starType: 'A' },
  { cls: 'star', z: 0, snr: 12, layout: 'csv-ivar', starType: 'G' },
  { cls: 'star', z: 0, snr: 20, layout: 'fits-wave-linear', starType: 'M' },
  { cls: 'star', z: 0, snr: 4, layout: 'tsv', starType: 'A' },
  { cls: 'star', z: 0, snr: 8, layout: 'fits-table-loglam', starType: 'G', telluric: true },
  { cls: 'star', z: 0, snr: 2.8, layout: 'csv-mask', starType: 'M' },
  { cls: 'star', z: 0, snr: 16, layout: 'fits-wave-cd', starType: 'G' },
  { cls: 'star', z: 0, snr: 6, layout: 'text-bare', starType: 'M' },
];
